import 'server-only';
import { createHash } from 'node:crypto';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { serverEnv } from '../env';
import { HttpError, notFound } from '../http/errors';
import { contentDisposition } from './object-keys';

/**
 * The attachment bytes live in an S3-compatible object store (the s3rver stand-in locally, any S3
 * service in production), reached through one S3Client per server process, like the one Knex
 * instance of db.ts. Every failure to reach the store becomes a 503 the user can act on.
 */
export interface ObjectStoreConfig {
  endpoint: string;
  /** The store's address as browsers reach it; signed URLs are made for this host. */
  publicUrl?: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
  forcePathStyle: boolean;
}

interface ObjectStore {
  config: ObjectStoreConfig;
  client: S3Client;
  /** Signs download URLs; the same client unless the public address differs. */
  signer: S3Client;
}

/** A connection that does not open within this time counts as the store being down [ms]. */
const CONNECTION_TIMEOUT_MS = 3000;
/** An upload or download of up to 15 MB that has not finished by then is given up [ms]. */
const REQUEST_TIMEOUT_MS = 60_000;

export const STORE_UNREACHABLE_MESSAGE = 'File storage is not reachable; try again shortly.';

function configFromEnv(): ObjectStoreConfig {
  const env = serverEnv();
  return {
    endpoint: env.S3_ENDPOINT,
    publicUrl: env.S3_PUBLIC_URL,
    region: env.S3_REGION,
    bucket: env.S3_BUCKET,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    forcePathStyle: env.S3_FORCE_PATH_STYLE,
  };
}

function createStore(config: ObjectStoreConfig): ObjectStore {
  const options = {
    region: config.region,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    forcePathStyle: config.forcePathStyle,
    // Checksums only where the API demands them: the SDK's default CRC32 trailers corrupted
    // uploads to s3rver, and S3-compatible services vary in supporting them.
    requestChecksumCalculation: 'WHEN_REQUIRED' as const,
    responseChecksumValidation: 'WHEN_REQUIRED' as const,
    requestHandler: { connectionTimeout: CONNECTION_TIMEOUT_MS, requestTimeout: REQUEST_TIMEOUT_MS },
  };
  const client = new S3Client({ ...options, endpoint: config.endpoint });
  const signer = config.publicUrl ? new S3Client({ ...options, endpoint: config.publicUrl }) : client;
  return { config, client, signer };
}

/** Cached on globalThis so that Next's development reloads do not open new connection pools. */
const globalForStore = globalThis as typeof globalThis & { coupletObjectStore?: ObjectStore };

function store(): ObjectStore {
  return (globalForStore.coupletObjectStore ??= createStore(configFromEnv()));
}

/**
 * Tests point the store elsewhere (a closed port, to see the 503 path) with overrides of the
 * environment's settings; null goes back to the environment.
 */
export function setObjectStoreConfig(overrides: Partial<ObjectStoreConfig> | null): void {
  const current = globalForStore.coupletObjectStore;
  if (current) {
    current.client.destroy();
    if (current.signer !== current.client) current.signer.destroy();
  }
  globalForStore.coupletObjectStore = overrides ? createStore({ ...configFromEnv(), ...overrides }) : undefined;
}

/** Socket-level failures: the store is down, unreachable or too slow. */
const NETWORK_ERROR_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ECONNABORTED', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', 'EPIPE',
]);

// The SDK's retry layer re-wraps an error that is not an `Error` of its own realm (in jest, Node's
// socket errors) as "AWS SDK error wrapper for Error: connect ECONNREFUSED ...": only the message
// names the code then.
const NETWORK_ERROR_IN_MESSAGE = new RegExp(`\\b(${[...NETWORK_ERROR_CODES].join('|')})\\b`);

interface StoreFailure {
  name?: string;
  message?: string;
  code?: string;
  errors?: { code?: string }[];
  $metadata?: { httpStatusCode?: number };
}

/** The store could not be reached, or answered that it cannot serve now (5xx, throttling). */
function isUnavailable(error: StoreFailure): boolean {
  const codes = [error.code, ...(error.errors ?? []).map((e) => e.code)];
  if (codes.some((code) => code !== undefined && NETWORK_ERROR_CODES.has(code))) return true;
  if (NETWORK_ERROR_IN_MESSAGE.test(error.message ?? '')) return true;
  if (error.name === 'TimeoutError' || error.name === 'RequestTimeout' || error.name === 'SlowDown') return true;
  return (error.$metadata?.httpStatusCode ?? 0) >= 500;
}

/** Runs one store call, mapping unavailability to 503 and a missing object to 404. */
async function call<T>(what: string, action: () => Promise<T>): Promise<T> {
  try {
    return await action();
  } catch (error) {
    const failure = error as StoreFailure;
    // A missing bucket is a configuration fault (500 below), not a missing file.
    if (failure.name === 'NoSuchKey' || (failure.$metadata?.httpStatusCode === 404 && failure.name !== 'NoSuchBucket')) {
      throw notFound('The stored file is missing.');
    }
    if (isUnavailable(failure)) {
      console.error(`Object store unavailable during ${what}:`, failure.code ?? failure.message ?? failure.name);
      throw new HttpError(503, STORE_UNREACHABLE_MESSAGE, [], { 'Retry-After': '15' });
    }
    throw error;
  }
}

/** Stores `bytes` under `key`; the store checks them against their MD5 on arrival. */
export async function putObject(key: string, bytes: Buffer, contentType: string): Promise<void> {
  const { client, config } = store();
  const contentMd5 = createHash('md5').update(bytes).digest('base64');
  await call('upload', () =>
    client.send(
      new PutObjectCommand({ Bucket: config.bucket, Key: key, Body: bytes, ContentType: contentType, ContentLength: bytes.length, ContentMD5: contentMd5 }),
    ),
  );
}

/** The whole object. */
export async function readObject(key: string): Promise<Buffer> {
  const { client, config } = store();
  return call('download', async () => {
    const response = await client.send(new GetObjectCommand({ Bucket: config.bucket, Key: key }));
    if (!response.Body) throw notFound('The stored file is missing.');
    return Buffer.from(await response.Body.transformToByteArray());
  });
}

/** Removes the object (S3 answers success for a key that is already gone). */
export async function deleteObject(key: string): Promise<void> {
  const { client, config } = store();
  await call('delete', () => client.send(new DeleteObjectCommand({ Bucket: config.bucket, Key: key })));
}

export interface DownloadOptions {
  /** The name the browser saves or shows the file under. */
  fileName: string;
  /** The detected type; images are shown inline, everything else downloads. */
  contentType: string;
  /** How long the link works [s]. */
  expiresSeconds?: number;
}

/** Raster types a browser shows without running anything; the upload check allows only these photos. */
const INLINE_TYPES = new Set(['image/jpeg', 'image/png', 'image/webp']);

/**
 * A pre-signed GET URL that works for `expiresSeconds`. The store answers it with the detected
 * content type and a Content-Disposition carrying the file name: inline for photos, attachment for
 * everything else, so no uploaded text or PDF renders in the store's origin unasked.
 * Signing is local (no request to the store).
 */
export async function signedDownloadUrl(key: string, { fileName, contentType, expiresSeconds = 300 }: DownloadOptions): Promise<string> {
  const { signer, config } = store();
  const inline = INLINE_TYPES.has(contentType);
  const command = new GetObjectCommand({
    Bucket: config.bucket,
    Key: key,
    ResponseContentType: contentType.startsWith('text/') ? `${contentType}; charset=utf-8` : contentType,
    ResponseContentDisposition: contentDisposition(inline ? 'inline' : 'attachment', fileName),
  });
  return getSignedUrl(signer, command, { expiresIn: expiresSeconds });
}
