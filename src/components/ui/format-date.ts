/**
 * Dates for tables, in the reader's time zone. A fixed English locale keeps the format steady for
 * every reader ("12 Mar 2026, 14:05"), whatever the browser's language.
 */
const DATE_TIME = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short' });

export function formatDateTime(iso: string): string {
  return DATE_TIME.format(new Date(iso));
}
