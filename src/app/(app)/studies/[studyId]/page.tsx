import type { Metadata } from 'next';
import { MembersSection } from '@/components/members/members-section';
import { RoleBadge } from '@/components/studies/role-badge';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { PageHeader } from '@/components/ui/page-header';
import { loadStudyPage as loadStudy } from '@/lib/auth/study-page';
import { listPendingInvitations } from '@/lib/data/invitations';
import { listMembers } from '@/lib/data/members';
import { formatFrequency } from '@/lib/units/format';

type Params = Promise<{ studyId: string }>;

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
    <StudyPageFrame
      study={study}
      header={
        <>
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
        </>
      }
    >
      <MembersSection studyId={study.id} viewerId={user.id} canManage={canManage} members={members} invitations={invitations} />
    </StudyPageFrame>
  );
}
