import { ApiError } from '@/lib/client/fetch-json';

/**
 * What went wrong, as the API said it: its message, and for a refused form the field messages
 * ("reason: Say why ..."), since "Some fields need attention." alone does not say which.
 */
export function failureMessage(failure: unknown): string {
  if (!(failure instanceof ApiError)) return 'Couplet could not be reached. Check your connection and try again.';
  if (failure.issues.length === 0) return failure.message;
  return `${failure.message} ${failure.issues.map((i) => (i.path && i.path !== '(body)' ? `${i.path}: ${i.message}` : i.message)).join(' ')}`;
}
