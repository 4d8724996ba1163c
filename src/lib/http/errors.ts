/**
 * Domain errors that carry their HTTP status. Route handlers and server actions map them in one place
 * (src/lib/http/respond.ts); the message is written for the user and never holds internals.
 */
export interface FieldIssue {
  path: string;
  message: string;
}

export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly issues: FieldIssue[] = [],
    /** Response headers that belong with this error, such as Retry-After on a 503. */
    readonly headers: Record<string, string> = {},
    /** More of the answer's body beside `error` and `issues`, such as a refused import's row report. */
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const unauthorized = (message = 'Sign in to continue.') => new HttpError(401, message);
export const forbidden = (message = 'Your role on this study does not allow that.') => new HttpError(403, message);
export const notFound = (message = 'Not found.') => new HttpError(404, message);
export const conflict = (message: string, issues: FieldIssue[] = []) => new HttpError(409, message, issues);
export const unprocessable = (message: string, issues: FieldIssue[] = []) => new HttpError(422, message, issues);
export const tooManyRequests = (message: string) => new HttpError(429, message);

/**
 * What work given up because its request was abandoned rejects with. The client is gone, so nobody
 * reads it; an HttpError keeps it out of the server log's unexpected failures.
 */
export const abandoned = (message: string) => new HttpError(503, message);

/** What a person is told while MariaDB cannot be reached; like the file store's, it says to retry. */
export const DATABASE_UNREACHABLE_MESSAGE = 'The database is not reachable; try again shortly.';

/**
 * MariaDB's own "going away" errors: the server is shutting down (ER_SERVER_SHUTDOWN, 1053) or ended
 * the connection (ER_CONNECTION_KILLED, 1927).
 */
const SERVER_GOING_AWAY_ERRNOS = new Set([1053, 1927]);

/**
 * A 503 with Retry-After when `error` says the database cannot be reached: mysql2 marks `fatal` every
 * error that ended its connection (refused, reset, timed out, lost mid-query, a command on a closed
 * connection); MariaDB may say it is going away; Knex gives up waiting for a pooled connection
 * (KnexTimeoutError). The request's transaction did not commit in any of these cases, or its outcome
 * is unknown (a connection lost during COMMIT), so the answer never claims what was stored. null for
 * any other error.
 */
export function databaseUnavailable(error: unknown): HttpError | null {
  if (typeof error !== 'object' || error === null) return null;
  const e = error as { fatal?: unknown; errno?: unknown; name?: unknown };
  const down = e.fatal === true || (typeof e.errno === 'number' && SERVER_GOING_AWAY_ERRNOS.has(e.errno)) || e.name === 'KnexTimeoutError';
  return down ? new HttpError(503, DATABASE_UNREACHABLE_MESSAGE, [], { 'Retry-After': '5' }) : null;
}
