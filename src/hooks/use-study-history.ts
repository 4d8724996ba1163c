import useSWRInfinite from 'swr/infinite';
import type { HistoryCategory } from '@/lib/audit/describe-event';
import type { HistoryPage } from '@/lib/data/audit-trail';
import type { ApiError } from '@/lib/client/fetch-json';

export interface HistoryFilters {
  actorId?: number;
  planId?: number;
  category?: HistoryCategory;
}

/** SWR key of one page of a study's history: the filters, and the id the page starts below. */
export function studyHistoryKey(studyId: number, filters: HistoryFilters, before?: number): string {
  const params = new URLSearchParams();
  if (filters.actorId !== undefined) params.set('actorId', String(filters.actorId));
  if (filters.planId !== undefined) params.set('planId', String(filters.planId));
  if (filters.category !== undefined) params.set('category', filters.category);
  if (before !== undefined) params.set('before', String(before));
  const search = params.toString();
  return `/api/studies/${studyId}/history${search ? `?${search}` : ''}`;
}

/**
 * The study's history, newest first, one page after another: `showOlder` fetches the next page below
 * the last event shown. Changing the filters starts again from the newest page.
 */
export function useStudyHistory(studyId: number, filters: HistoryFilters) {
  const { data, error, size, setSize, isLoading, mutate } = useSWRInfinite<HistoryPage, ApiError>(
    (index, previous: HistoryPage | null) => {
      if (index === 0) return studyHistoryKey(studyId, filters);
      if (!previous || previous.nextBefore === null) return null;
      return studyHistoryKey(studyId, filters, previous.nextBefore);
    },
    // Older pages do not change once written; only the first page needs a fresh look.
    { revalidateAll: false, revalidateFirstPage: true },
  );
  const pages = data ?? [];
  const last = pages[pages.length - 1];
  return {
    events: data ? pages.flatMap((page) => page.events) : undefined,
    actors: pages[0]?.actors ?? [],
    hasOlder: Boolean(last && last.nextBefore !== null),
    loadingOlder: size > pages.length && !error,
    showOlder: () => setSize(size + 1),
    error,
    isLoading: isLoading && !data,
    mutate,
  };
}
