/**
 * The shared HTTP error mapping: a busy solver's 503 carries Retry-After (RFC 9110, section 10.2.3),
 * and request bodies over the limit are refused with 413 before they are parsed (RFC 9110, section 15.5.14).
 */
import { z } from 'zod';
import { HttpError } from '../../../src/lib/http/errors';
import { errorResponse, parseJsonBody } from '../../../src/lib/http/respond';
import { SolverBusyError } from '../../../src/lib/solver-pool/errors';

const post = (body: string, headers: Record<string, string> = {}) =>
  new Request('http://127.0.0.1/api/solve', { method: 'POST', body, headers: { 'content-type': 'application/json', ...headers } });

const anyObject = z.object({ a: z.number() });

describe('errorResponse', () => {
  test('a busy solver is a 503 with Retry-After in whole seconds and a message saying when to retry', async () => {
    const response = errorResponse(new SolverBusyError(3));
    expect(response.status).toBe(503);
    expect(response.headers.get('retry-after')).toBe('3');
    expect(await response.json()).toEqual({ error: expect.stringMatching(/busy.*3 s/), issues: [] });
  });
  test('an unexpected error is a 500 that shows no internals', async () => {
    const spy = jest.spyOn(console, 'error').mockImplementation(() => {});
    const response = errorResponse(new Error('ER_PARSE_ERROR near SELECT * FROM users at /srv/app/x.ts:12'));
    spy.mockRestore();
    expect(response.status).toBe(500);
    const text = await response.text();
    expect(text).not.toMatch(/SELECT|users|\/srv|\.ts/);
  });
  test('an error carrying more of the body sends it beside the message and issues, which it cannot replace', async () => {
    const refused = new HttpError(422, 'Nothing was imported.', [{ path: 'rows.3.raw.rxVoltage', message: 'Not a voltage.' }], {}, { report: { total: 3 }, error: 'ignored' });
    const response = errorResponse(refused);
    expect(response.status).toBe(422);
    expect(await response.json()).toEqual({ error: 'Nothing was imported.', issues: [{ path: 'rows.3.raw.rxVoltage', message: 'Not a voltage.' }], report: { total: 3 } });
  });
  describe('the database out of reach is a 503 with Retry-After that names no internals', () => {
    // The shapes the drivers give (mysql2 marks every error that ended its connection `fatal`; MariaDB's
    // ER_SERVER_SHUTDOWN 1053 and ER_CONNECTION_KILLED 1927; Knex's pool timeout), from their sources.
    const refused = Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:3408'), { code: 'ECONNREFUSED', fatal: true });
    const lost = Object.assign(new Error('insert into `readings` ... - Connection lost: The server closed the connection.'), { code: 'PROTOCOL_CONNECTION_LOST', fatal: true });
    const shutdown = Object.assign(new Error('Server shutdown in progress'), { code: 'ER_SERVER_SHUTDOWN', errno: 1053 });
    const poolTimeout = Object.assign(new Error('Knex: Timeout acquiring a connection. The pool is probably full.'), { name: 'KnexTimeoutError' });
    test.each([['refused', refused], ['lost mid-query', lost], ['shutting down', shutdown], ['pool timeout', poolTimeout]])('%s', async (_label, error) => {
      const consoleError = jest.spyOn(console, 'error').mockImplementation(() => {});
      const response = errorResponse(error);
      consoleError.mockRestore();
      expect(response.status).toBe(503);
      expect(response.headers.get('retry-after')).toBe('5');
      const body = await response.json();
      expect(body).toEqual({ error: 'The database is not reachable; try again shortly.', issues: [] });
      expect(JSON.stringify(body)).not.toMatch(/insert|readings|ECONN|PROTOCOL|127\.0\.0\.1|Knex/);
    });
    test('a query error that leaves the connection usable is not mistaken for an outage', () => {
      const consoleError = jest.spyOn(console, 'error').mockImplementation(() => {});
      const syntax = Object.assign(new Error('You have an error in your SQL syntax'), { code: 'ER_PARSE_ERROR', errno: 1064, fatal: false });
      expect(errorResponse(syntax).status).toBe(500);
      consoleError.mockRestore();
    });
  });

  test('a duplicate key is a 409', () => {
    expect(errorResponse(Object.assign(new Error('dup'), { code: 'ER_DUP_ENTRY' })).status).toBe(409);
  });
});

describe('parseJsonBody', () => {
  test('parses a body within the limit', async () => {
    await expect(parseJsonBody(post('{"a":1}'), anyObject, 64)).resolves.toEqual({ a: 1 });
  });
  test('refuses a body over the limit with 413, also when Content-Length is absent or understated', async () => {
    for (const request of [post('x'.repeat(65)), post('x'.repeat(65), { 'content-length': '10' })]) {
      const error = await parseJsonBody(request, anyObject, 64).then(() => null, (e: unknown) => e);
      expect(error).toBeInstanceOf(HttpError);
      expect((error as HttpError).status).toBe(413);
      expect((error as HttpError).issues).toEqual([{ path: '(body)', message: expect.stringMatching(/larger than/) }]);
    }
  });
  test('refuses a declared Content-Length over the limit without reading the body', async () => {
    const error = await parseJsonBody(post('{}', { 'content-length': String(1 << 20) }), anyObject, 64 * 1024).then(() => null, (e: unknown) => e);
    expect((error as HttpError).status).toBe(413);
  });
  test('malformed JSON is a 422 naming the body', async () => {
    const error = (await parseJsonBody(post('{"a":'), anyObject).catch((e: unknown) => e)) as HttpError;
    expect(error.status).toBe(422);
    expect(error.issues[0].path).toBe('(body)');
  });
  test('a body cut off by a broken connection is a 400 naming the body, not a server failure', async () => {
    // what Node's request stream does when the client resets the connection mid-body
    const reset = Object.assign(new Error('aborted'), { code: 'ECONNRESET' });
    const body = new ReadableStream<Uint8Array>({
      start(controller) {
        controller.enqueue(new TextEncoder().encode('{"a":'));
        controller.error(reset);
      },
    });
    const request = new Request('http://127.0.0.1/api/solve', { method: 'POST', body, headers: { 'content-type': 'application/json' }, duplex: 'half' } as RequestInit);
    const error = (await parseJsonBody(request, anyObject).catch((e: unknown) => e)) as HttpError;
    expect(error).toBeInstanceOf(HttpError);
    expect(error.status).toBe(400);
    expect(error.issues).toEqual([{ path: '(body)', message: expect.stringMatching(/cut off/) }]);
  });
});
