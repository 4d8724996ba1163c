import useSWR from 'swr';
import type { PlanProgress } from '@/components/plans/plan-types';
import type { ApiError } from '@/lib/client/fetch-json';

/** How often the page asks how far the predictions are while they run [ms]. */
export const PROGRESS_POLL_MS = 1000;

export const planProgressKey = (studyId: number, planId: number) => `/api/studies/${studyId}/plans/${planId}/progress`;

/**
 * The plan's prediction progress, polled every second while `running` is true (the plan says so);
 * not fetched at all otherwise.
 */
export function usePlanProgress(studyId: number, planId: number, running: boolean) {
  const { data, error, mutate } = useSWR<PlanProgress, ApiError>(running ? planProgressKey(studyId, planId) : null, {
    refreshInterval: (latest) => (latest && latest.status !== 'running' ? 0 : PROGRESS_POLL_MS),
  });
  return { progress: data, error, mutate };
}
