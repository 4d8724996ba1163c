import useSWR from 'swr';
import type { SavedColumnMap } from '@/lib/data/reading-column-maps';
import type { ApiError } from '@/lib/client/fetch-json';

/** SWR key of the CSV column mapping a study last imported readings with. */
export const readingColumnMapKey = (studyId: number) => `/api/studies/${studyId}/reading-column-map`;

/** The study's remembered CSV mapping; null when it has none yet, undefined while loading. */
export function useReadingColumnMap(studyId: number) {
  const { data, error, mutate } = useSWR<{ columnMap: SavedColumnMap | null }, ApiError>(readingColumnMapKey(studyId));
  return { columnMap: data?.columnMap, error, mutate };
}
