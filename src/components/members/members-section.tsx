import type { PendingInvitation } from '@/lib/data/invitations';
import type { StudyMember } from '@/lib/data/members';
import { InviteForm } from './invite-form';
import { MembersTable } from './members-table';
import { PendingInvitations } from './pending-invitations';

interface MembersSectionProps {
  studyId: number;
  viewerId: number;
  canManage: boolean;
  /** Read on the server with the page, so the tables render without a loading flash. */
  members: StudyMember[];
  invitations: PendingInvitation[] | null;
}

/**
 * People on a study. Everyone on it sees the member list; the invite form, role selects and pending
 * invitations appear only for roles with 'members.manage' (the server checks again on every call).
 */
export function MembersSection({ studyId, viewerId, canManage, members, invitations }: MembersSectionProps) {
  return (
    <div className="space-y-6">
      <MembersTable studyId={studyId} viewerId={viewerId} canManage={canManage} initialMembers={members} />
      {canManage && (
        <div className="grid items-start gap-6 lg:grid-cols-5">
          <div className="lg:col-span-2">
            <InviteForm studyId={studyId} />
          </div>
          <div className="lg:col-span-3">
            <PendingInvitations studyId={studyId} initial={invitations ?? undefined} />
          </div>
        </div>
      )}
    </div>
  );
}
