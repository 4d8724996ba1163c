import useSWR from 'swr';
import { ApiError } from '@/lib/client/fetch-json';
import type { Attachment } from '@/lib/data/attachments';

export type { Attachment };

/** SWR key of a plan's photos and instrument files; an upload revalidates it by this key. */
export const planAttachmentsKey = (studyId: number, planId: number) => `/api/studies/${studyId}/plans/${planId}/attachments`;

/** The file's address in Couplet: it redirects members to a short-lived signed link (img src, href). */
export const attachmentUrl = (studyId: number, attachmentId: number) => `/api/studies/${studyId}/attachments/${attachmentId}`;

/** The plan's attachments, newest first. */
export function usePlanAttachments(studyId: number, planId: number) {
  const { data, error, isLoading, mutate } = useSWR<{ attachments: Attachment[] }, ApiError>(planAttachmentsKey(studyId, planId));
  return { attachments: data?.attachments, error, isLoading: isLoading && !data, mutate };
}

/**
 * Uploads one file as multipart/form-data (file, kind, pointId, caption); throws ApiError with the
 * server's message and field issues, like fetchJson, which sends JSON only.
 */
export async function uploadAttachment(studyId: number, planId: number, form: FormData): Promise<Attachment> {
  const response = await fetch(planAttachmentsKey(studyId, planId), { method: 'POST', headers: { Accept: 'application/json' }, body: form });
  const payload = await response.json().catch(() => null);
  if (!response.ok) {
    throw new ApiError(response.status, payload?.error ?? `Upload failed (${response.status}).`, payload?.issues ?? []);
  }
  return (payload as { attachment: Attachment }).attachment;
}
