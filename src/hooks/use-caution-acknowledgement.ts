import useSWR from 'swr';
import type { CautionAcknowledgement } from '@/components/readings/reading-types';
import type { ApiError } from '@/lib/client/fetch-json';

export const cautionAcknowledgementKey = (studyId: number, planId: number) => `/api/studies/${studyId}/plans/${planId}/cautions`;

/** Whether the signed-in person has acknowledged the current bench cautions on this plan. */
export function useCautionAcknowledgement(studyId: number, planId: number) {
  const { data, error, mutate } = useSWR<{ acknowledgement: CautionAcknowledgement }, ApiError>(cautionAcknowledgementKey(studyId, planId));
  return { acknowledgement: data?.acknowledgement, error, mutate };
}
