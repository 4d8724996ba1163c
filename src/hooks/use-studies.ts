import useSWR from 'swr';
import type { ApiError } from '@/lib/client/fetch-json';
import type { StudySummary } from '@/lib/data/studies';

/** SWR key of the signed-in user's studies; mutations elsewhere revalidate it by this key. */
export const STUDIES_KEY = '/api/studies';

/** The studies the signed-in user is on, with their role on each (all studies for an admin). */
export function useStudies() {
  const { data, error, isLoading, mutate } = useSWR<{ studies: StudySummary[] }, ApiError>(STUDIES_KEY);
  return { studies: data?.studies, error, isLoading, mutate };
}
