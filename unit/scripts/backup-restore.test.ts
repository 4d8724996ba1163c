import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import {
  DeleteBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  ListObjectsV2Command,
  PutObjectCommand,
} from '@aws-sdk/client-s3';
import { attachmentObjectKey } from '../../src/lib/storage/object-keys';
import { deleteObject, putObject, setObjectStoreConfig } from '../../src/lib/storage/object-store';
import { db, SEEDED, sessionUserByEmail, studyIdByName } from '../support/database';
import { testBucketClient } from '../support/test-bucket';

/**
 * `npm run backup` and `npm run restore` (scripts/backup.mjs, scripts/restore.mjs) run as child
 * processes against the test instance that `npm test` runs: the seeded test database plus one real
 * object and the row naming it are backed up, restored into another database on the same server and
 * another bucket of the same S3 stand-in, and compared table by table and byte by byte.
 *
 * The children get neither DATABASE_URL nor S3_*, so they take the path `npm run backup` takes on a
 * developer's machine: the instance is locked by the running `npm test`, so they use its MariaDB (as
 * root over its socket for creating the extra database) and its stand-in.
 */

const ROOT = path.resolve(__dirname, '..', '..');
const SOURCE_DB = decodeURIComponent(new URL(process.env.DATABASE_URL!).pathname.slice(1));
const RESTORE_DB = `${SOURCE_DB}_restore_check`;
const RESTORE_BUCKET = 'couplet-restore-check';
const SOURCE_BUCKET = process.env.S3_BUCKET!;
/** Each run starts Node, the AWS SDK and a MariaDB client; the full round trip takes a few seconds. */
const SCRIPT_TIMEOUT_MS = 120_000;

// A complete 1x1 PNG; its first 8 bytes are the signature of PNG spec section 5.2 (bytes above 0x7f:
// a text-mode copy anywhere on the way would change them).
const PNG_1X1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
// Touchstone v1 two-port export, a second object with a row after the photo's.
const TOUCHSTONE = Buffer.from('! pad to probe, VNA\n# MHz S RI R 50\n6.78 0.10 -0.20 0.80 0.05 0.80 0.05 0.12 -0.18\n');
// Four-byte UTF-8 (the seedling emoji) survives only if the dump and the load both use utf8mb4. The
// quote, the unmatched parenthesis and the semicolon inside a string are what the dump's row counter
// must step over; the row after this one is counted only if it does.
const CAPTION = "Jig leaning 4° (tray 3; Maren's — 🌱";

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

const s3 = testBucketClient;

interface RunResult {
  code: number;
  output: string;
}

function run(script: 'backup.mjs' | 'restore.mjs', args: string[]): Promise<RunResult> {
  const env: NodeJS.ProcessEnv = { ...process.env, NO_COLOR: '1', AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED: 'true' };
  for (const name of Object.keys(env)) if (name === 'DATABASE_URL' || name.startsWith('S3_')) delete env[name];
  return new Promise((resolve) => {
    execFile(process.execPath, [path.join(ROOT, 'scripts', script), ...args], { cwd: ROOT, env, maxBuffer: 16 << 20 }, (error, stdout, stderr) => {
      const code = error ? (typeof error.code === 'number' ? error.code : 1) : 0;
      resolve({ code, output: `${stdout}${stderr}` });
    });
  });
}

async function bucketKeys(bucket: string): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const page = await s3.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
    for (const o of page.Contents ?? []) keys.push(o.Key!);
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return keys.sort();
}

async function objectBytes(bucket: string, key: string): Promise<Buffer> {
  const response = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
  return Buffer.from(await response.Body!.transformToByteArray());
}

async function bucketExists(bucket: string): Promise<boolean> {
  try {
    await s3.send(new HeadBucketCommand({ Bucket: bucket }));
    return true;
  } catch {
    return false;
  }
}

async function removeBucket(bucket: string): Promise<void> {
  if (!(await bucketExists(bucket))) return;
  for (const key of await bucketKeys(bucket)) await s3.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }));
  await s3.send(new DeleteBucketCommand({ Bucket: bucket }));
}

/** Drop the restore target; without privileges on it (never created) there is nothing to drop. */
async function dropRestoreDb(): Promise<void> {
  await db.raw(`DROP DATABASE IF EXISTS \`${RESTORE_DB}\``).catch(() => undefined);
}

async function tableNames(database: string): Promise<string[]> {
  const [rows] = await db.raw("SELECT table_name AS name FROM information_schema.tables WHERE table_schema = ? AND table_type = 'BASE TABLE'", [database]);
  return (rows as { name: string }[]).map((r) => r.name).sort();
}

/** CHECKSUM TABLE ... EXTENDED reads every row of each table: equal when the rows are equal. */
async function checksums(database: string, tables: string[]): Promise<Record<string, string>> {
  const [rows] = await db.raw(`CHECKSUM TABLE ${tables.map((t) => `\`${database}\`.\`${t}\``).join(', ')} EXTENDED`);
  return Object.fromEntries((rows as { Table: string; Checksum: string | number | null }[]).map((r) => [r.Table.split('.').pop(), String(r.Checksum)]));
}

async function createStatement(database: string, table: string): Promise<string> {
  const [rows] = await db.raw(`SHOW CREATE TABLE \`${database}\`.\`${table}\``);
  return (rows as Record<string, string>[])[0]['Create Table'];
}

describe('npm run backup / npm run restore', () => {
  let tmp: string;
  let backupDir: string;
  let objectKey: string;
  let attachmentId: number;
  let secondKey: string;
  let secondId: number;
  let backup: RunResult;

  beforeAll(async () => {
    // Leftovers of a run that was killed before its cleanup.
    await dropRestoreDb();
    await removeBucket(RESTORE_BUCKET);
    tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'couplet-backup-test-'));
    backupDir = path.join(tmp, 'backup');

    const studyId = await studyIdByName(SEEDED.padStudy);
    const plan = await db('sweep_plans').where({ study_id: studyId, state: 'on_bench' }).first('id');
    const student = await sessionUserByEmail(SEEDED.student);
    objectKey = attachmentObjectKey(studyId, plan.id);
    // As the app does it: the object first, then the row that names it.
    await putObject(objectKey, PNG_1X1, 'image/png');
    [attachmentId] = await db('attachments').insert({
      study_id: studyId,
      plan_id: plan.id,
      kind: 'photo',
      object_key: objectKey,
      file_name: 'jig.png',
      content_type: 'image/png',
      size_bytes: PNG_1X1.length,
      sha256: sha256(PNG_1X1),
      caption: CAPTION,
      uploaded_by: student.id,
    });
    secondKey = attachmentObjectKey(studyId, plan.id);
    await putObject(secondKey, TOUCHSTONE, 'text/plain');
    [secondId] = await db('attachments').insert({
      study_id: studyId,
      plan_id: plan.id,
      kind: 'instrument',
      object_key: secondKey,
      file_name: 'pad.s2p',
      content_type: 'text/plain',
      size_bytes: TOUCHSTONE.length,
      sha256: sha256(TOUCHSTONE),
      uploaded_by: student.id,
    });

    backup = await run('backup.mjs', ['--instance', 'test', '--out', backupDir]);
  }, SCRIPT_TIMEOUT_MS);

  afterAll(async () => {
    await dropRestoreDb();
    await removeBucket(RESTORE_BUCKET);
    await db('attachments').whereIn('id', [attachmentId, secondId].filter(Boolean)).delete();
    for (const key of [objectKey, secondKey]) if (key) await deleteObject(key);
    fs.rmSync(tmp, { recursive: true, force: true });
    s3.destroy();
    setObjectStoreConfig(null); // closes the app's S3 client's sockets
    await db.destroy();
  });

  it('writes the dump, every object and a manifest that describes them', async () => {
    expect(backup.output).toContain('backup written to');
    expect(backup.code).toBe(0);
    const manifest = JSON.parse(fs.readFileSync(path.join(backupDir, 'manifest.json'), 'utf8'));
    const dump = fs.readFileSync(path.join(backupDir, 'database.sql'));
    expect(manifest.database.dump.sha256).toBe(sha256(dump));
    expect(manifest.database.name).toBe(SOURCE_DB);

    // Exact row counts of the live database: nothing else writes to it while this file runs.
    const tables = await tableNames(SOURCE_DB);
    expect(Object.keys(manifest.database.tables).sort()).toEqual(tables);
    for (const table of tables) {
      const [[{ n }]] = await db.raw(`SELECT COUNT(*) AS n FROM \`${table}\``);
      expect({ table, rows: manifest.database.tables[table] }).toEqual({ table, rows: Number(n) });
    }
    const latest = await db('knex_migrations').orderBy('id', 'desc').first('name');
    expect(manifest.database.latest_migration).toBe(latest.name);
    expect(manifest.app.version).toBe(JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8')).version);

    // Every object of the bucket, its bytes in objects/<key>.
    expect(manifest.objects.items.map((o: { key: string }) => o.key)).toEqual(await bucketKeys(SOURCE_BUCKET));
    const ours = manifest.objects.items.find((o: { key: string }) => o.key === objectKey);
    expect(ours).toEqual({ key: objectKey, size: PNG_1X1.length, sha256: sha256(PNG_1X1), content_type: 'image/png' });
    expect(fs.readFileSync(path.join(backupDir, 'objects', ...objectKey.split('/'))).equals(PNG_1X1)).toBe(true);
  });

  it('restores into another database and bucket with every row and every byte equal', async () => {
    const restore = await run('restore.mjs', ['--instance', 'test', '--from', backupDir, '--database', RESTORE_DB, '--bucket', RESTORE_BUCKET]);
    expect(restore.output).toContain('and verified');
    expect(restore.code).toBe(0);

    const tables = await tableNames(SOURCE_DB);
    expect(await tableNames(RESTORE_DB)).toEqual(tables);
    expect(await checksums(RESTORE_DB, tables)).toEqual(await checksums(SOURCE_DB, tables));
    for (const table of tables) {
      expect({ table, schema: await createStatement(RESTORE_DB, table) }).toEqual({ table, schema: await createStatement(SOURCE_DB, table) });
    }
    const row = await db(`${RESTORE_DB}.attachments`).where({ id: attachmentId }).first('object_key', 'caption');
    expect(row).toEqual({ object_key: objectKey, caption: CAPTION });

    const keys = await bucketKeys(SOURCE_BUCKET);
    expect(await bucketKeys(RESTORE_BUCKET)).toEqual(keys);
    for (const key of keys) {
      expect({ key, same: (await objectBytes(RESTORE_BUCKET, key)).equals(await objectBytes(SOURCE_BUCKET, key)) }).toEqual({ key, same: true });
    }
    const restoredType = await s3.send(new GetObjectCommand({ Bucket: RESTORE_BUCKET, Key: objectKey }));
    expect(restoredType.ContentType).toBe('image/png');
    await restoredType.Body?.transformToByteArray();
  }, SCRIPT_TIMEOUT_MS);

  describe('refusals leave the target as it was', () => {
    const MARKER_KEY = 'restore-check/marker';

    /** Something a restore would remove: a table the backup does not have and an extra object. */
    async function markTarget(): Promise<void> {
      await db.raw(`CREATE TABLE IF NOT EXISTS \`${RESTORE_DB}\`.restore_marker (id INT PRIMARY KEY)`);
      await s3.send(new PutObjectCommand({ Bucket: RESTORE_BUCKET, Key: MARKER_KEY, Body: 'marker', ContentType: 'text/plain' }));
    }

    async function targetStillMarked(): Promise<boolean> {
      const table = (await tableNames(RESTORE_DB)).includes('restore_marker');
      const object = (await bucketKeys(RESTORE_BUCKET)).includes(MARKER_KEY);
      return table && object;
    }

    beforeAll(markTarget);

    it('refuses a non-empty target without --yes', async () => {
      const restore = await run('restore.mjs', ['--instance', 'test', '--from', backupDir, '--database', RESTORE_DB, '--bucket', RESTORE_BUCKET]);
      expect(restore.code).toBe(1);
      expect(restore.output).toContain('refusing to replace data without --yes');
      expect(await targetStillMarked()).toBe(true);
    }, SCRIPT_TIMEOUT_MS);

    it('refuses a backup whose dump has one byte changed, before touching anything, even with --yes', async () => {
      const tampered = path.join(tmp, 'tampered');
      fs.cpSync(backupDir, tampered, { recursive: true });
      const file = path.join(tampered, 'database.sql');
      const bytes = fs.readFileSync(file);
      const at = Math.floor(bytes.length / 2);
      bytes[at] ^= 0x01;
      fs.writeFileSync(file, bytes);

      const restore = await run('restore.mjs', ['--instance', 'test', '--from', tampered, '--database', RESTORE_DB, '--bucket', RESTORE_BUCKET, '--yes']);
      expect(restore.code).toBe(1);
      expect(restore.output).toMatch(/refusing a damaged or incomplete backup[\s\S]*database\.sql: SHA-256/);
      expect(await targetStillMarked()).toBe(true);
    }, SCRIPT_TIMEOUT_MS);

    it('refuses a backup with an object that differs from its manifest entry', async () => {
      const tampered = path.join(tmp, 'tampered-object');
      fs.cpSync(backupDir, tampered, { recursive: true });
      fs.appendFileSync(path.join(tampered, 'objects', ...objectKey.split('/')), Buffer.from([0]));

      const restore = await run('restore.mjs', ['--instance', 'test', '--from', tampered, '--database', RESTORE_DB, '--bucket', RESTORE_BUCKET, '--yes']);
      expect(restore.code).toBe(1);
      expect(restore.output).toContain(`objects/${objectKey}: SHA-256`);
      expect(await targetStillMarked()).toBe(true);
    }, SCRIPT_TIMEOUT_MS);

    it('refuses a manifest naming an object key that would climb out of the folder', async () => {
      const tampered = path.join(tmp, 'tampered-key');
      fs.cpSync(backupDir, tampered, { recursive: true });
      const manifestFile = path.join(tampered, 'manifest.json');
      const manifest = JSON.parse(fs.readFileSync(manifestFile, 'utf8'));
      manifest.objects.items.push({ key: '../../escape', size: 1, sha256: sha256(Buffer.from('x')), content_type: 'text/plain' });
      fs.writeFileSync(manifestFile, JSON.stringify(manifest));

      const restore = await run('restore.mjs', ['--instance', 'test', '--from', tampered, '--database', RESTORE_DB, '--bucket', RESTORE_BUCKET, '--yes']);
      expect(restore.code).toBe(1);
      expect(restore.output).toContain('"../../escape" cannot be stored as a file safely');
      expect(await targetStillMarked()).toBe(true);
    }, SCRIPT_TIMEOUT_MS);

    it('with --yes replaces the target, removing what the backup does not hold', async () => {
      const restore = await run('restore.mjs', ['--instance', 'test', '--from', backupDir, '--database', RESTORE_DB, '--bucket', RESTORE_BUCKET, '--yes']);
      expect(restore.output).toContain('and verified');
      expect(restore.code).toBe(0);
      expect(await tableNames(RESTORE_DB)).toEqual(await tableNames(SOURCE_DB));
      expect(await bucketKeys(RESTORE_BUCKET)).toEqual(await bucketKeys(SOURCE_BUCKET));
    }, SCRIPT_TIMEOUT_MS);
  });
});
