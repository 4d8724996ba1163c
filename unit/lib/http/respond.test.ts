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
});
