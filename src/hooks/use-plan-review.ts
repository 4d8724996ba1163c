import { useCallback } from 'react';
import useSWR, { useSWRConfig } from 'swr';
import type { ApiError } from '@/lib/client/fetch-json';
import type { PlanReview, ReviewQuantity } from '@/lib/review/types';

/** Where a plan's review and its writes (tolerance, marks, fits) live. */
export const planReviewBase = (studyId: number, planId: number) => `/api/studies/${studyId}/plans/${planId}/review`;

/** SWR key of a plan's review of one quantity. */
export const planReviewKey = (studyId: number, planId: number, quantity: ReviewQuantity) => `${planReviewBase(studyId, planId)}?quantity=${quantity}`;

/** Predicted against measured for one quantity: poses, readings, summary, marks, latest fit, decisions. */
export function usePlanReview(studyId: number, planId: number, quantity: ReviewQuantity) {
  const { data, error, isLoading, mutate } = useSWR<PlanReview, ApiError>(planReviewKey(studyId, planId, quantity));
  return { review: data, error, isLoading: isLoading && !data, mutate };
}

/**
 * Revalidates the review of every quantity: a mark, the tolerance or a decision changes all of them,
 * not only the one on screen.
 */
export function useRefreshPlanReview(studyId: number, planId: number) {
  const { mutate } = useSWRConfig();
  return useCallback(() => {
    const prefix = `${planReviewBase(studyId, planId)}?`;
    return mutate((key) => typeof key === 'string' && key.startsWith(prefix));
  }, [mutate, studyId, planId]);
}
