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
