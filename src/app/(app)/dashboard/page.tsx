import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { StudiesHeader } from '@/components/studies/studies-header';
import { StudyList } from '@/components/studies/study-list';
import { canCreateStudy } from '@/lib/auth/permissions';
import { getSessionUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'My studies' };

/** The signed-in user's studies. The list itself loads in the browser (GET /api/studies). */
export default async function DashboardPage() {
  const user = await getSessionUser();
  if (!user) redirect('/signin');
  const canCreate = canCreateStudy(user.siteRole);

  return (
    <div className="space-y-6">
      <StudiesHeader canCreate={canCreate} />
      <StudyList canCreate={canCreate} />
    </div>
  );
}
