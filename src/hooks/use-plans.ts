import useSWR from 'swr';
import type { Plan } from '@/components/plans/plan-types';
import type { ApiError } from '@/lib/client/fetch-json';

/** SWR key of a study's plans; creating, changing or deleting a plan revalidates it by this key. */
export const plansKey = (studyId: number) => `/api/studies/${studyId}/plans`;

/** The study's sweep plans, newest state from the API. */
export function usePlans(studyId: number) {
  const { data, error, isLoading, mutate } = useSWR<{ plans: Plan[] }, ApiError>(plansKey(studyId));
  return { plans: data?.plans, error, isLoading: isLoading && !data, mutate };
}
