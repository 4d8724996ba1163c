import useSWR from 'swr';
import type { ApiError } from '@/lib/client/fetch-json';
import type { PlanComment } from '@/lib/review/types';

/** SWR key of the comments on a plan and its points. */
export const planCommentsKey = (studyId: number, planId: number) => `/api/studies/${studyId}/plans/${planId}/comments`;

/** The comments on a plan and its points, oldest first. */
export function usePlanComments(studyId: number, planId: number) {
  const { data, error, isLoading, mutate } = useSWR<PlanComment[], ApiError>(planCommentsKey(studyId, planId));
  return { comments: data, error, isLoading: isLoading && !data, mutate };
}
