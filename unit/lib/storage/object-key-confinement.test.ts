import type { SessionUser } from '@/lib/auth/session-user';
import { actAs } from '../../support/acting-user';
import { bucketObjects, testBucketClient } from '../../support/test-bucket';
import { createAttachment, type Attachment } from '@/lib/data/attachments';
import { MAX_FILE_NAME_LENGTH } from '@/lib/storage/object-keys';
import { readObject, setObjectStoreConfig } from '@/lib/storage/object-store';
import * as uploadRoute from '@/app/api/studies/[studyId]/plans/[planId]/attachments/route';
import { db, SEEDED, sessionUserByEmail, studyIdByName } from '../../support/database';

/**
 * Uploaded file names cannot steer where the bytes go. Hostile names — paths that climb, absolute and
 * drive paths, encoded dots and slashes, NUL, names of only slashes, very long names, look-alike
 * slashes and dots — are sent through the data function and through the upload route (a multipart
 * body written byte for byte, so the names reach the server exactly as an attacker would send them).
 * Every object lands at studies/<studyId>/plans/<planId>/<uuid>, nothing appears or changes under any
 * other prefix of the bucket (listed with a client of this test's own), and the kept name is plain.
 * object-keys.test.ts covers sanitizeFileName itself; this is the whole path through the upload.
 */

jest.mock('@/lib/auth/session', () => jest.requireActual('../../support/acting-user').sessionStandIn);

// Touchstone v1 two-port export: option line "# <unit> S <format> R <reference ohms>", one line per frequency.
const TOUCHSTONE = Buffer.from('! pad to probe, VNA\n# MHz S RI R 50\n6.78 0.10 -0.20 0.80 0.05 0.80 0.05 0.12 -0.18\n');

const UUID_V4 = '[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}';
// Characters a kept name must not hold: path separators, C0/C1 controls, bidirectional and zero-width formatting.
const SEPARATORS = /[/\\]/;
const CONTROLS = /[\u0000-\u001f\u007f-\u009f]/;
const INVISIBLE = /[\u061c\u200b-\u200f\u202a-\u202e\u2060-\u2064\u2066-\u2069\ufeff]/;



/** The kept name is one plain segment: nothing that climbs, hides, breaks a header or overflows the column. */
function expectPlainName(name: string): void {
  expect(name).not.toMatch(SEPARATORS);
  expect(name).not.toMatch(CONTROLS);
  expect(name).not.toMatch(INVISIBLE);
  expect(name).not.toMatch(/^[.\s]/);
  expect(name.length).toBeGreaterThan(0);
  expect(Array.from(name).length).toBeLessThanOrEqual(MAX_FILE_NAME_LENGTH);
}

/**
 * A multipart/form-data body with the file part's Content-Disposition written as given, so the
 * name reaches the parser byte for byte (FormData would escape quotes and line breaks).
 */
function multipartRequest(url: string, fileDisposition: Buffer): Request {
  const boundary = '----couplet-confinement-7f3a';
  const crlf = '\r\n';
  const body = Buffer.concat([
    Buffer.from(`--${boundary}${crlf}Content-Disposition: form-data; name="kind"${crlf}${crlf}instrument${crlf}`),
    Buffer.from(`--${boundary}${crlf}`),
    fileDisposition,
    Buffer.from(`${crlf}Content-Type: application/octet-stream${crlf}${crlf}`),
    TOUCHSTONE,
    Buffer.from(`${crlf}--${boundary}--${crlf}`),
  ]);
  return new Request(url, { method: 'POST', body, headers: { 'content-type': `multipart/form-data; boundary=${boundary}` } });
}

describe('object keys stay inside their study and plan, whatever the file is called', () => {
  let student: SessionUser;
  let padId: number;
  let railId: number;
  let planId: number;
  let before: Map<string, string>;
  const created: Attachment[] = [];

  beforeAll(async () => {
    student = await sessionUserByEmail(SEEDED.student);
    padId = await studyIdByName(SEEDED.padStudy);
    railId = await studyIdByName(SEEDED.railStudy);
    planId = (await db('sweep_plans').where({ study_id: padId, name: 'Probe tilt x depth' }).first('id')).id;
    before = await bucketObjects();
  });

  afterAll(async () => {
    testBucketClient.destroy();
    setObjectStoreConfig(null); // closes the app's S3 client's sockets
    await db.destroy();
  });

  /** Checks the stored row, the object at its key and the kept name of one upload. */
  async function expectConfined(attachment: Attachment): Promise<void> {
    const row = await db('attachments').where({ id: attachment.id }).first('object_key', 'file_name', 'study_id', 'plan_id');
    expect(row.object_key).toMatch(new RegExp(`^studies/${padId}/plans/${planId}/${UUID_V4}$`));
    expect([row.study_id, row.plan_id]).toEqual([padId, planId]);
    expect((await readObject(row.object_key)).equals(TOUCHSTONE)).toBe(true);
    expect(row.file_name).toBe(attachment.fileName);
    expectPlainName(row.file_name);
    // The history shows the same plain name.
    const audit = await db('audit_events').where({ action: 'attachment.create', target_table: 'attachments', target_id: String(attachment.id) }).first('details');
    const details = typeof audit.details === 'string' ? JSON.parse(audit.details) : audit.details;
    expect(details.fileName).toBe(row.file_name);
    created.push(attachment);
  }

  /** Hostile names and the name kept for each (null: checked only for being plain). */
  const hostileNames = (): [string, string | null][] => [
    // Only the last segment is kept; text under a name that is not a text type gets ".txt" (content-type.ts).
    [`../../studies/${railId}/plans/1/x.png`, 'x.png.txt'],
    [`..\\..\\studies\\${railId}\\x.s2p`, 'x.s2p'],
    ['..\\..\\x', 'x.txt'],
    [`/studies/${railId}/plans/1/x.s2p`, 'x.s2p'],
    ['/etc/passwd', 'passwd.txt'],
    ['C:\\Windows\\System32\\x.s2p', 'x.s2p'],
    ['\\\\server\\share\\x.s2p', 'x.s2p'],
    // Names are never URL-decoded, so encoded dots and slashes stay text.
    [`%2e%2e%2f%2e%2e%2fstudies%2f${railId}%2fx.s2p`, `%2e%2e%2f%2e%2e%2fstudies%2f${railId}%2fx.s2p`],
    ['%2E%2E%5C%2E%2E%5Cx.s2p', '%2E%2E%5C%2E%2E%5Cx.s2p'],
    ['..%c0%af..%c0%afx.s2p', '%c0%af..%c0%afx.s2p'],
    ['pad\u0000../../x.s2p', 'x.s2p'],
    ...['\u0000', '/', '//////', '\\', '.', '..', '...'].map((raw): [string, string] => [raw, 'file.txt']),
    [`${'a'.repeat(5000)}.s2p`, `${'a'.repeat(MAX_FILE_NAME_LENGTH - 4)}.s2p`],
    [`${'../'.repeat(400)}deep.s2p`, 'deep.s2p'],
    // Look-alikes of slashes and dots (division slash, one-dot leader, fullwidth solidus, reverse
    // solidus and full stop, fraction slash) are letters to a file system: the key ignores them.
    [`\u2024\u2024\u2215\u2024\u2024\u2215studies\u2215${railId}\u2215x.s2p`, 'x.s2p'],
    ['\uff0e\uff0e\uff0f\uff0e\uff0e\uff0fx.s2p', 'x.s2p'],
    ['..\uff3c..\u2044x.s2p', 'x.s2p'],
    ['pad\u202egnp.s2p', 'padgnp.s2p'],
    ['x.s2p\r\nX-Amz-Meta-Evil: 1', 'x.s2pX-Amz-Meta-Evil_ 1.txt'],
  ];

  it('through createAttachment: every hostile name gets a key of this study and plan and a plain kept name', async () => {
    for (const [fileName, kept] of hostileNames()) {
      const attachment = await createAttachment(student, padId, planId, { kind: 'instrument', pointId: null, fileName, caption: null, bytes: TOUCHSTONE });
      await expectConfined(attachment);
      if (kept !== null) expect([fileName, attachment.fileName]).toEqual([fileName, kept]);
    }
  });

  it('through the upload route: names sent raw in the multipart body, quoted and RFC 5987-encoded', async () => {
    actAs(student);
    const url = `http://127.0.0.1/api/studies/${padId}/plans/${planId}/attachments`;
    const params = { params: Promise.resolve({ studyId: String(padId), planId: String(planId) }) };
    const disposition = (parameters: string | Buffer) => Buffer.concat([Buffer.from('Content-Disposition: form-data; name="file"; '), Buffer.from(parameters)]);
    const stored: [Buffer, string][] = [
      [disposition(`filename="../../studies/${railId}/plans/1/x.s2p"`), 'x.s2p'],
      [disposition('filename="..\\..\\..\\x.s2p"'), 'x.s2p'],
      [disposition('filename="/"'), 'file.txt'],
      [disposition('filename="%2e%2e%2f%2e%2e%2fx.s2p"'), '%2e%2e%2f%2e%2e%2fx.s2p'],
      [disposition(Buffer.concat([Buffer.from('filename="a'), Buffer.from([0]), Buffer.from('/../../x.s2p"')])), 'x.s2p'],
      [disposition(`filename="${'\uff0e\uff0e\uff0f'.repeat(100)}x.s2p"`), 'x.s2p'],
    ];
    for (const [parameters, kept] of stored) {
      const response = await uploadRoute.POST(multipartRequest(url, parameters), params);
      const body = await response.json();
      // The disposition beside the status, so a failure names the case.
      expect([JSON.stringify(parameters.toString('utf8')), response.status, body.error]).toEqual([JSON.stringify(parameters.toString('utf8')), 201, undefined]);
      await expectConfined(body.attachment as Attachment);
      expect(body.attachment.fileName).toBe(kept);
    }
    // The form parser does not take RFC 5987 names (filename*), alone or beside a plain one: the whole
    // upload is refused as malformed, and nothing is stored (the bucket check below).
    for (const parameters of [`filename*=UTF-8''..%2F..%2Fstudies%2F${railId}%2Fx.s2p`, `filename="x.s2p"; filename*=UTF-8''..%2F..%2Fx.s2p`]) {
      const refused = await uploadRoute.POST(multipartRequest(url, disposition(parameters)), params);
      expect([parameters, refused.status]).toEqual([parameters, 422]);
    }
  });

  it('ids in the path that are not plain ids are refused (404) before anything is stored', async () => {
    actAs(student);
    for (const [studyId, plan] of [[`${padId}/../${railId}`, String(planId)], [String(padId), `${planId}%2F..`], ['..', '..'], [`${padId}\u0000`, String(planId)]]) {
      const request = multipartRequest(`http://127.0.0.1/api/studies/x/plans/y/attachments`, Buffer.from('Content-Disposition: form-data; name="file"; filename="x.s2p"'));
      const response = await uploadRoute.POST(request, { params: Promise.resolve({ studyId, planId: plan }) });
      expect(response.status).toBe(404);
    }
  });

  it('the bucket gained exactly the uploads\' objects, all under this plan; nothing else appeared or changed', async () => {
    const after = await bucketObjects();
    const added = [...after.keys()].filter((key) => !before.has(key)).sort();
    const rowKeys = (await db('attachments').whereIn('id', created.map((a) => a.id)).pluck('object_key')).sort();
    expect(rowKeys).toHaveLength(created.length);
    expect(added).toEqual(rowKeys);
    for (const key of added) expect(key).toMatch(new RegExp(`^studies/${padId}/plans/${planId}/${UUID_V4}$`));
    // Every key that was there before is there still, unchanged: other studies' prefixes and everything else.
    for (const [key, version] of before) expect([key, after.get(key)]).toEqual([key, version]);
    const outsideThisPlan = (listing: Map<string, string>) => [...listing].filter(([key]) => !key.startsWith(`studies/${padId}/plans/${planId}/`));
    expect(outsideThisPlan(after)).toEqual(outsideThisPlan(before));
  });
});
