import useSWR from 'swr';
import type { PlanPoint } from '@/components/plans/plan-types';
import type { ApiError } from '@/lib/client/fetch-json';

/** SWR key of a plan's points in measurement order. */
export const planPointsKey = (studyId: number, planId: number) => `/api/studies/${studyId}/plans/${planId}/points`;

/** A plan's points with planned poses and predicted values (null until predicted). */
export function usePlanPoints(studyId: number, planId: number) {
  const { data, error, isLoading, mutate } = useSWR<{ points: PlanPoint[] }, ApiError>(planPointsKey(studyId, planId));
  return { points: data?.points, error, isLoading: isLoading && !data, mutate };
}
