import type { StudyRole } from '@/lib/auth/permissions';
import { Badge, type BadgeTone } from '@/components/ui/badge';

const TONE: Record<StudyRole | 'admin', BadgeTone> = {
  researcher: 'flux',
  supervisor: 'copper',
  student: 'neutral',
  admin: 'dark',
};

/** A role on a study. `null` is a site admin looking at a study they are not a member of. */
export function RoleBadge({ role }: { role: StudyRole | null }) {
  const name = role ?? 'admin';
  return <Badge tone={TONE[name]}>{name}</Badge>;
}
