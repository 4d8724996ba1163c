import fc from 'fast-check';
import { db } from './database';

/**
 * Hostile request bodies for the JSON routes, and the checks every answer must pass: a refusal is a
 * 4xx naming the fields at fault, never a 500, and a refused write leaves every table as it was.
 * FUZZ_SEED replays a run (fast-check prints the seed and path of a failure); FUZZ_RUNS scales it.
 */

export const FUZZ_SEED = Number(process.env.FUZZ_SEED ?? Date.now() % 2 ** 31);
export const FUZZ_RUNS = Number(process.env.FUZZ_RUNS ?? 40);
fc.configureGlobal({ seed: FUZZ_SEED, numRuns: FUZZ_RUNS });

/** A number as written in JSON text that JavaScript cannot hold (1e309) or that is not JSON at all (NaN). */
export class RawLiteral {
  constructor(readonly text: string) {}
}

export const RAW_NUMBERS = ['1e309', '-1e309', '1e999999999', '-1e-999999999', '123456789012345678901234567890', 'NaN', 'Infinity', '-Infinity', '0x10', '01', '1.', '.5', '+1', '1e', '-'];

/** Numbers at the edges of doubles and of 32-bit database columns. */
export const edgeNumbers = fc.constantFrom(0, -0, -1, 0.5, 1e-320, Number.MIN_VALUE, Number.MAX_VALUE, -Number.MAX_VALUE, 2 ** 31, 2 ** 32, 2 ** 53 + 2, 1e21, -1e21, 1e300);

/** Text that has broken parsers, databases and layouts: numbers as text, quotes, RTL, emoji, NUL, lone surrogates. */
export const edgeStrings = fc.oneof(
  fc.constantFrom(
    '', ' ', '\t\n', 'NaN', 'Infinity', '-Infinity', '1e309', '0x1f', 'null', 'true', '[]', '{}', '"', "'", '`', '\\', '\\"', "O'Brien \"quoted\"",
    '\u202eevil\u202c', '\u0645\u0631\u062d\u0628\u0627 \u05e9\u05dc\u05d5\u05dd', '\ud83e\uddf2\ud83d\udc69\u200d\ud83d\udd2c', '\u0000', 'a\u0000b', '\ufeff', '\u2028\u2029',
    '\ud800', '\udfff', 'x\ud800y', '<script>alert(1)</script>', "'; DROP TABLE users; --", '%s%n%x', 'a@b.c', 'admin@couplet.test',
  ),
  fc.string({ unit: 'binary', maxLength: 40 }),
  fc.string({ unit: 'grapheme', maxLength: 40 }),
  fc.integer({ min: 100, max: 6000 }).map((n) => 'ẞ'.repeat(n)),
);

/** Nesting far deeper than any schema, written as text (a value this deep would overflow the stack of JSON.stringify). */
const deeplyNested = fc.tuple(fc.integer({ min: 50, max: 40_000 }), fc.boolean()).map(
  ([depth, arrays]) => new RawLiteral(arrays ? `${'['.repeat(depth)}1${']'.repeat(depth)}` : `${'{"a":'.repeat(depth)}1${'}'.repeat(depth)}`),
);

/** Any value of the wrong kind, or of the right kind at an edge. */
export const weirdValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 3, arbitrary: edgeNumbers },
  { weight: 3, arbitrary: edgeStrings },
  { weight: 2, arbitrary: fc.constantFrom(...RAW_NUMBERS).map((text) => new RawLiteral(text)) },
  { weight: 1, arbitrary: fc.constantFrom(null, true, false, [], {}, [1, 2, 3], { '': null }) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  { weight: 1, arbitrary: deeplyNested },
);

type Json = unknown;

/** Every path to a value in `value` (objects and arrays) down to `depth` levels, the root excluded. */
function pathsOf(value: Json, depth = 6, prefix: (string | number)[] = []): (string | number)[][] {
  if (value === null || typeof value !== 'object' || value instanceof RawLiteral || depth === 0) return [];
  const entries: [string | number, Json][] = Array.isArray(value) ? value.map((v, i) => [i, v]) : Object.entries(value as Record<string, Json>);
  return entries.flatMap(([key, child]) => [[...prefix, key], ...pathsOf(child, depth - 1, [...prefix, key])]);
}

/** A deep copy that keeps RawLiteral markers (structuredClone would turn them into plain objects). */
function clone(value: Json): Json {
  if (value === null || typeof value !== 'object' || value instanceof RawLiteral) return value;
  if (Array.isArray(value)) return value.map(clone);
  return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, clone(v)]));
}

function setAt(root: Json, path: (string | number)[], replace: (old: Json) => Json | typeof DELETE): Json {
  const copy = clone(root) as Record<string | number, Json>;
  let parent = copy;
  for (const key of path.slice(0, -1)) parent = parent[key] as Record<string | number, Json>;
  const last = path[path.length - 1];
  const next = replace(parent[last]);
  if (next === DELETE) {
    if (Array.isArray(parent)) parent.splice(Number(last), 1);
    else delete parent[last];
  } else parent[last] = next;
  return copy;
}
const DELETE = Symbol('delete');

/** A valid body with one to three of its fields (at any depth) changed, removed or joined by an unknown one. */
export function mutatedBody(valid: Record<string, Json>): fc.Arbitrary<Json> {
  const addKey = (body: Json) => fc.tuple(fc.string({ maxLength: 12 }), weirdValue).map(([key, v]) => ({ ...(body as object), [key]: v }));
  const oneChange = (body: Json): fc.Arbitrary<Json> => {
    const paths = pathsOf(body);
    if (paths.length === 0) return addKey(body);
    return fc.oneof(
      { weight: 6, arbitrary: fc.tuple(fc.constantFrom(...paths), weirdValue).map(([path, v]) => setAt(body, path, () => v)) },
      // Right type, far off scale: a radius of 1e-250 m or a frequency of 1e+200 Hz tests the code past the schema.
      { weight: 3, arbitrary: fc.tuple(fc.constantFrom(...paths), fc.integer({ min: -300, max: 300 }), fc.boolean()).map(([path, exponent, negate]) =>
        setAt(body, path, (old) => (typeof old === 'number' ? (negate ? -1 : 1) * (old === 0 ? 1 : old) * 10 ** exponent : old))) },
      { weight: 1, arbitrary: fc.tuple(fc.constantFrom(...paths), fc.double()).map(([path, v]) => setAt(body, path, () => v)) },
      { weight: 1, arbitrary: fc.constantFrom(...paths).map((path) => setAt(body, path, () => DELETE)) },
      { weight: 1, arbitrary: fc.constantFrom(...paths).map((path) => setAt(body, path, (old) => [old])) },
      { weight: 1, arbitrary: addKey(body) },
    );
  };
  return fc.integer({ min: 1, max: 3 }).chain((n) => {
    let arb: fc.Arbitrary<Json> = fc.constant(valid);
    for (let i = 0; i < n; i += 1) arb = arb.chain((body) => (body !== null && typeof body === 'object' && !Array.isArray(body) ? oneChange(body) : fc.constant(body)));
    return arb;
  });
}

/** Text a free-text field may legitimately hold, and what the database and audit JSON must survive. */
export const TEXT_SAMPLES = ['x\ud800y', '\udfff', '\ud83e\uddf2 coil', '\u202eright-to-left\u202c', '\u0645\u0631\u062d\u0628\u0627', 'a\u0000b', 'O\'Brien "quoted" `tick`', 'back\\slash', 'line\u2028sep', '\ufeffbom'];

/** A valid body with one of its text values (at any depth) replaced by awkward but plausible text. */
export function awkwardTextBody(valid: Record<string, Json>): fc.Arbitrary<WireBody> {
  const textPaths = pathsOf(valid).filter((path) => {
    let v: Json = valid;
    for (const key of path) v = (v as Record<string | number, Json>)[key];
    return typeof v === 'string';
  });
  if (textPaths.length === 0) return fc.constant(toJsonText(valid));
  return fc.tuple(fc.constantFrom(...textPaths), fc.constantFrom(...TEXT_SAMPLES), fc.boolean()).map(([path, text, append]) =>
    toJsonText(setAt(valid, path, (old) => (append ? `${String(old)} ${text}` : text))),
  );
}

/** JSON text of `value`; a RawLiteral is written as its text, unquoted. */
export function toJsonText(value: Json): string {
  const raws: string[] = [];
  const text = JSON.stringify(value, (_key, v: unknown) => {
    if (v instanceof RawLiteral) {
      raws.push(v.text);
      return `@@raw${raws.length - 1}@@`;
    }
    return v;
  }) ?? '';
  return text.replace(/"@@raw(\d+)@@"/g, (_m, i: string) => raws[Number(i)]);
}

/** A body as it reaches the server: text, or bytes that are not valid UTF-8. */
export type WireBody = string | Uint8Array;

/** Damage done to the text after it was written: cut short, a key written twice, a BOM, bad UTF-8, padding to the limit. */
function damaged(text: string, limit: number): fc.Arbitrary<WireBody> {
  const bytes = Buffer.byteLength(text);
  return fc.oneof(
    { weight: 8, arbitrary: fc.constant<WireBody>(text) },
    { weight: 1, arbitrary: fc.integer({ min: 0, max: Math.max(0, text.length - 1) }).map((cut) => text.slice(0, cut)) },
    {
      weight: 1,
      arbitrary: fc.tuple(fc.string({ maxLength: 10 }), weirdValue).map(([key, v]) =>
        text.startsWith('{') && text.length > 2 ? `{${JSON.stringify(key)}:${toJsonText(v)},${JSON.stringify(key)}:${toJsonText(v)},${text.slice(1)}` : text,
      ),
    },
    { weight: 1, arbitrary: fc.constant(`\ufeff${text}`) },
    {
      weight: 1,
      arbitrary: fc.tuple(fc.integer({ min: 0, max: bytes }), fc.constantFrom([0xff], [0xc3, 0x28], [0xed, 0xa0, 0x80], [0xf0, 0x28, 0x8c], [0x80])).map(([at, bad]) => {
        const raw = Buffer.from(text);
        return new Uint8Array(Buffer.concat([raw.subarray(0, at), Buffer.from(bad), raw.subarray(at)]));
      }),
    },
    // Trailing white space keeps the JSON valid, so only the size decides: exactly the limit passes, one more byte is a 413.
    { weight: 1, arbitrary: fc.constantFrom(0, 1).map((over) => (bytes <= limit ? text + ' '.repeat(limit - bytes + over) : text)) },
  );
}

const SPECIAL_TEXTS = ['', ' ', 'null', 'true', '0', '"text"', '[]', '{}', '[{}]', '{"a":', '{"a":1,}', "{'a':1}", '{"__proto__":{"admin":true}}', '{"constructor":{"prototype":{"x":1}}}', '\u0000', 'NaN', '1e309'];

/** Bodies for a route whose schema `valid` satisfies: mostly near-valid, some arbitrary JSON, some not JSON at all. */
export function hostileBody(valid: Record<string, Json>, limit: number): fc.Arbitrary<WireBody> {
  const value = fc.oneof(
    { weight: 6, arbitrary: mutatedBody(valid) },
    { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 4 }) },
    { weight: 1, arbitrary: fc.anything({ maxDepth: 3, withNullPrototype: true, withObjectString: true }) },
    { weight: 1, arbitrary: fc.object({ maxDepth: 3 }) },
  );
  return fc.oneof(
    { weight: 12, arbitrary: value.map(toJsonText).chain((text) => damaged(text, limit)) },
    { weight: 1, arbitrary: fc.constantFrom<WireBody>(...SPECIAL_TEXTS) },
    { weight: 1, arbitrary: fc.json({ maxDepth: 3 }) },
  );
}

/** Query strings: the keys a route reads with hostile values, unknown keys, repeated keys, bad percent-escapes. */
export function hostileQuery(keys: string[]): fc.Arbitrary<string> {
  const value = fc.oneof(edgeStrings, edgeNumbers.map(String), fc.constantFrom(...RAW_NUMBERS), fc.constantFrom('%', '%zz', '%E0%A4%A', '%00', '+', '%2B1', '-0', '1.0', '01'));
  const pair = fc.tuple(fc.oneof(fc.constantFrom(...keys), fc.string({ maxLength: 6 })), value);
  return fc.array(pair, { maxLength: 6 }).map((pairs) =>
    // URLSearchParams writes a lone surrogate as U+FFFD where encodeURIComponent would throw; raw escapes stay as written.
    pairs.map(([k, v]) => (v.startsWith('%') || v === '+' ? `${new URLSearchParams([[k, '']])}${v}` : String(new URLSearchParams([[k, v]])))).join('&'),
  );
}

/** Every table a route may write to; CHECKSUM TABLE reads each row, so any change shows. */
const TABLES = [
  'users', 'studies', 'study_members', 'invitations', 'audit_events', 'coils', 'setups', 'sweep_plans', 'sweep_points', 'readings', 'attachments',
  'caution_acknowledgements', 'reading_column_maps', 'plan_comments', 'outlier_marks', 'plan_fits', 'plan_reviews', 'mail_outbox',
];

/** Row counts and checksums of every table, compared before and after a refused write. */
export async function databaseState(): Promise<Record<string, string>> {
  const [checksums] = (await db.raw(`CHECKSUM TABLE ${TABLES.map((t) => `\`${t}\``).join(', ')}`)) as [{ Table: string; Checksum: string | number | null }[]];
  const [[counts]] = (await db.raw(`SELECT ${TABLES.map((t) => `(SELECT COUNT(*) FROM \`${t}\`) AS \`${t}\``).join(', ')}`)) as [[Record<string, number>]];
  const state: Record<string, string> = {};
  for (const row of checksums) {
    const table = row.Table.split('.').pop()!;
    state[table] = `${counts[table]} rows, checksum ${row.Checksum}`;
  }
  return state;
}

export interface Answer {
  status: number;
  body: { error?: unknown; issues?: unknown } & Record<string, unknown>;
}

/** Reads an answer; a JSON content type must come with a JSON body. */
export async function readAnswer(response: Response): Promise<Answer> {
  const text = await response.text();
  const json = (response.headers.get('content-type') ?? '').includes('json');
  return { status: response.status, body: json ? JSON.parse(text) : {} };
}

/** What every answer must satisfy: no 5xx; a 4xx says what went wrong; a 422 names each field at fault. */
export function expectWellFormed(answer: Answer, shown: string): void {
  if (answer.status >= 500) throw new Error(`${answer.status} for ${shown}: ${JSON.stringify(answer.body)}`);
  if (answer.status < 400) return;
  expect(answer.body.error).toEqual(expect.any(String));
  expect(Array.isArray(answer.body.issues)).toBe(true);
  if (answer.status === 422 || answer.status === 413) {
    const issues = answer.body.issues as { path: unknown; message: unknown }[];
    expect(issues.length).toBeGreaterThan(0);
    for (const issue of issues) {
      expect(issue.path).toEqual(expect.any(String));
      expect(issue.message).toEqual(expect.any(String));
    }
  }
}

/** A short, printable form of a body for failure messages. */
export function showBody(body: WireBody): string {
  const text = typeof body === 'string' ? body : `bytes ${Buffer.from(body).toString('hex').slice(0, 200)}`;
  return text.length > 300 ? `${text.slice(0, 300)}… (${text.length} chars)` : text;
}
