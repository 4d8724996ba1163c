'use client';

import { useState } from 'react';
import { RoleBadge } from '@/components/studies/role-badge';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { Table, Td, Th } from '@/components/ui/table';
import { useStudyInvitations } from '@/hooks/use-study-invitations';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { PendingInvitation } from '@/lib/data/invitations';
import { formatDateTime } from '@/components/ui/format-date';

/** Invitations not yet used, withdrawn or expired, each with a way to withdraw it. */
export function PendingInvitations({ studyId, initial }: { studyId: number; initial?: PendingInvitation[] }) {
  const { invitations, error, isLoading, mutate } = useStudyInvitations(studyId, initial);
  const [withdrawingId, setWithdrawingId] = useState<number | null>(null);
  const [withdrawError, setWithdrawError] = useState<string | null>(null);

  async function withdraw(invitation: PendingInvitation) {
    setWithdrawingId(invitation.id);
    setWithdrawError(null);
    try {
      await fetchJson(`/api/studies/${studyId}/invitations/${invitation.id}`, { method: 'DELETE' });
      await mutate();
    } catch (failure) {
      const message = failure instanceof ApiError ? failure.message : 'Couplet could not be reached. Try again.';
      setWithdrawError(`The invitation for ${invitation.email} was not withdrawn. ${message}`);
    } finally {
      setWithdrawingId(null);
    }
  }

  return (
    <Panel title="Pending invitations" flush>
      {withdrawError && (
        <div className="px-5 py-4">
          <Alert tone="error">{withdrawError}</Alert>
        </div>
      )}
      {isLoading && <Skeleton label="Loading invitations…" rows={2} className="px-5 py-5" />}
      {error && (
        <div className="px-5 py-4">
          <Alert tone="error">The invitations could not be loaded. {error.message}</Alert>
        </div>
      )}
      {invitations && invitations.length === 0 && <p className="px-5 py-6 text-sm text-ink-500">No invitations are waiting.</p>}
      {invitations && invitations.length > 0 && (
        <Table caption="Pending invitations">
          <thead>
            <tr>
              <Th>E-mail</Th>
              <Th>Role</Th>
              <Th>Expires</Th>
              <Th>
                <span className="sr-only">Actions</span>
              </Th>
            </tr>
          </thead>
          <tbody>
            {invitations.map((invitation) => (
              <tr key={invitation.id}>
                <Td>
                  <span className="text-ink-900">{invitation.email}</span>
                  <span className="block text-xs text-ink-500">from {invitation.invitedBy}</span>
                </Td>
                <Td>
                  <RoleBadge role={invitation.role} />
                </Td>
                <Td className="whitespace-nowrap text-ink-600">{formatDateTime(invitation.expiresAt)}</Td>
                <Td className="text-right">
                  <Button size="sm" variant="danger" disabled={withdrawingId !== null} onClick={() => void withdraw(invitation)}>
                    Withdraw<span className="sr-only"> the invitation for {invitation.email}</span>
                  </Button>
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
    </Panel>
  );
}
