import useSWR from 'swr';
import type { ApiError } from '@/lib/client/fetch-json';
import type { Coil } from '@/lib/data/coils';

/** SWR key of a study's coil library; mutations revalidate it by this key. */
export const studyCoilsKey = (studyId: number) => `/api/studies/${studyId}/coils`;

/**
 * The study's coils with their predicted values at the study frequency. `initial` is what the server
 * page already read, so the table shows at once.
 */
export function useStudyCoils(studyId: number, initial?: Coil[]) {
  const { data, error, isLoading, mutate } = useSWR<{ coils: Coil[] }, ApiError>(studyCoilsKey(studyId), {
    fallbackData: initial && { coils: initial },
  });
  // With server-read fallback data there is something to show even while the first request runs.
  return { coils: data?.coils, error, isLoading: isLoading && !data, mutate };
}
