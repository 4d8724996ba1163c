import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from '@/lib/client/fetch-json';

export const UNREACHABLE_MESSAGE = 'Couplet could not be reached. Check your connection and try again.';

/**
 * Puts a failed request's field issues beside their fields and returns the message for the top of
 * the form, or null when the fields already say everything. A 422's message is only the generic
 * "Some fields need attention"; a 409's message names the clash ("... already on this study"), so it
 * is shown as well.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldFor: (path: string) => Path<T> | undefined,
): string | null {
  if (!(error instanceof ApiError)) return UNREACHABLE_MESSAGE;
  let unplaced = error.issues.length === 0;
  for (const issue of error.issues) {
    const field = fieldFor(issue.path);
    if (field) setError(field, { type: 'server', message: issue.message });
    else unplaced = true;
  }
  return unplaced || error.status !== 422 ? error.message : null;
}

/** For forms whose field names match the API's issue paths one to one. */
export const sameNames =
  <T extends FieldValues>(fields: readonly Path<T>[]) =>
  (path: string): Path<T> | undefined =>
    fields.find((field) => field === path);
