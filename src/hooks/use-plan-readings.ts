import useSWR from 'swr';
import type { Reading } from '@/components/readings/reading-types';
import type { ApiError } from '@/lib/client/fetch-json';

/** SWR key of every version of every reading on a plan. */
export const planReadingsKey = (studyId: number, planId: number) => `/api/studies/${studyId}/plans/${planId}/readings`;

/** The plan's readings, all versions, in measurement order. */
export function usePlanReadings(studyId: number, planId: number) {
  const { data, error, isLoading, mutate } = useSWR<{ readings: Reading[] }, ApiError>(planReadingsKey(studyId, planId));
  return { readings: data?.readings, error, isLoading: isLoading && !data, mutate };
}
