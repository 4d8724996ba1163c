import useSWR from 'swr';
import type { ApiError } from '@/lib/client/fetch-json';
import type { Setup } from '@/lib/data/setups';

/** SWR key of a study's saved setups; saving or deleting a setup revalidates it by this key. */
export const studySetupsKey = (studyId: number) => `/api/studies/${studyId}/setups`;

/** The study's saved setups by name. `initial` is what a server page already read, if any. */
export function useStudySetups(studyId: number, initial?: Setup[]) {
  const { data, error, isLoading, mutate } = useSWR<{ setups: Setup[] }, ApiError>(studySetupsKey(studyId), {
    fallbackData: initial && { setups: initial },
  });
  return { setups: data?.setups, error, isLoading: isLoading && !data, mutate };
}
