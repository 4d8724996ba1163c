import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound, redirect } from 'next/navigation';
import { cache } from 'react';
import { MembersSection } from '@/components/members/members-section';
import { formatFrequency } from '@/components/studies/format-frequency';
import { RoleBadge } from '@/components/studies/role-badge';
import { PageHeader } from '@/components/ui/page-header';
import { getSessionUser } from '@/lib/auth/session';
import type { SessionUser } from '@/lib/auth/session-user';
import { listPendingInvitations } from '@/lib/data/invitations';
import { listMembers } from '@/lib/data/members';
import { getStudy, type StudyDetail } from '@/lib/data/studies';
import { HttpError } from '@/lib/http/errors';

type Params = Promise<{ studyId: string }>;

/**
 * One study for the signed-in viewer, or notFound() when it does not exist or they are not on it
 * (the same answer, so a study's existence is not disclosed). Cached so metadata and page share one query.
 */
const loadStudy = cache(async (rawId: string): Promise<{ study: StudyDetail; user: SessionUser }> => {
  const user = await getSessionUser();
  if (!user) redirect('/signin');
  if (!/^[1-9][0-9]{0,9}$/.test(rawId)) notFound();
  let study: StudyDetail;
  try {
    study = await getStudy(user, Number(rawId));
  } catch (error) {
    if (error instanceof HttpError && error.status === 404) notFound();
    throw error;
  }
  return { study, user };
});

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudy((await params).studyId);
  return { title: study.name };
}

export default async function StudyPage({ params }: { params: Params }) {
  const { study, user } = await loadStudy((await params).studyId);
  const canManage = study.allowedActions.includes('members.manage');
  const [members, invitations] = await Promise.all([
    listMembers(user, study.id),
    canManage ? listPendingInvitations(user, study.id) : null,
  ]);

  return (
    <div className="space-y-8">
      <div className="space-y-3">
        <nav aria-label="Breadcrumb" className="text-sm text-ink-500">
          <Link href="/dashboard" className="hover:text-ink-800 hover:underline">
            Studies
          </Link>
          <span aria-hidden="true"> / </span>
          <span className="text-ink-700">{study.name}</span>
        </nav>
        <PageHeader title={study.name} description={study.summary || undefined} />
        <dl className="flex flex-wrap gap-x-8 gap-y-2 text-sm">
          <div className="flex items-center gap-2">
            <dt className="text-ink-500">Operating frequency</dt>
            <dd className="font-medium tabular-nums text-ink-900">{study.frequencyHz === null ? 'not set' : formatFrequency(study.frequencyHz)}</dd>
          </div>
          <div className="flex items-center gap-2">
            <dt className="text-ink-500">Started by</dt>
            <dd className="font-medium text-ink-900">{study.createdBy.name}</dd>
          </div>
        </dl>
        <p className="flex items-center gap-2 text-sm text-ink-700">
          Your role: <RoleBadge role={study.myRole} />
        </p>
      </div>
      <MembersSection studyId={study.id} viewerId={user.id} canManage={canManage} members={members} invitations={invitations} />
    </div>
  );
}
