import useSWR from 'swr';
import type { ApiError } from '@/lib/client/fetch-json';
import type { StudyMember } from '@/lib/data/members';

export const studyMembersKey = (studyId: number) => `/api/studies/${studyId}/members`;

/**
 * The members of one study with their roles, researchers first. `initial` is what the server page
 * already read, so the table shows at once; SWR then keeps it current.
 */
export function useStudyMembers(studyId: number, initial?: StudyMember[]) {
  const { data, error, isLoading, mutate } = useSWR<{ members: StudyMember[] }, ApiError>(studyMembersKey(studyId), {
    fallbackData: initial && { members: initial },
  });
  // With server-read fallback data there is something to show even while the first request runs.
  return { members: data?.members, error, isLoading: isLoading && !data, mutate };
}
