import useSWR from 'swr';
import type { Plan } from '@/components/plans/plan-types';
import type { ApiError } from '@/lib/client/fetch-json';

/** SWR key of one plan; saving, transitions and finished predictions revalidate it by this key. */
export const planKey = (studyId: number, planId: number) => `/api/studies/${studyId}/plans/${planId}`;

/** One plan with its state and prediction status. `initial` is what a server page already read, if any. */
export function usePlan(studyId: number, planId: number, initial?: Plan) {
  const { data, error, isLoading, mutate } = useSWR<{ plan: Plan }, ApiError>(planKey(studyId, planId), {
    fallbackData: initial && { plan: initial },
  });
  return { plan: data?.plan, error, isLoading: isLoading && !data, mutate };
}
