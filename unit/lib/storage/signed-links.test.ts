import { createHash, createHmac } from 'node:crypto';
import type { SessionUser } from '@/lib/auth/session-user';
import { actAs } from '../../support/acting-user';
import { attachmentDownloadUrl, createAttachment, DOWNLOAD_LINK_SECONDS } from '@/lib/data/attachments';
import { attachmentObjectKey } from '@/lib/storage/object-keys';
import { deleteObject, putObject, setObjectStoreConfig, signedDownloadUrl } from '@/lib/storage/object-store';
import * as downloadRoute from '@/app/api/studies/[studyId]/attachments/[attachmentId]/route';
import { db, SEEDED, sessionUserByEmail, studyIdByName } from '../../support/database';

/**
 * Download links of attached files against the S3 stand-in that `npm test` starts: they stop working
 * when they expire, they cannot be turned into a link to another object (or a longer-lived one), the
 * app's links live a few minutes at most, and the redirect that hands them out is not cached.
 *
 * The stand-in (s3rver) checks a pre-signed URL's expiry but not its V4 signature, so the signature
 * is checked here by an independent implementation of AWS Signature Version 4 for query-string
 * authentication ("Authenticating Requests: Using Query Parameters (AWS Signature Version 4)",
 * Amazon S3 API Reference) — the check a real S3 service makes before serving the object.
 */

jest.mock('@/lib/auth/session', () => jest.requireActual('../../support/acting-user').sessionStandIn);

// Touchstone v1 two-port export: option line "# <unit> S <format> R <reference ohms>", one line per frequency.
const TOUCHSTONE = Buffer.from('! pad to probe, VNA\n# MHz S RI R 50\n6.78 0.10 -0.20 0.80 0.05 0.80 0.05 0.12 -0.18\n');

/** Longest a download link may live [s]: long enough to open a photo, short enough that a copied link soon dies (common practice). */
const MAX_LINK_SECONDS = 5 * 60;
/** The clock of the signer and of this test are the same machine's; a link is signed within this of "now" [s]. */
const SIGNING_CLOCK_SLACK_SECONDS = 5;

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

// --- AWS Signature Version 4, query-string form (S3 API Reference, "Authenticating Requests: Using Query Parameters") ---

/** URI-encode per the SigV4 rules: every byte except A-Z a-z 0-9 - _ . ~ as %XY (upper-case hex). */
const uriEncode = (value: string) => encodeURIComponent(value).replace(/[!'()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
const hmac = (key: Buffer | string, data: string) => createHmac('sha256', key).update(data, 'utf8').digest();
const sha256Hex = (data: string) => createHash('sha256').update(data, 'utf8').digest('hex');

/** Recomputes the X-Amz-Signature of a pre-signed GET URL with the secret key and says whether it matches. */
function signatureMatches(link: string, secretAccessKey: string): boolean {
  const url = new URL(link);
  const params = [...url.searchParams.entries()];
  const provided = url.searchParams.get('X-Amz-Signature');
  const amzDate = url.searchParams.get('X-Amz-Date') ?? '';
  const [, date, region, service] = (url.searchParams.get('X-Amz-Credential') ?? '').split('/');
  const signedHeaders = url.searchParams.get('X-Amz-SignedHeaders') ?? '';
  if (signedHeaders !== 'host') throw new Error(`this check signs only the host header, the link signs "${signedHeaders}"`);
  // S3 encodes each path segment once (no double encoding, unlike other services).
  const canonicalUri = url.pathname.split('/').map((segment) => uriEncode(decodeURIComponent(segment))).join('/');
  const canonicalQuery = params
    .filter(([name]) => name !== 'X-Amz-Signature')
    .map(([name, value]) => [uriEncode(name), uriEncode(value)])
    .sort(([a, av], [b, bv]) => (a === b ? (av < bv ? -1 : 1) : a < b ? -1 : 1))
    .map(([name, value]) => `${name}=${value}`)
    .join('&');
  const canonicalRequest = ['GET', canonicalUri, canonicalQuery, `host:${url.host}\n`, signedHeaders, 'UNSIGNED-PAYLOAD'].join('\n');
  const scope = `${date}/${region}/${service}/aws4_request`;
  const stringToSign = ['AWS4-HMAC-SHA256', amzDate, scope, sha256Hex(canonicalRequest)].join('\n');
  const signingKey = hmac(hmac(hmac(hmac(`AWS4${secretAccessKey}`, date), region), service), 'aws4_request');
  return createHmac('sha256', signingKey).update(stringToSign, 'utf8').digest('hex') === provided;
}

/** The same link with one query parameter replaced. */
function withParam(link: string, name: string, value: string): string {
  const url = new URL(link);
  url.searchParams.set(name, value);
  return url.toString();
}

/** The same link pointing at another object key of the bucket (path-style: /<bucket>/<key>). */
function withKey(link: string, bucket: string, key: string): string {
  const url = new URL(link);
  url.pathname = `/${bucket}/${key.split('/').map(uriEncode).join('/')}`;
  return url.toString();
}

/** X-Amz-Date (yyyyMMddTHHmmssZ) as epoch seconds. */
function signedAtSeconds(link: string): number {
  const m = /^(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})(\d{2})Z$/.exec(new URL(link).searchParams.get('X-Amz-Date') ?? '');
  if (!m) throw new Error('no X-Amz-Date');
  return Date.UTC(+m[1], +m[2] - 1, +m[3], +m[4], +m[5], +m[6]) / 1000;
}

/** How long a Cache-Control value lets a cache (browser or shared) keep the answer [s]; 0 when never. */
function cacheLifetimeSeconds(cacheControl: string | null): number {
  if (!cacheControl) return Number.POSITIVE_INFINITY; // heuristic caching is allowed without the header
  const directives = cacheControl.toLowerCase().split(',').map((d) => d.trim());
  if (directives.includes('no-store')) return 0;
  const ages = directives.map((d) => /^(?:max-age|s-maxage)=(\d+)$/.exec(d)).filter((m) => m !== null).map((m) => Number(m![1]));
  return ages.length > 0 ? Math.max(...ages) : Number.POSITIVE_INFINITY;
}

describe('signed download links', () => {
  const secret = process.env.S3_SECRET_ACCESS_KEY as string;
  const bucket = process.env.S3_BUCKET as string;
  let student: SessionUser;
  let supervisor: SessionUser;
  let admin: SessionUser;
  let padId: number;
  let railId: number;
  let attachmentId: number;
  let objectKey: string;
  /** An object of the rail study, which none of the pad study's links may reach. */
  const railKeyHolder: { key?: string } = {};

  beforeAll(async () => {
    [student, supervisor, admin] = await Promise.all([SEEDED.student, SEEDED.supervisor, SEEDED.admin].map(sessionUserByEmail));
    padId = await studyIdByName(SEEDED.padStudy);
    railId = await studyIdByName(SEEDED.railStudy);
    const planId: number = (await db('sweep_plans').where({ study_id: padId, name: 'Probe tilt x depth' }).first('id')).id;
    const attachment = await createAttachment(student, padId, planId, { kind: 'instrument', pointId: null, fileName: 'links.s2p', caption: null, bytes: TOUCHSTONE });
    attachmentId = attachment.id;
    objectKey = (await db('attachments').where({ id: attachmentId }).first('object_key')).object_key;
    // Placed straight into the bucket: the key is what matters, not a row.
    railKeyHolder.key = attachmentObjectKey(railId, 1);
    await putObject(railKeyHolder.key, Buffer.from('rail study secret\n'), 'text/plain');
  });

  afterAll(async () => {
    if (railKeyHolder.key) await deleteObject(railKeyHolder.key);
    setObjectStoreConfig(null); // closes the S3 client's sockets
    await db.destroy();
  });

  it('the app\'s default link lives DOWNLOAD_LINK_SECONDS, a few minutes at most, counted from now', async () => {
    expect(DOWNLOAD_LINK_SECONDS).toBeGreaterThan(0);
    expect(DOWNLOAD_LINK_SECONDS).toBeLessThanOrEqual(MAX_LINK_SECONDS);
    const before = Math.floor(Date.now() / 1000);
    const link = await attachmentDownloadUrl(supervisor, padId, attachmentId);
    expect(Number(new URL(link).searchParams.get('X-Amz-Expires'))).toBe(DOWNLOAD_LINK_SECONDS);
    expect(Math.abs(signedAtSeconds(link) - before)).toBeLessThanOrEqual(SIGNING_CLOCK_SLACK_SECONDS);
    // The store's own signer, called without a lifetime, is no longer-lived than the app's default.
    const bare = await signedDownloadUrl(objectKey, { fileName: 'x.s2p', contentType: 'text/plain' });
    expect(Number(new URL(bare).searchParams.get('X-Amz-Expires'))).toBeLessThanOrEqual(MAX_LINK_SECONDS);
  });

  it('works at once and is refused with 403 AccessDenied "Request has expired" once its seconds are up', async () => {
    const link = await attachmentDownloadUrl(student, padId, attachmentId, { expiresSeconds: 2 });
    expect(new URL(link).searchParams.get('X-Amz-Expires')).toBe('2');
    const fresh = await fetch(link);
    expect(fresh.status).toBe(200);
    expect(Buffer.from(await fresh.arrayBuffer()).equals(TOUCHSTONE)).toBe(true);
    // X-Amz-Date has whole seconds, so the link may have had up to 1 s less than asked; wait past both.
    await sleep(3200);
    const expired = await fetch(link);
    expect(expired.status).toBe(403);
    const body = await expired.text();
    expect(body).toContain('<Code>AccessDenied</Code>');
    expect(body).toContain('Request has expired');
    // The bytes are not in the refusal.
    expect(body).not.toContain('# MHz S RI R 50');
  });

  it('a 1 s link of the store\'s signer expires the same way', async () => {
    const link = await signedDownloadUrl(objectKey, { fileName: 'links.s2p', contentType: 'text/plain', expiresSeconds: 1 });
    await sleep(2200);
    const expired = await fetch(link);
    expect(expired.status).toBe(403);
    expect(await expired.text()).toContain('Request has expired');
  });

  it('the signature covers the key, the lifetime and the response headers, so none can be changed', async () => {
    const link = await attachmentDownloadUrl(supervisor, padId, attachmentId, { expiresSeconds: 60 });
    // The independent check accepts the link as signed: it computes what S3 computes.
    expect(signatureMatches(link, secret)).toBe(true);
    expect(signatureMatches(link, `${secret}x`)).toBe(false);
    expect(new URL(link).pathname).toBe(`/${bucket}/${objectKey}`);

    const otherStudy = withKey(link, bucket, railKeyHolder.key as string);
    expect(new URL(otherStudy).pathname).toBe(`/${bucket}/${railKeyHolder.key}`);
    expect(signatureMatches(otherStudy, secret)).toBe(false);
    expect(signatureMatches(withParam(link, 'X-Amz-Expires', '604800'), secret)).toBe(false);
    expect(signatureMatches(withParam(link, 'X-Amz-Date', '20990101T000000Z'), secret)).toBe(false);
    // Served as HTML inline, an uploaded text file would run script in the store's origin.
    expect(signatureMatches(withParam(link, 'response-content-type', 'text/html'), secret)).toBe(false);
    expect(signatureMatches(withParam(link, 'response-content-disposition', 'inline'), secret)).toBe(false);
  });

  it('the download route redirects to a fresh short link and forbids caching the redirect', async () => {
    actAs(supervisor);
    const request = new Request(`http://127.0.0.1/api/studies/${padId}/attachments/${attachmentId}`);
    const response = await downloadRoute.GET(request, { params: Promise.resolve({ studyId: String(padId), attachmentId: String(attachmentId) }) });
    expect(response.status).toBe(302);
    const location = response.headers.get('location') as string;
    expect(new URL(location).pathname).toBe(`/${bucket}/${objectKey}`);
    expect(signatureMatches(location, secret)).toBe(true);
    const linkSeconds = Number(new URL(location).searchParams.get('X-Amz-Expires'));
    expect(linkSeconds).toBe(DOWNLOAD_LINK_SECONDS);
    const cacheControl = response.headers.get('cache-control');
    // A cached redirect would hand out the link after it expired, or after the member lost access.
    expect(cacheLifetimeSeconds(cacheControl)).toBe(0);
    expect(cacheControl?.toLowerCase()).toContain('private');
    expect((await fetch(location)).status).toBe(200);
  });

  it('the route answers 404, with no link, for an attachment id asked for under another study', async () => {
    // The site admin may see both studies; the id still belongs to only one of them.
    actAs(admin);
    const request = new Request(`http://127.0.0.1/api/studies/${railId}/attachments/${attachmentId}`);
    const response = await downloadRoute.GET(request, { params: Promise.resolve({ studyId: String(railId), attachmentId: String(attachmentId) }) });
    expect(response.status).toBe(404);
    expect(response.headers.get('location')).toBeNull();
  });
});
