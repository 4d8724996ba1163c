import 'server-only';
import { isDeadlock } from '../db-retry';
import { ZodError, type ZodType } from 'zod';
import { readBodyText } from './body-limit';
import { databaseUnavailable, HttpError, unprocessable, type FieldIssue } from './errors';

/** Field path of a zod issue as a dotted string ("members.0.email"); the body itself is "(body)". */
export function issuePath(path: readonly PropertyKey[]): string {
  return path.length === 0 ? '(body)' : path.map(String).join('.');
}

export function zodIssues(error: ZodError): FieldIssue[] {
  return error.issues.map((issue) => ({ path: issuePath(issue.path), message: issue.message }));
}

/** A MariaDB duplicate-key error (unique index), which we answer with 409. */
function isDuplicateKey(error: unknown): boolean {
  return typeof error === 'object' && error !== null && (error as { code?: string }).code === 'ER_DUP_ENTRY';
}

/** Maps any thrown value to a JSON response: the user sees what to fix, never internals. */
export function errorResponse(error: unknown): Response {
  if (error instanceof ZodError) {
    return Response.json({ error: 'Some fields need attention.', issues: zodIssues(error) }, { status: 422 });
  }
  if (error instanceof HttpError) {
    return Response.json({ ...error.body, error: error.message, issues: error.issues }, { status: error.status, headers: error.headers });
  }
  if (isDuplicateKey(error)) {
    return Response.json({ error: 'That already exists.', issues: [] }, { status: 409 });
  }
  const unavailable = databaseUnavailable(error);
  if (unavailable) {
    // the cause for the operator: Knex puts the whole statement (a batch of rows) before the driver's words
    const { code, errno, message } = error as { code?: string; errno?: number; message?: string };
    console.error('Database unreachable in route handler:', code ?? errno ?? String(message).slice(-120));
    return errorResponse(unavailable);
  }
  if (isDeadlock(error)) {
    // still deadlocked after the data layer's retries: a busy moment, not a fault of the request
    return Response.json({ error: 'Couplet is busy with other changes to the same data. Try again in a moment.', issues: [] }, { status: 503, headers: { 'Retry-After': '1' } });
  }
  console.error('Unhandled error in route handler', error);
  return Response.json({ error: 'Something went wrong on our side. Try again.', issues: [] }, { status: 500 });
}

/** Largest JSON body a route reads unless it asks for another limit. */
export const DEFAULT_MAX_BODY_BYTES = 256 * 1024;

/** A UTF-16 surrogate without its partner: JSON text may write one ("\ud800"), but no UTF-8 text holds it. */
const LONE_SURROGATE = /\p{Cs}/u;

/**
 * Paths of the keys and texts in a parsed body that hold a lone surrogate. Such text cannot be stored
 * as it was sent (MariaDB refuses it in JSON columns, such as the audit trail's), so it is refused here.
 * Walks with its own stack and parent links: a body nested many thousands deep must not overflow.
 */
function loneSurrogatePaths(body: unknown, limit = 20): string[] {
  type Node = { key: PropertyKey; parent: Node | null } | null;
  const pathOf = (node: Node): string => {
    const keys: PropertyKey[] = [];
    for (let n = node; n; n = n.parent) keys.push(n.key);
    return issuePath(keys.reverse());
  };
  const found: string[] = [];
  const stack: [unknown, Node][] = [[body, null]];
  while (stack.length > 0 && found.length < limit) {
    const [value, node] = stack.pop()!;
    if (typeof value === 'string') {
      if (LONE_SURROGATE.test(value)) found.push(pathOf(node));
    } else if (value !== null && typeof value === 'object') {
      const isArray = Array.isArray(value);
      for (const [key, child] of Object.entries(value)) {
        const childNode = { key: isArray ? Number(key) : key, parent: node };
        if (LONE_SURROGATE.test(key)) found.push(pathOf(childNode));
        stack.push([child, childNode]);
      }
    }
  }
  return found;
}

/**
 * Reads and validates a JSON body; malformed JSON, text with a lone surrogate and schema failures
 * become 422 with field paths, and a body over `maxBytes` is refused with 413 before it is parsed.
 */
export async function parseJsonBody<T>(request: Request, schema: ZodType<T>, maxBytes = DEFAULT_MAX_BODY_BYTES): Promise<T> {
  return parseJsonText(await readBodyText(request, maxBytes), schema);
}

/** Validates a JSON body already read (see parseJsonBody), with the same 422s. */
export function parseJsonText<T>(text: string, schema: ZodType<T>): T {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw unprocessable('The request body is not valid JSON.', [{ path: '(body)', message: 'Expected a JSON object.' }]);
  }
  const broken = loneSurrogatePaths(raw);
  if (broken.length > 0) {
    throw unprocessable('Some text holds a broken character.', broken.map((path) => ({ path, message: 'This text holds half of a character (a lone surrogate); type it again.' })));
  }
  return schema.parse(raw);
}

/** Parses a numeric route parameter (an id); anything else is a 404, like a missing row. */
export function idParam(value: string): number {
  if (!/^[1-9][0-9]{0,9}$/.test(value)) throw new HttpError(404, 'Not found.');
  return Number(value);
}

/**
 * Wraps a route handler so every error goes through errorResponse. Handlers keep the fixed order:
 * params, auth, parse body, call lib, Response.json.
 */
export function route<C>(handler: (request: Request, context: C) => Promise<Response>) {
  return async (request: Request, context: C): Promise<Response> => {
    try {
      return await handler(request, context);
    } catch (error) {
      return errorResponse(error);
    }
  };
}
