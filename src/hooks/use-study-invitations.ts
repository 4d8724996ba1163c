import useSWR from 'swr';
import type { ApiError } from '@/lib/client/fetch-json';
import type { PendingInvitation } from '@/lib/data/invitations';

export const studyInvitationsKey = (studyId: number) => `/api/studies/${studyId}/invitations`;

/**
 * Pending invitations of a study; only members who may manage members can read them, so only their
 * components call this. `initial` is what the server page already read.
 */
export function useStudyInvitations(studyId: number, initial?: PendingInvitation[]) {
  const { data, error, isLoading, mutate } = useSWR<{ invitations: PendingInvitation[] }, ApiError>(studyInvitationsKey(studyId), {
    fallbackData: initial && { invitations: initial },
  });
  // With server-read fallback data there is something to show even while the first request runs.
  return { invitations: data?.invitations, error, isLoading: isLoading && !data, mutate };
}
