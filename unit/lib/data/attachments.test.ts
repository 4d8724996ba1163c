import { createHash } from 'node:crypto';
import http from 'node:http';
import net from 'node:net';
import type { SessionUser } from '../../../src/lib/auth/session-user';
import { attachmentDownloadUrl, createAttachment, listAttachments, readAttachmentBytes, type AttachmentUpload } from '../../../src/lib/data/attachments';
import { HttpError } from '../../../src/lib/http/errors';
import { readObject, setObjectStoreConfig } from '../../../src/lib/storage/object-store';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';

/**
 * Attachments against the real test database and the S3 stand-in that `npm test` starts
 * (S3_ENDPOINT and the other S3_* variables come from scripts/lib/instance.mjs).
 */

// Touchstone v1 two-port export: option line "# <unit> S <format> R <reference ohms>", one line per frequency.
const TOUCHSTONE = Buffer.from('! pad to probe, VNA\n# MHz S RI R 50\n6.78 0.10 -0.20 0.80 0.05 0.80 0.05 0.12 -0.18\n');
// A complete 1x1 PNG; its first 8 bytes are the signature of PNG spec section 5.2.
const PNG_1X1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
// A Windows executable's DOS header ("MZ", NUL bytes).
const EXE = Buffer.concat([Buffer.from('MZ'), Buffer.alloc(62), Buffer.from('PE\0\0')]);

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function failure(action: () => Promise<unknown>): Promise<HttpError> {
  try {
    await action();
  } catch (error) {
    if (error instanceof HttpError) return error;
    throw error;
  }
  throw new Error('expected an HttpError');
}

/** A loopback port nothing listens on: bound by us a moment ago, then closed. */
async function closedPort(): Promise<number> {
  const server = net.createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as net.AddressInfo;
  await new Promise((resolve) => server.close(resolve));
  return port;
}

describe('attachments data', () => {
  let researcher: SessionUser;
  let student: SessionUser;
  let supervisor: SessionUser;
  let outsider: SessionUser;
  let admin: SessionUser;
  let padId: number;
  let railId: number;
  let planId: number;
  let points: { id: number; seq: number }[];
  const rowCount = async () => Number((await db('attachments').count('* as n').first())?.n);
  const touchstone = (extra: Partial<AttachmentUpload> = {}): AttachmentUpload => ({
    kind: 'instrument', pointId: null, fileName: 'pad.s2p', caption: null, bytes: TOUCHSTONE, ...extra,
  });

  beforeAll(async () => {
    [researcher, student, supervisor, outsider, admin] = await Promise.all(
      [SEEDED.researcher, SEEDED.student, SEEDED.supervisor, SEEDED.otherResearcher, SEEDED.admin].map(sessionUserByEmail),
    );
    padId = await studyIdByName(SEEDED.padStudy);
    railId = await studyIdByName(SEEDED.railStudy);
    // The seeded plan that is on the bench.
    planId = (await db('sweep_plans').where({ study_id: padId, name: 'Probe tilt x depth' }).first('id')).id;
    points = (await db('sweep_points').where({ plan_id: planId }).orderBy('seq').select('id', 'seq')).map((p) => ({ id: Number(p.id), seq: p.seq }));
  });
  afterAll(async () => {
    setObjectStoreConfig(null); // closes the S3 client's sockets
    await db.destroy();
  });

  let instrumentId: number;

  it('stores a student\'s Touchstone file at a point: bytes, SHA-256, a generated key, the audit entry', async () => {
    const point = points[2];
    const attachment = await createAttachment(student, padId, planId, {
      kind: 'instrument', pointId: point.id, fileName: '../../pad run 3.s2p', caption: '  VNA at 6.78 MHz ', bytes: TOUCHSTONE,
    });
    instrumentId = attachment.id;
    expect(attachment).toMatchObject({
      studyId: padId, planId, pointId: point.id, pointSeq: point.seq, kind: 'instrument', fileName: 'pad run 3.s2p',
      contentType: 'text/plain', sizeBytes: TOUCHSTONE.length, caption: 'VNA at 6.78 MHz', uploadedBy: { id: student.id, name: student.name },
    });
    // The SHA-256 stored is Node's hash of exactly the uploaded bytes.
    expect(attachment.sha256).toBe(sha256(TOUCHSTONE));

    const row = await db('attachments').where({ id: attachment.id }).first();
    expect(row.object_key).toMatch(new RegExp(`^studies/${padId}/plans/${planId}/[0-9a-f-]{36}$`));
    const audit = await db('audit_events').where({ action: 'attachment.create', target_table: 'attachments', target_id: String(attachment.id) }).first();
    expect(audit).toMatchObject({ study_id: padId, actor_id: student.id });

    const read = await readAttachmentBytes(researcher, padId, attachment.id);
    expect(read.bytes.equals(TOUCHSTONE)).toBe(true);
    expect(read.attachment).toEqual(attachment);
  });

  it('a signed link fetches the same bytes as a download, and stops working once it expires', async () => {
    const url = await attachmentDownloadUrl(supervisor, padId, instrumentId);
    expect(url.startsWith(`${process.env.S3_ENDPOINT}/`)).toBe(true);
    const response = await fetch(url);
    expect(response.status).toBe(200);
    expect(Buffer.from(await response.arrayBuffer()).equals(TOUCHSTONE)).toBe(true);
    expect(response.headers.get('content-type')).toBe('text/plain; charset=utf-8');
    expect(response.headers.get('content-disposition')).toBe(`attachment; filename="pad run 3.s2p"; filename*=UTF-8''pad%20run%203.s2p`);

    // X-Amz-Date has whole seconds: a 2 s link works for at least 1 s after signing.
    const shortLived = await attachmentDownloadUrl(student, padId, instrumentId, { expiresSeconds: 2 });
    expect((await fetch(shortLived)).status).toBe(200);
    await sleep(3500);
    const expired = await fetch(shortLived);
    expect(expired.status).toBe(403);
    expect(await expired.text()).toContain('Request has expired');
  });

  it('shows a photo inline with its detected type; the list is newest first with uploader and point', async () => {
    const photo = await createAttachment(researcher, padId, planId, { kind: 'photo', pointId: null, fileName: 'bench top.JPG', caption: 'Pad from above', bytes: PNG_1X1 });
    expect(photo).toMatchObject({ contentType: 'image/png', fileName: 'bench top.JPG.png', pointId: null, pointSeq: null, sha256: sha256(PNG_1X1) });
    const response = await fetch(await attachmentDownloadUrl(admin, padId, photo.id));
    expect(response.headers.get('content-type')).toBe('image/png');
    expect(response.headers.get('content-disposition')).toMatch(/^inline; filename="bench top\.JPG\.png"/);
    expect(Buffer.from(await response.arrayBuffer()).equals(PNG_1X1)).toBe(true);

    const listed = (await listAttachments(supervisor, padId, planId)).filter((a) => [photo.id, instrumentId].includes(a.id));
    expect(listed.map((a) => a.id)).toEqual([photo.id, instrumentId]);
    expect(listed[0].uploadedBy).toEqual({ id: researcher.id, name: researcher.name });
    expect(listed[1].pointSeq).toBe(points[2].seq);
  });

  it('outsiders get 404 for every call; an id cannot be reached through another study', async () => {
    expect(await statusOf(() => createAttachment(outsider, padId, planId, touchstone()))).toBe(404);
    expect(await statusOf(() => listAttachments(outsider, padId, planId))).toBe(404);
    expect(await statusOf(() => attachmentDownloadUrl(outsider, padId, instrumentId))).toBe(404);
    expect(await statusOf(() => readAttachmentBytes(outsider, padId, instrumentId))).toBe(404);
    // The outsider is a researcher on the rail study; the pad study's file is not in it.
    expect(await statusOf(() => attachmentDownloadUrl(outsider, railId, instrumentId))).toBe(404);
    expect(await statusOf(() => readAttachmentBytes(outsider, railId, instrumentId))).toBe(404);
    expect(await statusOf(() => attachmentDownloadUrl(admin, railId, instrumentId))).toBe(404);
    // A plan of another study is not this study's plan.
    expect(await statusOf(() => listAttachments(outsider, railId, planId))).toBe(404);
  });

  it('supervisors and site admins may look but not upload (403); students and researchers upload', async () => {
    const before = await rowCount();
    expect(await statusOf(() => createAttachment(supervisor, padId, planId, touchstone()))).toBe(403);
    expect(await statusOf(() => createAttachment(admin, padId, planId, touchstone()))).toBe(403);
    expect(await rowCount()).toBe(before);
    expect(await attachmentDownloadUrl(supervisor, padId, instrumentId)).toMatch(/X-Amz-Signature=/);
    expect(await statusOf(() => listAttachments(admin, padId, planId))).toBe(200);
  });

  it('refuses uploads to a plan that is not on the bench (409), a point of another plan (422) and non-files (415)', async () => {
    const before = await rowCount();
    await db('sweep_plans').where({ id: planId }).update({ state: 'in_review' });
    try {
      const offBench = await failure(() => createAttachment(student, padId, planId, touchstone()));
      expect(offBench.status).toBe(409);
      expect(offBench.message).toBe('Files can be attached only while the plan is on the bench; this plan is in review.');
    } finally {
      await db('sweep_plans').where({ id: planId }).update({ state: 'on_bench' });
    }
    const maxPoint = Number((await db('sweep_points').max('id as id').first())?.id);
    const badPoint = await failure(() => createAttachment(student, padId, planId, touchstone({ pointId: maxPoint + 1 })));
    expect(badPoint.status).toBe(422);
    expect(badPoint.issues.map((i) => i.path)).toEqual(['pointId']);
    const exe = await failure(() => createAttachment(student, padId, planId, { kind: 'photo', pointId: null, fileName: 'holiday.jpg', caption: null, bytes: EXE }));
    expect(exe.status).toBe(415);
    expect(exe.issues.map((i) => i.path)).toEqual(['file']);
    expect(await rowCount()).toBe(before);
  });

  it('answers 503 and stores no row when the file store cannot be reached', async () => {
    const before = await rowCount();
    setObjectStoreConfig({ endpoint: `http://127.0.0.1:${await closedPort()}` });
    const log = jest.spyOn(console, 'error').mockImplementation(() => {});
    try {
      const down = await failure(() => createAttachment(student, padId, planId, touchstone()));
      expect(down.status).toBe(503);
      expect(down.message).toBe('File storage is not reachable; try again shortly.');
      expect(await statusOf(() => readAttachmentBytes(student, padId, instrumentId))).toBe(503);
      // Operators see what failed in the server log; the user sees only the message above.
      expect(log).toHaveBeenCalledWith('Object store unavailable during upload:', expect.stringContaining('ECONNREFUSED'));
    } finally {
      log.mockRestore();
      setObjectStoreConfig(null);
    }
    expect(await rowCount()).toBe(before);
  });

  it('removes the stored object again when the row cannot be written (the plan left the bench mid-upload)', async () => {
    // A proxy in front of the stand-in moves the plan off the bench while the bytes are being stored.
    const target = new URL(process.env.S3_ENDPOINT as string);
    const seen: { putPath?: string; putStatus?: number; deletes: number } = { deletes: 0 };
    const proxy = http.createServer((request, response) => {
      const forward = () => {
        const upstream = http.request(
          { host: target.hostname, port: target.port, method: request.method, path: request.url, headers: request.headers },
          (answer) => {
            if (request.method === 'PUT') seen.putStatus = answer.statusCode;
            response.writeHead(answer.statusCode ?? 502, answer.headers);
            answer.pipe(response);
          },
        );
        upstream.on('error', () => response.destroy());
        request.pipe(upstream);
      };
      if (request.method === 'DELETE') seen.deletes += 1;
      if (request.method !== 'PUT') return forward();
      seen.putPath = new URL(request.url ?? '/', 'http://proxy').pathname;
      db('sweep_plans').where({ id: planId }).update({ state: 'in_review' }).then(forward, forward);
    });
    await new Promise<void>((resolve) => proxy.listen(0, '127.0.0.1', resolve));
    const before = await rowCount();
    setObjectStoreConfig({ endpoint: `http://127.0.0.1:${(proxy.address() as net.AddressInfo).port}` });
    try {
      expect(await statusOf(() => createAttachment(student, padId, planId, touchstone()))).toBe(409);
    } finally {
      setObjectStoreConfig(null);
      await db('sweep_plans').where({ id: planId }).update({ state: 'on_bench' });
      proxy.closeAllConnections();
      await new Promise((resolve) => proxy.close(resolve));
    }
    expect(seen.putStatus).toBe(200);
    expect(seen.deletes).toBe(1);
    // The path is /<bucket>/<key>: the object was stored, and is gone again.
    const key = decodeURIComponent(seen.putPath as string).split('/').slice(2).join('/');
    expect(key).toMatch(new RegExp(`^studies/${padId}/plans/${planId}/`));
    expect(await statusOf(() => readObject(key))).toBe(404);
    expect(await rowCount()).toBe(before);
  });
});
