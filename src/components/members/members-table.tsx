'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { RoleBadge } from '@/components/studies/role-badge';
import { Alert } from '@/components/ui/alert';
import { Panel } from '@/components/ui/panel';
import { optionsFrom, Select } from '@/components/ui/select';
import { Skeleton } from '@/components/ui/skeleton';
import { Table, Td, Th } from '@/components/ui/table';
import { useStudyMembers } from '@/hooks/use-study-members';
import { STUDY_ROLES, type StudyRole } from '@/lib/auth/permissions';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { StudyMember } from '@/lib/data/members';

const ROLE_OPTIONS = optionsFrom(STUDY_ROLES);

type Notice = { tone: 'error' | 'success'; text: string };

/** Members with their roles; managers change a role straight from the table. */
interface MembersTableProps {
  studyId: number;
  viewerId: number;
  canManage: boolean;
  initialMembers?: StudyMember[];
}

export function MembersTable({ studyId, viewerId, canManage, initialMembers }: MembersTableProps) {
  const router = useRouter();
  const { members, error, isLoading, mutate } = useStudyMembers(studyId, initialMembers);
  const [savingId, setSavingId] = useState<number | null>(null);
  const [notice, setNotice] = useState<Notice | null>(null);

  async function changeRole(member: StudyMember, role: StudyRole) {
    setSavingId(member.userId);
    setNotice(null);
    try {
      const result = await fetchJson<{ members: StudyMember[] }>(`/api/studies/${studyId}/members/${member.userId}`, {
        method: 'PATCH',
        body: { role },
      });
      await mutate(result, { revalidate: false });
      setNotice({ tone: 'success', text: `${member.name} is now ${role}.` });
      // A change to one's own role changes what this page may show: let the server decide again.
      if (member.userId === viewerId) router.refresh();
    } catch (failure) {
      const message = failure instanceof ApiError ? failure.message : 'Couplet could not be reached. Try again.';
      setNotice({ tone: 'error', text: `${member.name}'s role was not changed. ${message}` });
    } finally {
      setSavingId(null);
    }
  }

  return (
    <Panel title="Members" description="Everyone on this study and their role." flush>
      {notice && (
        <div className="px-5 py-4">
          <Alert tone={notice.tone}>{notice.text}</Alert>
        </div>
      )}
      {isLoading && <Skeleton label="Loading members…" className="px-5 py-5" />}
      {error && (
        <div className="px-5 py-4">
          <Alert tone="error">The members could not be loaded. {error.message}</Alert>
        </div>
      )}
      {members && (
        <Table caption="Members of this study">
          <thead>
            <tr>
              <Th>Name</Th>
              <Th>E-mail</Th>
              <Th className="w-48">Role</Th>
            </tr>
          </thead>
          <tbody>
            {members.map((member) => (
              <tr key={member.userId}>
                <Td className="font-medium text-ink-900">
                  {member.name}
                  {member.userId === viewerId && <span className="ml-2 text-xs font-normal text-ink-500">(you)</span>}
                </Td>
                <Td className="text-ink-600">{member.email}</Td>
                <Td>
                  {canManage ? (
                    <Select
                      aria-label={`Role of ${member.name}`}
                      options={ROLE_OPTIONS}
                      value={member.role}
                      disabled={savingId !== null}
                      onChange={(event) => void changeRole(member, event.target.value as StudyRole)}
                    />
                  ) : (
                    <RoleBadge role={member.role} />
                  )}
                </Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
    </Panel>
  );
}
