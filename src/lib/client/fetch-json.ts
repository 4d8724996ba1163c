import type { FieldIssue } from '../http/errors';

/** An API error as the browser sees it: the status, the user-facing message and any field issues. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly issues: FieldIssue[] = [],
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

/**
 * fetch for JSON APIs: sends `body` as JSON, parses the answer and throws ApiError with the
 * server's message and field issues on any non-2xx status. The SWR fetcher and every mutation use it.
 */
export async function fetchJson<T = unknown>(url: string, init: Omit<RequestInit, 'body'> & { body?: unknown } = {}): Promise<T> {
  const { body, headers, ...rest } = init;
  const response = await fetch(url, {
    ...rest,
    headers: { Accept: 'application/json', ...(body !== undefined ? { 'Content-Type': 'application/json' } : {}), ...headers },
    body: body !== undefined ? JSON.stringify(body) : undefined,
  });
  if (response.status === 204) return undefined as T;
  const payload = await response.json().catch(() => null);
  if (!response.ok) {
    throw new ApiError(response.status, payload?.error ?? `Request failed (${response.status}).`, payload?.issues ?? []);
  }
  return payload as T;
}
