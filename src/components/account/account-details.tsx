import type { SessionUser } from '@/lib/auth/session-user';
import type { SiteRole } from '@/lib/auth/permissions';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { Panel } from '@/components/ui/panel';

const ROLE_TONE: Record<SiteRole, BadgeTone> = { admin: 'dark', researcher: 'flux', member: 'neutral' };

/** What each site role allows, from src/lib/auth/permissions.ts (canManageAccounts, canCreateStudy). */
const ROLE_MEANING: Record<SiteRole, string> = {
  admin: 'Manages accounts and can open every study.',
  researcher: 'Can start studies and invite others to them.',
  member: 'Joins studies by invitation.',
};

/** The signed-in person's name, address and site role, as the session sees them. */
export function AccountDetails({ user }: { user: SessionUser }) {
  const rows = [
    { term: 'Name', value: user.name },
    { term: 'E-mail', value: user.email },
    { term: 'Site role', value: <Badge tone={ROLE_TONE[user.siteRole]}>{user.siteRole}</Badge> },
  ];
  return (
    <Panel title="Profile" description="A site admin changes names and site roles.">
      <dl className="divide-y divide-ink-100 rounded-md border border-ink-200 text-sm">
        {rows.map((row) => (
          <div key={row.term} className="flex items-center justify-between gap-4 px-4 py-2.5">
            <dt className="text-ink-500">{row.term}</dt>
            <dd className="min-w-0 break-words text-right font-medium text-ink-900">{row.value}</dd>
          </div>
        ))}
      </dl>
      <p className="mt-3 text-xs text-ink-500">{ROLE_MEANING[user.siteRole]}</p>
    </Panel>
  );
}
