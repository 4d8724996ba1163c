/**
 * Hostile multipart/form-data at the routes that read a form (property-based, fast-check), beside the
 * JSON fuzzing of fuzz-json-routes.test.ts and fuzz-plan-routes.test.ts. The attachment upload is the
 * only route that reads a form (the CSV import and the Touchstone reading take JSON, fuzzed there); its
 * Touchstone files are then fed to the reading import, whose parser reads what the upload let through.
 *
 * Thrown at the upload: missing, renamed, repeated and extra parts; a string where the file belongs and
 * files where text belongs; empty files; text fields up to megabytes; quotes, CR/LF, NUL, bidi controls,
 * emoji and lone surrogates in every value and file name; NaN, 1e309 and past-64-bit numbers as the
 * point; bytes that are not UTF-8; claimed content types that lie; bodies cut short, without their
 * closing boundary or under another boundary; other content types; bodies past the size limits.
 * Every answer is below 500 and says what went wrong (a 422 or 413 names its fields, only fields the
 * form has), never SQL, a stack or a path; a refused upload leaves every table and the bucket's listing
 * as they were, and an accepted one adds exactly the object its row names. Replay with FUZZ_SEED.
 */
import { DeleteObjectCommand } from '@aws-sdk/client-s3';
import fc from 'fast-check';
import { actAs } from '../../support/acting-user';
import { bucketObjects, testBucketClient } from '../../support/test-bucket';
import type { SolverPool } from '@/lib/solver-pool/solver-pool';
import { MAX_ATTACHMENT_BYTES } from '@/lib/storage/content-type';
import { setObjectStoreConfig } from '@/lib/storage/object-store';
import { MAX_UPLOAD_BODY_BYTES } from '@/lib/storage/upload-form';
import * as attachmentsRoute from '@/app/api/studies/[studyId]/plans/[planId]/attachments/route';
import * as touchstoneRoute from '@/app/api/studies/[studyId]/plans/[planId]/readings/from-touchstone/route';
import { db } from '../../support/database';
import { databaseState, edgeNumbers, edgeStrings, expectWellFormed, FUZZ_RUNS, FUZZ_SEED, RAW_NUMBERS, readAnswer, TEXT_SAMPLES, type Answer } from '../../support/fuzz-json';
import { callRoute, closeFuzzWorld, openFuzzWorld, type Baseline, type FuzzStudy } from '../../support/fuzz-fixtures';

jest.mock('@/lib/auth/session', () => jest.requireActual('../../support/acting-user').sessionStandIn);

// Touchstone v1 two-port export: option line "# <unit> S <format> R <reference ohms>", one line per frequency.
const TOUCHSTONE = Buffer.from('! pad to probe, VNA\n# MHz S RI R 50\n6.78 0.10 -0.20 0.80 0.05 0.80 0.05 0.12 -0.18\n');
// A complete 1x1 PNG; its first 8 bytes are the signature of PNG spec section 5.2.
const PNG_1X1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
// A Windows executable's DOS header ("MZ", NUL bytes).
const EXE = Buffer.concat([Buffer.from('MZ'), Buffer.alloc(62), Buffer.from('PE\0\0')]);

/** The form's own field names; every issue of a refusal must name one of these or the body. */
const FIELDS = ['kind', 'pointId', 'caption', 'file'] as const;
const ISSUE_PATHS = new Set<string>([...FIELDS, '(body)']);
/** What a route handler would show only by mistake: a stack frame, a source or install path, a driver code, SQL. */
const INTERNALS = [/\n\s+at \S/, /node_modules|\/work\/|\/tmp\/|\.tsx?:\d+/, /\bER_[A-Z_]{3,}\b/, /\b(insert into|delete from|select \S+ from|update `)/i, /\b(TypeError|RangeError|SyntaxError)\b/];

/** One part of a form: a text field, or a file when it has a name. */
interface Part {
  name: string;
  value: string | Uint8Array;
  fileName?: string;
  type?: string;
  /** Header lines written instead of the part's own (hand-written forms only; "{n}" is the part's name). */
  head?: string;
}

/** How the form reaches the server: as undici writes a FormData, or written by hand (names escaped as browsers do, or not). */
type Encoding = 'native' | 'raw' | 'raw-escaped';
type Damage = null | { cut: number } | { insert: number; bytes: number[] } | { body: string } | 'no-close' | 'preamble' | 'lf-only';
interface Wire {
  encoding: Encoding;
  /** null: the content type that goes with the encoding; otherwise this header ("{b}" is the boundary), or none at all. */
  contentType: string | null | undefined;
  damage: Damage;
}

const BOUNDARY = '----CoupletFuzzBoundary7MA4YWxkTrZu0gW';

function rawMultipart(parts: Part[], escape: boolean): Buffer {
  // HTML's form encoding writes a quote and line breaks in names as %22, %0D and %0A.
  const q = (s: string) => (escape ? s.replace(/"/g, '%22').replace(/\r/g, '%0D').replace(/\n/g, '%0A') : s);
  const chunks: Buffer[] = [];
  for (const p of parts) {
    let head = `Content-Disposition: form-data; name="${q(p.name)}"`;
    if (p.fileName !== undefined) head += `; filename="${q(p.fileName)}"`;
    head += '\r\n';
    if (p.type !== undefined) head += `Content-Type: ${p.type}\r\n`;
    // latin1 keeps the hostile headers' bytes as written (\u00ff is the byte 0xff, not UTF-8).
    const written = p.head === undefined ? Buffer.from(head) : Buffer.from(p.head.replaceAll('{n}', p.name), 'latin1');
    chunks.push(Buffer.from(`--${BOUNDARY}\r\n`), written, Buffer.from('\r\n'), Buffer.from(p.value), Buffer.from('\r\n'));
  }
  chunks.push(Buffer.from(`--${BOUNDARY}--\r\n`));
  return Buffer.concat(chunks);
}

/** The bytes and content type of a form as it is sent. */
async function encode(parts: Part[], wire: Wire): Promise<{ bytes: Buffer; contentType: string | null }> {
  let bytes: Buffer;
  let contentType: string;
  if (wire.encoding === 'native') {
    const form = new FormData();
    for (const p of parts) {
      if (p.fileName !== undefined) form.append(p.name, new File([p.value as Uint8Array<ArrayBuffer>], p.fileName, { type: p.type ?? '' }));
      else form.append(p.name, typeof p.value === 'string' ? p.value : Buffer.from(p.value).toString('utf8'));
    }
    const request = new Request('http://127.0.0.1/', { method: 'POST', body: form });
    bytes = Buffer.from(await request.arrayBuffer());
    contentType = request.headers.get('content-type')!;
  } else {
    bytes = rawMultipart(parts, wire.encoding === 'raw-escaped');
    contentType = `multipart/form-data; boundary=${BOUNDARY}`;
  }
  const boundary = /boundary=(.*)$/.exec(contentType)![1];
  const d = wire.damage;
  if (d === 'no-close') bytes = bytes.subarray(0, bytes.lastIndexOf(`--${boundary}--`));
  else if (d === 'preamble') bytes = Buffer.concat([Buffer.from('garbage before the first boundary\r\n'), bytes]);
  else if (d === 'lf-only') bytes = Buffer.from(bytes.toString('latin1').replace(/\r\n/g, '\n'), 'latin1');
  else if (d && 'body' in d) bytes = Buffer.from(d.body);
  else if (d && 'cut' in d) bytes = bytes.subarray(0, Math.floor(d.cut * bytes.length));
  else if (d && 'insert' in d) {
    const at = Math.floor(d.insert * bytes.length);
    bytes = Buffer.concat([bytes.subarray(0, at), Buffer.from(d.bytes), bytes.subarray(at)]);
  }
  const header = wire.contentType === null ? contentType : wire.contentType === undefined ? null : wire.contentType.replace('{b}', boundary);
  return { bytes, contentType: header };
}

const sendForm = async (handler: unknown, params: Record<string, string>, body: { bytes: Buffer; contentType: string | null }): Promise<Answer> => {
  const request = new Request(`http://127.0.0.1/api/studies/${params.studyId}/plans/${params.planId}/attachments`, {
    method: 'POST', headers: body.contentType === null ? {} : { 'content-type': body.contentType }, body: new Uint8Array(body.bytes),
  });
  type Handler = (r: Request, c: { params: Promise<Record<string, string>> }) => Promise<Response>;
  return readAnswer(await (handler as Handler)(request, { params: Promise.resolve(params) }));
};

/** A refusal says what to fix and nothing of the server's insides. */
function expectNoInternals(answer: Answer, shown: string): void {
  if (answer.status < 400) return;
  const texts = [answer.body.error, ...((answer.body.issues as { message?: unknown }[]) ?? []).map((i) => i.message)].map(String).join('\n');
  for (const pattern of INTERNALS) if (pattern.test(texts)) throw new Error(`${answer.status} for ${shown} shows internals (${pattern}): ${texts}`);
}


/** Every object in the bucket as "key size etag", sorted: a stored or lost object shows. */
async function bucketState(prefix?: string): Promise<string[]> {
  return [...(await bucketObjects(prefix))].map(([key, sizeAndTag]) => `${key} ${sizeAndTag}`).sort();
}

// ---------------------------------------------------------------------------------------------
// values

/** Text a field or file name may carry: the shared edge strings, numbers as text, and very long text. */
const hugeText = fc.tuple(fc.constantFrom('a', ' ', '\u0000', '\u1e9e', '\ud83e\uddf2', '"', '\r\n', '\ud800'), fc.integer({ min: 490, max: 1_000_000 }))
  .map(([c, n]) => c.repeat(n));
const numberText = fc.oneof(edgeNumbers.map(String), fc.constantFrom(...RAW_NUMBERS), fc.constantFrom('18446744073709551616', '9223372036854775807', '-1', '1.5', '0'));
const textValue = fc.oneof({ weight: 6, arbitrary: edgeStrings }, { weight: 3, arbitrary: numberText }, { weight: 1, arbitrary: hugeText });
/** Raw bytes in a text part: not UTF-8, half a character, UTF-16. */
const badTextBytes = fc.constantFrom([0xff], [0xc3, 0x28], [0xed, 0xa0, 0x80], [0xf0, 0x28, 0x8c], [0x80], [0xff, 0xfe, 0x70, 0x00]).map((b) => Uint8Array.from(b));

const fileBytes = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom<Uint8Array>(TOUCHSTONE, PNG_1X1, EXE, new Uint8Array(0), Buffer.from('%PDF-1.7\n%\u00e2\u00e3\n'), Buffer.from('RIFF\u0004\u0000\u0000\u0000WEBPVP8 '),
    Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.from('RIFF\u0004\u0000\u0000\u0000AVI '), Buffer.from('seq,f_MHz\n1,6.78\n'), Buffer.from('\ufeffbom text\r\n'),
    Buffer.from('a\u0000b'), Buffer.from([0xff, 0xfe, 0x23, 0x00, 0x20, 0x00]), Buffer.from([0xc3, 0x28, 0x0a]), Buffer.from('\u202eevil\u202c \ud83e\uddf2\n')) },
  { weight: 2, arbitrary: fc.uint8Array({ maxLength: 300 }) },
  { weight: 2, arbitrary: edgeStrings.map((s) => Buffer.from(s)) },
);
const fileName = fc.oneof(
  edgeStrings,
  fc.constantFrom('../../etc/passwd', 'C:\\data\\run 3.s2p', 'photo\u202egpj.exe', '.', '..', '.hidden', 'x.png', 'pad.s2p', 'report.pdf', 'data.csv', 'x"y.txt', 'line\r\nbreak.txt',
    'a; filename="b.txt"', 'name="file".txt', `${'a'.repeat(300)}.s2p`, `${'\u1e9e'.repeat(250)}.jpeg`, 'CON', 'run.bat', '%22.txt', '\u0000.s2p'),
);
const typeClaim = fc.option(fc.constantFrom('image/png', 'application/octet-stream', 'text/html', 'application/x-msdownload', '', 'image/svg+xml', 'multipart/form-data; boundary=x',
  'text/plain; charset=utf-16', 'text/plain\r\nX-Injected: 1'), { nil: undefined });
const filePart = fc.record({ value: fileBytes, fileName, type: typeClaim });

type Op =
  | { op: 'remove'; field: string }
  | { op: 'text'; field: string; value: string | Uint8Array }
  | { op: 'file'; field: string; file: Omit<Part, 'name'> }
  | { op: 'extra'; field: string; part: Omit<Part, 'name'> }
  | { op: 'rename'; field: string; name: string }
  | { op: 'reverse' }
  | { op: 'head'; field: string; head: string }
  | { op: 'many' };

const field = fc.constantFrom<string>(...FIELDS);
const op: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ op: fc.constant('remove' as const), field }),
  { weight: 3, arbitrary: fc.record({ op: fc.constant('text' as const), field, value: fc.oneof({ weight: 5, arbitrary: textValue }, { weight: 1, arbitrary: badTextBytes }) }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('file' as const), field, file: filePart }) },
  fc.record({ op: fc.constant('extra' as const), field: fc.oneof(field, edgeStrings), part: fc.oneof(textValue.map((value) => ({ value })), filePart) }),
  fc.record({ op: fc.constant('rename' as const), field, name: fc.constantFrom('FILE', 'file ', 'kind\u0000', '', 'pointid', 'caption"', '\uff4b\uff49\uff4e\uff44', 'file\r\nX: y') }),
  fc.constant<Op>({ op: 'reverse' }),
  fc.record({ op: fc.constant('head' as const), field, head: fc.constantFrom(
    '', 'Content-Type: text/plain\r\n', 'Content-Disposition: attachment; name="{n}"\r\n', 'Content-Disposition: form-data; name={n}\r\n',
    'Content-Disposition: form-data; name="{n}"; filename*=UTF-8\'\'%E2%82%AC%20run.s2p\r\n', 'Content-Disposition: form-data; name="{n}"; filename="a.s2p"; filename="b.s2p"\r\n',
    'Content-Disposition: form-data; name="{n}"; filename=\r\n', 'Content-Disposition: form-data; name="{n}"; filename="\u00ff\u00fe.s2p"\r\n', 'content-disposition:FORM-DATA;NAME="{n}"\r\n',
    'Content-Disposition: form-data; name="{n}"\r\nContent-Transfer-Encoding: base64\r\n', `Content-Disposition: form-data; name="{n}"\r\nX-Long: ${'x'.repeat(100_000)}\r\n`,
    'Content-Disposition: form-data; name="{n}"; filename="a.s2p"\r\nContent-Type: multipart/mixed; boundary=inner\r\n', 'Content-Disposition: form-data; name="{n}\r\n',
  ) }),
  fc.constant<Op>({ op: 'many' }),
);

/**
 * `part` replaces the first part called `name` only: after "many" there are thousands of captions,
 * and a megabyte of text in each would make the test, not the server, spend a minute writing the body.
 */
function replaceFirst(parts: Part[], name: string, part: (p: Part) => Part): Part[] {
  const at = parts.findIndex((p) => p.name === name);
  return at < 0 ? parts : parts.map((p, i) => (i === at ? part(p) : p));
}

function applyOps(valid: Part[], ops: Op[]): Part[] {
  let parts = valid.map((p) => ({ ...p }));
  for (const o of ops) {
    if (o.op === 'reverse') parts = [...parts].reverse();
    else if (o.op === 'head') parts = parts.map((p) => (p.name === o.field ? { ...p, head: o.head } : p));
    // Ten thousand small parts: the parser's cost per part, and a caption sent again and again.
    else if (o.op === 'many') parts = [...parts, ...Array.from({ length: 10_000 }, (_, i) => ({ name: i % 2 ? 'caption' : `x${i}`, value: String(i) }))];
    else if (o.op === 'remove') parts = parts.filter((p) => p.name !== o.field);
    else if (o.op === 'text') parts = replaceFirst(parts, o.field, (p) => ({ name: p.name, value: o.value }));
    else if (o.op === 'file') parts = replaceFirst(parts, o.field, (p) => ({ name: p.name, ...o.file }));
    else if (o.op === 'extra') parts = [...parts, { name: o.field, ...o.part }];
    else parts = parts.map((p) => (p.name === o.field ? { ...p, name: o.name } : p));
  }
  return parts;
}

/** Content-Type headers other than the right one: missing, without or with a wrong boundary, other types. */
const CONTENT_TYPES = [undefined, 'multipart/form-data', 'multipart/form-data;', 'multipart/form-data; boundary=', 'multipart/form-data; boundary=wrong', 'multipart/form-data; boundary="{b}"',
  'multipart/form-data; boundary={b}{b}', 'MULTIPART/FORM-DATA; BOUNDARY={b}', 'multipart/form-data; charset=utf-8; boundary={b}', 'multipart/form-data ; boundary={b}',
  `multipart/form-data; boundary=${'x'.repeat(200)}`, 'multipart/mixed; boundary={b}', 'application/json', 'text/plain', 'application/x-www-form-urlencoded', 'application/octet-stream'];
const MULTIPART = /^multipart\/form-data\s*;/i;
/** About 0.1 s a run (two checksums of every table and two bucket listings), with room to spare [ms]. */
const PROPERTY_TIMEOUT_MS = 30_000 + FUZZ_RUNS * 500;

const damage: fc.Arbitrary<Damage> = fc.oneof(
  fc.double({ min: 0, max: 1, noNaN: true }).map((cut) => ({ cut })),
  fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), badTextBytes).map(([insert, b]) => ({ insert, bytes: [...b] })),
  fc.constantFrom<Damage>('no-close', 'preamble', 'lf-only'),
  // Not multipart at all, whatever the header says.
  fc.constantFrom('{"kind":"instrument","file":"x"}', 'kind=instrument&file=x', `--${BOUNDARY}--\r\n`, `--${BOUNDARY}`, '\r\n', '--').map((body): Damage => ({ body })),
);
const wire: fc.Arbitrary<Wire> = fc.record({
  encoding: fc.constantFrom<Encoding>('native', 'raw', 'raw-escaped'),
  contentType: fc.oneof({ weight: 8, arbitrary: fc.constant(null) }, { weight: 1, arbitrary: fc.constantFrom(...CONTENT_TYPES) }),
  damage: fc.oneof({ weight: 8, arbitrary: fc.constant(null) }, { weight: 2, arbitrary: damage }),
});

// ---------------------------------------------------------------------------------------------

describe(`form routes refuse hostile multipart bodies with 4xx and field paths (FUZZ_SEED=${FUZZ_SEED})`, () => {
  let pool: SolverPool;
  let base: Baseline;
  let fx: FuzzStudy;

  beforeAll(async () => {
    ({ pool, base, fx } = await openFuzzWorld('Fuzz forms'));
  }, 120_000);

  afterAll(async () => {
    // The accepted uploads' objects go with their rows.
    const keys = fx ? (await bucketState(`studies/${fx.studyId}/`)).map((o) => o.split(' ')[0]) : [];
    for (const key of keys) await testBucketClient.send(new DeleteObjectCommand({ Bucket: process.env.S3_BUCKET!, Key: key }));
    await closeFuzzWorld({ pool, base, fx });
    setObjectStoreConfig(null);
    testBucketClient.destroy();
    await db.destroy();
  });

  const params = (planId = fx.benchPlanId) => ({ studyId: String(fx.studyId), planId: String(planId) });
  const validParts = (): Part[] => [
    { name: 'kind', value: 'instrument' },
    { name: 'pointId', value: String(fx.pointIds[1]) },
    { name: 'caption', value: 'VNA at 6.78 MHz, "port 1" \u2014 bench 2' },
    { name: 'file', value: TOUCHSTONE, fileName: 'pad.s2p', type: 'application/octet-stream' },
  ];

  /**
   * Sends one form and checks the answer; a refusal left the tables and the bucket as they were, an
   * accepted upload added exactly its own object. Returns the answer for further checks.
   */
  async function upload(parts: Part[], w: Wire, planId = fx.benchPlanId): Promise<Answer> {
    actAs(fx.researcher);
    const body = await encode(parts, w);
    const shown = `${JSON.stringify(w)} ${body.contentType} ${JSON.stringify(body.bytes.subarray(0, 600).toString('latin1'))} (${body.bytes.length} bytes)`;
    const [before, objectsBefore] = await Promise.all([databaseState(), bucketState()]);
    const answer = await sendForm(attachmentsRoute.POST, params(planId), body);
    expectWellFormed(answer, shown);
    expectNoInternals(answer, shown);
    const [after, objectsAfter] = await Promise.all([databaseState(), bucketState()]);
    if (answer.status >= 300) {
      for (const issue of (answer.body.issues as { path: string }[])) expect(ISSUE_PATHS).toContain(issue.path);
      if (body.contentType === null || !MULTIPART.test(body.contentType)) expect(answer.status).toBe(415);
      expect(after).toEqual(before);
      expect(objectsAfter).toEqual(objectsBefore);
    } else {
      expect(answer.status).toBe(201);
      const attachment = answer.body.attachment as { id: number; fileName: string; sizeBytes: number };
      const row = await db('attachments').where({ id: attachment.id }).first('object_key');
      const added = objectsAfter.filter((o) => !objectsBefore.includes(o));
      expect(added.map((o) => o.split(' ').slice(0, 2).join(' '))).toEqual([`${row.object_key} ${attachment.sizeBytes}`]);
      expect(objectsBefore.every((o) => objectsAfter.includes(o))).toBe(true);
      // What is shown and downloaded is a plain name (sanitizeFileName): no controls, bidi overrides or folders.
      expect(attachment.fileName).not.toMatch(/[\u0000-\u001f\u007f-\u009f\u202a-\u202e\u2066-\u2069/\\]/);
      expect(Array.from(attachment.fileName).length).toBeLessThanOrEqual(200);
    }
    return answer;
  }

  test('the valid form is stored (the properties below start from it)', async () => {
    for (const encoding of ['native', 'raw', 'raw-escaped'] as const) {
      expect((await upload(validParts(), { encoding, contentType: null, damage: null })).status).toBe(201);
    }
  });

  test('POST attachments: hostile parts, names, files and wire damage never give a 5xx or leave a trace when refused', async () => {
    const statuses: Record<number, number> = {};
    await fc.assert(
      fc.asyncProperty(fc.array(op, { minLength: 1, maxLength: 3 }), wire, fc.constantFrom(0, 0, 0, 0, 1), async (ops, w, draft) => {
        const answer = await upload(applyOps(validParts(), ops), w, draft ? fx.draftPlanId : fx.benchPlanId);
        statuses[answer.status] = (statuses[answer.status] ?? 0) + 1;
        // A draft takes no files, whatever the form holds.
        if (draft) expect(answer.status).toBeGreaterThanOrEqual(400);
      }),
    );
    if (process.env.FUZZ_VERBOSE) console.log('attachments', statuses);
  }, PROPERTY_TIMEOUT_MS);

  /** One field made wrong, the rest valid: the refusal names that field. Plain data, so fast-check prints a failing case. */
  type FieldCase = { field: (typeof FIELDS)[number]; set: [string, Omit<Part, 'name'> | null][]; statuses: number[] };
  /** The valid form with parts replaced (null: removed). */
  const withParts = (valid: Part[], set: FieldCase['set']) =>
    set.reduce((parts, [name, part]) => (part === null ? parts.filter((p) => p.name !== name) : parts.map((p) => (p.name === name ? { name, ...part } : p))), valid);
  // A text part is decoded as UTF-8, which drops a leading byte order mark.
  const asReceived = (v: string) => v.replace(/^\ufeff/, '');
  // A part with an empty file name (what a browser sends when no file was chosen) may be read as text, "Choose a file".
  const unnamed = (name: string) => name === '';
  const fieldCase = (): fc.Arbitrary<FieldCase> => fc.oneof(
    fc.oneof(textValue.filter((v) => !['photo', 'instrument'].includes(asReceived(v))), fc.constant(null)).map((v): FieldCase => ({
      field: 'kind', set: [['kind', v === null ? null : { value: v }]], statuses: [422] })),
    filePart.map((f): FieldCase => ({ field: 'kind', set: [['kind', f]], statuses: [422] })),
    // Anything but empty text, or a positive whole number naming one of the plan's points, is refused at pointId.
    textValue.filter((v) => {
      const number = Number(asReceived(v));
      return asReceived(v) !== '' && !(Number.isSafeInteger(number) && fx.pointIds.includes(number));
    }).map((v): FieldCase => ({ field: 'pointId', set: [['pointId', { value: v }]], statuses: [422] })),
    // zod counts a string's length in code points, as the column's 500 characters do.
    fc.oneof(hugeText, edgeStrings.map((s) => `x${s}`.repeat(260))).filter((v) => Array.from(v.trim()).length > 500)
      .map((v): FieldCase => ({ field: 'caption', set: [['caption', { value: v }]], statuses: [422] })),
    fc.oneof(fc.constant(null), textValue).map((v): FieldCase => ({ field: 'file', set: [['file', v === null ? null : { value: v }]], statuses: [422] })),
    fc.constantFrom('', 'pad.s2p').map((name): FieldCase => ({ field: 'file', set: [['file', { value: new Uint8Array(0), fileName: name }]], statuses: [422] })),
    fc.tuple(fc.constantFrom<Uint8Array>(EXE, PNG_1X1, Buffer.from([0xff, 0xd8, 0xff, 0xe0]), Buffer.from('a\u0000b'), Buffer.from([0xc3, 0x28, 0x0a])), fileName)
      .map(([bytes, name]): FieldCase => ({ field: 'file', set: [['file', { value: bytes, fileName: name }]], statuses: unnamed(name) ? [415, 422] : [415] })),
    // Text and PDF are not photos.
    fc.tuple(fc.constantFrom<Uint8Array>(TOUCHSTONE, Buffer.from('%PDF-1.7\n'), EXE), fileName).map(([bytes, name]): FieldCase => ({
      field: 'file', set: [['kind', { value: 'photo' }], ['file', { value: bytes, fileName: name }]], statuses: unnamed(name) ? [415, 422] : [415] })),
  );

  test('POST attachments: one wrong field is refused at that field, nothing stored', async () => {
    await fc.assert(
      fc.asyncProperty(fieldCase(), fc.constantFrom<Encoding>('native', 'raw-escaped'), async (c, encoding) => {
        const answer = await upload(withParts(validParts(), c.set), { encoding, contentType: null, damage: null });
        expect(c.statuses).toContain(answer.status);
        expect((answer.body.issues as { path: string }[]).map((i) => i.path)).toContain(c.field);
      }),
    );
  }, PROPERTY_TIMEOUT_MS);

  /** The shared awkward texts, and what is awkward in a multipart header: a quote, a line break, the boundary itself. */
  const AWKWARD = [...TEXT_SAMPLES, '\u0000', '"', 'a"; name="kind', '\r\n', `--${BOUNDARY}`, `\r\n--${BOUNDARY}--\r\n`, '\ud83e\uddf2'.repeat(250), 'x'.repeat(501)];

  test.each(AWKWARD.map((text) => [Array.from(JSON.stringify(text)).slice(0, 40).join(''), text]))(
    'POST attachments: awkward text %s in the caption and file name is stored or refused at caption; in kind and pointId it is refused at both',
    async (_shown, text) => {
      const paths = (answer: Answer) => (answer.body.issues as { path: string }[]).map((i) => i.path).sort();
      for (const encoding of ['native', 'raw-escaped'] as const) {
        const w: Wire = { encoding, contentType: null, damage: null };
        // Written by hand, a value holding the boundary ends its part early: any refusal will do then.
        const intact = encoding === 'native' || !text.includes(BOUNDARY);
        const stored = await upload(withParts(validParts(), [['caption', { value: text }], ['file', { value: TOUCHSTONE, fileName: text }]]), w);
        if (stored.status !== 201 && intact) expect(paths(stored)).toEqual(['caption']);
        const refused = await upload(withParts(validParts(), [['kind', { value: text }], ['pointId', { value: text }]]), w);
        expect(refused.status).toBe(422);
        if (intact) expect(paths(refused)).toEqual(['kind', 'pointId']);
      }
    },
  );

  test('POST attachments: every content type but multipart/form-data is a 415, with nothing read', async () => {
    for (const contentType of CONTENT_TYPES.filter((t) => t === undefined || !MULTIPART.test(t))) {
      const answer = await upload(validParts(), { encoding: 'native', contentType, damage: null });
      expect(answer).toEqual({ status: 415, body: { error: expect.any(String), issues: [{ path: '(body)', message: expect.any(String) }] } });
    }
  });

  const MB = 1024 * 1024;
  test.each([
    ['an instrument file of exactly its limit is stored', 'instrument', MAX_ATTACHMENT_BYTES.instrument, 201],
    ['an instrument file one byte over its limit is a 413 at file', 'instrument', MAX_ATTACHMENT_BYTES.instrument + 1, 413],
    ['a photo one byte over its limit is a 413 at file', 'photo', MAX_ATTACHMENT_BYTES.photo + 1, 413],
  ] as const)('%s, and a refusal stores nothing', async (_name, kind, size, status) => {
    const bytes = Buffer.alloc(size, 'a');
    if (kind === 'photo') Buffer.from([0xff, 0xd8, 0xff, 0xe0]).copy(bytes);
    const parts = withParts(validParts(), [['kind', { value: kind }], ['file', { value: bytes, fileName: kind === 'photo' ? 'big.jpg' : 'big.txt' }]]);
    const answer = await upload(parts, { encoding: 'raw', contentType: null, damage: null });
    expect(answer.status).toBe(status);
    if (status === 413) expect(answer.body.issues).toEqual([{ path: 'file', message: expect.stringContaining(`${size > MAX_ATTACHMENT_BYTES.instrument + 1 ? 15 : 10} MB`) }]);
  }, 60_000);

  test('a body past the upload limit is a 413 at file: declared in Content-Length, or only as it streams', async () => {
    actAs(fx.researcher);
    const [before, objectsBefore] = await Promise.all([databaseState(), bucketState()]);
    const chunk = new Uint8Array(MB).fill(0x61);
    for (const declare of [true, false]) {
      let sent = 0;
      const body = new ReadableStream<Uint8Array>({
        pull(controller) {
          if (sent === 0) controller.enqueue(rawMultipart([{ name: 'kind', value: 'photo' }], false).subarray(0, -(BOUNDARY.length + 6)));
          sent += chunk.length;
          controller.enqueue(chunk);
        },
      });
      const headers: Record<string, string> = { 'content-type': `multipart/form-data; boundary=${BOUNDARY}` };
      if (declare) headers['content-length'] = String(MAX_UPLOAD_BODY_BYTES + 1);
      const request = new Request('http://127.0.0.1/', { method: 'POST', headers, body, duplex: 'half' } as RequestInit);
      const answer = await readAnswer(await attachmentsRoute.POST(request, { params: Promise.resolve(params()) }));
      expect(answer.status).toBe(413);
      expect((answer.body.issues as { path: string }[]).map((i) => i.path)).toEqual(['file']);
      // Read no further than the limit (and nothing at all when the length was declared).
      expect(sent).toBeLessThanOrEqual(declare ? MB : MAX_UPLOAD_BODY_BYTES + 2 * MB);
    }
    expect(await databaseState()).toEqual(before);
    expect(await bucketState()).toEqual(objectsBefore);
  }, 60_000);

  // ---------------------------------------------------------------------------------------------
  // The Touchstone reading reads what the upload stored.

  const touchstoneNumber = fc.oneof(
    { weight: 4, arbitrary: fc.double({ min: -10, max: 10, noNaN: true }).map(String) },
    { weight: 1, arbitrary: numberText },
    { weight: 1, arbitrary: fc.constantFrom('6.78', '6.78e6', '0', '-6.78', '1e-320', '5e-324', '1,5', '1.2.3', '') },
  );
  const touchstoneLine = fc.oneof(
    { weight: 4, arbitrary: fc.array(touchstoneNumber, { minLength: 0, maxLength: 12 }).map((cells) => cells.join(' ')) },
    { weight: 1, arbitrary: fc.constantFrom('! comment', '# MHz S RI R 50', '# GHz Z MA R 50', '# Hz S DB R 0', '# kHz Y RI R -50', '#', '# MHz S XX', '# MHz S RI R 1e309',
      '# MHz S RI R NaN', '# MHz S RI 50', '[Version] 2.0', '[Number of Ports] 2', '[Number of Ports] 99999999999', '[Two-Port Data Order] 12_21', '[Number of Frequencies] 1',
      '[Network Data]', '[End]', '6.78 0.1 -0.2 ! trailing comment', '\t6.78\t0.1', '6.78 0.10 -0.20 0.80 0.05 0.80 0.05 0.12 -0.18') },
    { weight: 1, arbitrary: edgeStrings },
  );
  const touchstoneFile = fc.tuple(fc.array(touchstoneLine, { maxLength: 12 }), fc.constantFrom('\n', '\r\n', '\r'), fc.boolean())
    .map(([lines, eol, withOptions]) => (withOptions ? ['# MHz S RI R 50', ...lines] : lines).join(eol));

  test('POST readings/from-touchstone reads hostile uploaded files without a 5xx; a refusal writes nothing', async () => {
    const circumstances = {
      accuracy: { relative: 0.01, phaseDeg: 1 }, achievedPose: { distance: 0.1, lateralOffset: 0, tiltDeg: 0 }, instrument: 'VNA', calibration: 'in_date', temperatureC: 21, setupNotes: '',
    };
    const statuses: Record<string, number> = {};
    await fc.assert(
      fc.asyncProperty(touchstoneFile, fc.constantFrom('run.s2p', 'run.s1p', 'run.ts', 'run.txt', 'run'), fc.constantFrom(null, 6.78e6, 1, 1e11),
        fc.integer({ min: 0, max: fx.pointIds.length - 1 }), async (text, name, frequency, pointIndex) => {
          const stored = await upload(withParts(validParts(), [['file', { value: Buffer.from(text), fileName: name }]]), { encoding: 'native', contentType: null, damage: null });
          if (stored.status !== 201) return;
          const attachmentId = (stored.body.attachment as { id: number }).id;
          actAs(fx.researcher);
          const before = await databaseState();
          const body = JSON.stringify({ pointId: fx.pointIds[pointIndex], attachmentId, frequency, ...circumstances });
          const answer = await callRoute(touchstoneRoute.POST, { method: 'POST', url: `/api/studies/${fx.studyId}/plans/${fx.benchPlanId}/readings/from-touchstone`, params: params(), body });
          statuses[answer.status] = (statuses[answer.status] ?? 0) + 1;
          expectWellFormed(answer, `from-touchstone of ${JSON.stringify(text)}`);
          expectNoInternals(answer, `from-touchstone of ${JSON.stringify(text)}`);
          if (answer.status >= 300) expect(await databaseState()).toEqual(before);
        }),
      { numRuns: Math.max(1, Math.ceil(FUZZ_RUNS / 2)) },
    );
    if (process.env.FUZZ_VERBOSE) console.log('from-touchstone', statuses);
  }, PROPERTY_TIMEOUT_MS);
});
