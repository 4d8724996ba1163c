import type { InvitationView } from '@/lib/data/invitations';
import { RoleBadge } from '@/components/studies/role-badge';
import { formatDateTime } from '@/components/ui/format-date';

/** What the invitation is for, so the invitee can tell it is expected before doing anything. */
export function InvitationDetails({ invitation }: { invitation: InvitationView }) {
  const rows = [
    { term: 'Study', value: invitation.studyName },
    { term: 'Role', value: <RoleBadge role={invitation.role} /> },
    { term: 'Invited by', value: invitation.inviterName },
    { term: 'Sent to', value: invitation.email },
    { term: 'Link expires', value: formatDateTime(invitation.expiresAt) },
  ];
  return (
    <dl className="divide-y divide-ink-100 rounded-md border border-ink-200 text-sm">
      {rows.map((row) => (
        <div key={row.term} className="flex items-center justify-between gap-4 px-4 py-2.5">
          <dt className="text-ink-500">{row.term}</dt>
          <dd className="text-right font-medium text-ink-900">{row.value}</dd>
        </div>
      ))}
    </dl>
  );
}
