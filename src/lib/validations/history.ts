import { z } from 'zod';
import { HISTORY_CATEGORIES } from '../audit/describe-event';

/** Events on one page of a study's history, unless the query asks for another count. */
export const HISTORY_DEFAULT_LIMIT = 50;
export const HISTORY_MAX_LIMIT = 200;

/**
 * A query string's values arrive as text and a caller in code passes numbers; both are accepted.
 * An empty value ("?planId=") means the filter is off, as a form with nothing chosen sends it.
 */
const fromQueryText = (value: unknown) => {
  if (typeof value !== 'string') return value;
  const trimmed = value.trim();
  if (trimmed === '') return undefined;
  return /^-?\d+$/.test(trimmed) ? Number(trimmed) : trimmed;
};

const wholeNumber = (message: string) => z.number({ error: message }).int(message);

const id = (label: string) =>
  z.preprocess(fromQueryText, wholeNumber(`Give the ${label} as a whole number.`).min(1, `The ${label} must be at least 1.`).optional());

/** GET /api/studies/{studyId}/history: a page of events, newest first, older than `before`. */
export const historyQuerySchema = z.object({
  before: id('event id'),
  limit: z.preprocess(
    fromQueryText,
    wholeNumber('Give the limit as a whole number.')
      .min(1, 'The limit must be at least 1.')
      .max(HISTORY_MAX_LIMIT, `The limit must be at most ${HISTORY_MAX_LIMIT}.`)
      .default(HISTORY_DEFAULT_LIMIT),
  ),
  planId: id('plan id'),
  actorId: id('person id'),
  category: z.preprocess(
    fromQueryText,
    z.enum(HISTORY_CATEGORIES, { error: `Choose one of the kinds: ${HISTORY_CATEGORIES.join(', ')}.` }).optional(),
  ),
});

/** What a caller may pass: numbers, or the query string's text. */
export interface HistoryQueryInput {
  before?: number | string;
  limit?: number | string;
  planId?: number | string;
  actorId?: number | string;
  category?: string;
}
export type HistoryQuery = z.output<typeof historyQuerySchema>;
