#!/usr/bin/env node
// `npm run restore`: bring a folder written by `npm run backup` back into an instance, database and
// bucket both, so that the app sees exactly the state that was backed up.
//
//   npm run restore -- --from backups/couplet-20261202T101500Z          into instance dev
//   npm run restore -- --from DIR --yes                                  replace data that is there
//   npm run restore -- --from DIR --instance test --database couplet_check --bucket couplet-check
//
// DATABASE_URL and S3_ENDPOINT (with the other S3_* variables) point it at a real server and bucket,
// as for `npm start`; otherwise the instance's own MariaDB and S3 stand-in are used (those of a running
// `npm start`, or started for the restore and stopped afterwards; a fresh instance is created).
//
// In this order:
//   1. check the folder: manifest.json, and database.sql and every object file against the SHA-256
//      and size the manifest gives. A damaged or edited backup is refused before anything is touched.
//   2. refuse, unless --yes, when the target database has tables or the target bucket has objects.
//   3. drop and create the database, load database.sql with the `mariadb` client.
//   4. create the bucket when missing, empty it, upload every object with its content type.
//   5. check the result against the manifest: rows per table, latest migration, every object's key,
//      size and SHA-256 (read back from the store). Any difference is reported and the exit code is 1.
// A failure after step 2 says what was done and how to finish (run it again with --yes: it starts over).
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { StepError, bold, fail, info, ok, reportError, rel, setPrefix, step, warn } from './lib/log.mjs';
import { isShuttingDown, onCleanup, runCleanups } from './lib/processes.mjs';
import { ensureDatabase, rootSql } from './lib/mariadb.mjs';
import {
  BUCKET_NAME,
  DATABASE_NAME,
  DUMP_FILE,
  INSTANCES,
  MANIFEST_FILE,
  MANIFEST_FORMAT,
  OBJECTS_DIR,
  OBJECT_CONCURRENCY,
  ROOT,
  bucketExists,
  clientLogin,
  connect,
  describeS3Error,
  downloadObject,
  fileSha256,
  formatBytes,
  listObjects,
  mapLimit,
  mariadbTool,
  objectPath,
  openServices,
  parseOptions,
  resolveUserPath,
  runClientWithInput,
  s3Client,
  usageError,
} from './lib/backup-common.mjs';

const USAGE = `usage: npm run restore -- --from DIR [--instance dev|test] [--yes] [--database NAME] [--bucket NAME]
  --from DIR        a folder written by \`npm run backup\` (required)
  --instance NAME   whose database and bucket to restore into (default dev); DATABASE_URL / S3_* override them
  --yes             replace what the target database and bucket hold (refused without it when not empty)
  --database NAME   restore into this database on the same server instead (created when missing)
  --bucket NAME     restore into this bucket of the same store instead (created when missing)`;

setPrefix('[couplet restore]');
const opts = parseOptions(
  {
    from: { type: 'string' },
    instance: { type: 'string', default: 'dev' },
    yes: { type: 'boolean', default: false },
    database: { type: 'string' },
    bucket: { type: 'string' },
  },
  USAGE,
);
if (!opts.from) usageError('--from is required: the backup folder to restore', USAGE);
if (!INSTANCES.includes(opts.instance)) usageError(`--instance must be one of ${INSTANCES.join(', ')} (got "${opts.instance}")`, USAGE);
if (opts.database !== undefined && !DATABASE_NAME.test(opts.database)) usageError(`--database: "${opts.database}" is not a plain name (letters, digits, _; at most 64)`, USAGE);
if (opts.bucket !== undefined && !BUCKET_NAME.test(opts.bucket)) usageError(`--bucket: "${opts.bucket}" is not a valid bucket name (a-z, 0-9, . and -; 3 to 63 characters)`, USAGE);
const fromDir = resolveUserPath(opts.from);

// ---------------------------------------------------------------------------------------------
// 1. the backup folder

/** Every file under `dir`, as paths relative to it with / separators. */
function filesUnder(dir, prefix = '') {
  const out = [];
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const relPath = prefix ? `${prefix}/${entry.name}` : entry.name;
    if (entry.isDirectory()) out.push(...filesUnder(path.join(dir, entry.name), relPath));
    else out.push(relPath);
  }
  return out;
}

/** The manifest, once the folder matches it exactly; otherwise a StepError listing what is wrong. */
async function verifyBackup(dir) {
  step(`checking the backup ${rel(ROOT, dir)} against its manifest…`);
  const refuse = (problems) =>
    new StepError('check the backup', `refusing a damaged or incomplete backup (nothing was changed):\n  ${problems.slice(0, 12).join('\n  ')}${problems.length > 12 ? `\n  … and ${problems.length - 12} more` : ''}`, {
      hint: 'restore from another backup, or write a new one with `npm run backup`',
    });
  if (!fs.existsSync(dir) || !fs.statSync(dir).isDirectory()) throw refuse([`${dir} is not a folder`]);
  let manifest;
  try {
    manifest = JSON.parse(fs.readFileSync(path.join(dir, MANIFEST_FILE), 'utf8'));
  } catch (error) {
    throw refuse([`${MANIFEST_FILE}: ${error.code === 'ENOENT' ? 'missing' : `unreadable (${error.message})`}`]);
  }
  if (manifest?.format !== MANIFEST_FORMAT) throw refuse([`${MANIFEST_FILE}: format ${JSON.stringify(manifest?.format)}, expected ${MANIFEST_FORMAT}`]);
  const problems = [];
  const dump = manifest.database?.dump;
  const tables = manifest.database?.tables;
  const items = manifest.objects?.items;
  if (dump?.file !== DUMP_FILE || typeof dump.sha256 !== 'string') problems.push(`${MANIFEST_FILE}: database.dump is incomplete`);
  if (!tables || typeof tables !== 'object' || !Object.values(tables).every((n) => Number.isInteger(n) && n >= 0)) problems.push(`${MANIFEST_FILE}: database.tables is incomplete`);
  if (!Array.isArray(items)) problems.push(`${MANIFEST_FILE}: objects.items is missing`);
  if (problems.length) throw refuse(problems);

  const dumpPath = path.join(dir, DUMP_FILE);
  if (!fs.existsSync(dumpPath)) problems.push(`${DUMP_FILE}: missing`);
  else {
    const got = await fileSha256(dumpPath);
    if (got.sha256 !== dump.sha256 || got.size !== dump.bytes) {
      problems.push(`${DUMP_FILE}: SHA-256 ${got.sha256} (${got.size} bytes) differs from the manifest's ${dump.sha256} (${dump.bytes} bytes)`);
    }
  }

  const objectsDir = path.join(dir, OBJECTS_DIR);
  const expected = new Set();
  await mapLimit(items, OBJECT_CONCURRENCY, async (item) => {
    let file;
    try {
      file = objectPath(objectsDir, item?.key);
    } catch (error) {
      problems.push(`objects: ${error.message}`);
      return;
    }
    expected.add(item.key);
    if (typeof item.sha256 !== 'string' || !Number.isInteger(item.size) || typeof item.content_type !== 'string') {
      problems.push(`${MANIFEST_FILE}: the entry of ${item.key} is incomplete`);
      return;
    }
    if (!fs.existsSync(file) || !fs.statSync(file).isFile()) return problems.push(`${OBJECTS_DIR}/${item.key}: missing`);
    const got = await fileSha256(file);
    if (got.sha256 !== item.sha256 || got.size !== item.size) {
      problems.push(`${OBJECTS_DIR}/${item.key}: SHA-256 ${got.sha256} (${got.size} bytes) differs from the manifest's ${item.sha256} (${item.size} bytes)`);
    }
  });
  if (fs.existsSync(objectsDir)) {
    for (const f of filesUnder(objectsDir)) if (!expected.has(f)) problems.push(`${OBJECTS_DIR}/${f}: not in the manifest`);
  }
  if (problems.length) throw refuse(problems.sort());
  ok(`backup intact: ${DUMP_FILE} and ${items.length} objects match ${MANIFEST_FILE} (made ${manifest.created_at})`);

  // A backup taken by newer code holds a schema this checkout does not know: say so, do not refuse.
  const latest = manifest.database.latest_migration;
  const migrationsDir = path.join(ROOT, 'database', 'migrations');
  if (latest && fs.existsSync(migrationsDir) && !fs.readdirSync(migrationsDir).includes(latest)) {
    warn(`the backup's latest migration ${latest} is not in database/migrations: it was made by a newer Couplet than this checkout`);
  }
  return manifest;
}

// ---------------------------------------------------------------------------------------------
// 2.-5. the target

const progress = { touched: false, finished: false, done: [] };
let target = null; // { database, bucket } once known, for the messages below

function rerunCommand() {
  const args = process.argv.slice(2);
  return `npm run restore -- ${[...args, ...(opts.yes ? [] : ['--yes'])].join(' ')}`;
}

/** After a failure or an interruption: what was done, what state the target is in, what to do. */
function explainPartialRestore() {
  if (!progress.touched || progress.finished) return;
  fail(`the restore stopped part-way; done: ${progress.done.length ? progress.done.join('; ') : 'nothing completed'}`);
  fail(`database ${target.database} and bucket ${target.bucket} may now hold part of the backup: do not use them as they are`);
  info(`once the cause above is dealt with, run the restore again; it starts over (drops the database, empties the bucket):\n  ${rerunCommand()}`);
  progress.finished = true; // said once
}

async function tableCount(inst, db, database) {
  if (db.own) {
    return Number((await rootSql(inst, `SELECT COUNT(*) FROM information_schema.tables WHERE table_schema = '${database}';`)).trim());
  }
  const conn = await connect(db, null);
  try {
    const [[{ n }]] = await conn.query('SELECT COUNT(*) AS n FROM information_schema.tables WHERE table_schema = ?', [database]);
    return Number(n);
  } finally {
    await conn.end();
  }
}

async function recreateDatabase(inst, db, database) {
  step(`recreating database ${database} (${db.label})…`);
  if (db.own) {
    await ensureDatabase({ ...inst, dbName: database }, { password: db.password, recreate: true });
    return;
  }
  const conn = await connect(db, null);
  try {
    await conn.query(`DROP DATABASE IF EXISTS \`${database}\``);
    await conn.query(`CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  } catch (error) {
    throw new StepError('recreate the database', `${db.user} cannot drop and create ${database}: ${error.message}`, {
      hint: 'the account of DATABASE_URL needs ALL PRIVILEGES on that database',
    });
  } finally {
    await conn.end();
  }
}

async function loadDump(inst, db, database) {
  step(`loading ${DUMP_FILE} into ${database} (mariadb client)…`);
  const login = clientLogin(db);
  await runClientWithInput({
    title: `load ${DUMP_FILE}`,
    cmd: mariadbTool('mariadb'),
    args: [...login.args, '--batch', database],
    env: login.env,
    stdinFile: path.join(fromDir, DUMP_FILE),
    logFile: path.join(inst.logsDir, 'restore-load.log'),
    root: ROOT,
  });
}

async function restoreObjects(store, s3, bucket, items) {
  const { sdk, client } = store;
  step(`restoring ${items.length} objects into bucket ${bucket} (${s3.endpoint})…`);
  if (!(await bucketExists(store, bucket))) {
    const location = s3.region && s3.region !== 'us-east-1' ? { CreateBucketConfiguration: { LocationConstraint: s3.region } } : {};
    await client.send(new sdk.CreateBucketCommand({ Bucket: bucket, ...location }));
    info(`created bucket ${bucket}`);
  }
  const old = await listObjects(store, bucket);
  await mapLimit(old, OBJECT_CONCURRENCY, (o) => client.send(new sdk.DeleteObjectCommand({ Bucket: bucket, Key: o.key })));
  if (old.length) progress.done.push(`emptied bucket ${bucket} (${old.length} objects removed)`);
  const objectsDir = path.join(fromDir, OBJECTS_DIR);
  let uploaded = 0;
  await mapLimit(items, OBJECT_CONCURRENCY, async (item) => {
    const bytes = fs.readFileSync(objectPath(objectsDir, item.key));
    const md5 = crypto.createHash('md5').update(bytes).digest('base64');
    await client.send(
      new sdk.PutObjectCommand({ Bucket: bucket, Key: item.key, Body: bytes, ContentType: item.content_type, ContentLength: bytes.length, ContentMD5: md5 }),
    );
    uploaded++;
  });
  progress.done.push(`uploaded ${uploaded} objects`);
}

/** Differences between the restored target and the manifest (empty when it matches). */
async function checkTarget(db, database, store, bucket, manifest) {
  step('checking the restored data against the manifest…');
  const differences = [];
  const conn = await connect(db, database);
  try {
    const [rows] = await conn.query("SELECT table_name AS name FROM information_schema.tables WHERE table_schema = ? AND table_type = 'BASE TABLE'", [database]);
    const restored = new Set(rows.map((r) => r.name));
    for (const [table, expected] of Object.entries(manifest.database.tables)) {
      if (!restored.has(table)) {
        differences.push(`table ${table}: missing`);
        continue;
      }
      const [[{ n }]] = await conn.query('SELECT COUNT(*) AS n FROM ??', [table]);
      if (Number(n) !== expected) differences.push(`table ${table}: ${n} rows, the backup has ${expected}`);
    }
    for (const table of restored) if (!(table in manifest.database.tables)) differences.push(`table ${table}: not in the backup`);
    if (manifest.database.latest_migration) {
      const [[last]] = await conn.query('SELECT name FROM knex_migrations ORDER BY id DESC LIMIT 1');
      if (last?.name !== manifest.database.latest_migration) differences.push(`latest migration ${last?.name}, the backup has ${manifest.database.latest_migration}`);
    }
  } finally {
    await conn.end();
  }

  const listed = await listObjects(store, bucket);
  const byKey = new Map(manifest.objects.items.map((i) => [i.key, i]));
  for (const o of listed) if (!byKey.has(o.key)) differences.push(`object ${o.key}: not in the backup`);
  const present = new Set(listed.map((o) => o.key));
  const toCheck = manifest.objects.items.filter((i) => {
    if (!present.has(i.key)) differences.push(`object ${i.key}: missing`);
    return present.has(i.key);
  });
  // Read back from the store: proves the bytes arrived, not just that the upload was accepted.
  await mapLimit(toCheck, OBJECT_CONCURRENCY, async (item) => {
    const got = await downloadObject(store, bucket, item.key, null);
    if (got.sha256 !== item.sha256 || got.size !== item.size) differences.push(`object ${item.key}: SHA-256 ${got.sha256} (${got.size} bytes), the backup has ${item.sha256} (${item.size} bytes)`);
  });
  return differences.sort();
}

async function main() {
  const manifest = await verifyBackup(fromDir);
  const { inst, db, s3, runningPid } = await openServices(opts.instance, { title: 'restore' });
  target = { database: opts.database ?? db.database, bucket: opts.bucket ?? s3.bucket };
  onCleanup('restore report', explainPartialRestore); // an interrupted restore says where it stopped

  const store = await s3Client(s3);
  let tables;
  let objects;
  try {
    tables = await tableCount(inst, db, target.database);
    objects = (await bucketExists(store, target.bucket)) ? (await listObjects(store, target.bucket)).length : 0;
  } catch (error) {
    if (error instanceof StepError) throw error;
    throw new StepError('look at the target', error.$metadata ? describeS3Error(error, s3) : error.message);
  }
  if ((tables || objects) && !opts.yes) {
    throw new StepError('restore', `refusing to replace data without --yes: database ${target.database} has ${tables} tables, bucket ${target.bucket} has ${objects} objects (nothing was changed)`, {
      hint: `everything in them is replaced by the backup; if that is what you want:\n  ${rerunCommand()}`,
    });
  }
  if (runningPid && target.database === db.database) {
    warn(`the ${inst.name} instance is running (pid ${runningPid}): its app sees the data change under it; restart it afterwards`);
  }

  progress.touched = true;
  await recreateDatabase(inst, db, target.database);
  progress.done.push(`recreated database ${target.database} (empty)`);
  await loadDump(inst, db, target.database);
  progress.done.push(`loaded ${DUMP_FILE}`);
  try {
    await restoreObjects(store, s3, target.bucket, manifest.objects.items);
  } catch (error) {
    if (error instanceof StepError) throw error;
    throw new StepError('restore the objects', describeS3Error(error, s3));
  }

  const differences = await checkTarget(db, target.database, store, target.bucket, manifest);
  store.client.destroy();
  progress.finished = true;
  const rows = Object.values(manifest.database.tables).reduce((a, b) => a + b, 0);
  console.log('');
  if (differences.length) {
    fail(bold(`restored, but the result differs from the manifest in ${differences.length} ${differences.length === 1 ? 'place' : 'places'}:`));
    for (const d of differences.slice(0, 20)) console.log(`  ${d}`);
    if (differences.length > 20) console.log(`  … and ${differences.length - 20} more`);
    info('do not use the target as it is. Either manifest.json was edited after the backup (it is the one file without a hash),');
    info(`or something changed the target during the restore, or the server altered the data on load (see ${rel(ROOT, path.join(inst.logsDir, 'restore-load.log'))}).`);
    info(`to try again: ${rerunCommand()}`);
    return 1;
  }
  ok(bold(`restored ${rel(ROOT, fromDir)} (made ${manifest.created_at}) and verified`));
  const line = (k, v) => console.log(`  ${k.padEnd(10)} ${v}`);
  line('database', `${target.database} (${db.label}): ${Object.keys(manifest.database.tables).length} tables, ${rows} rows as in the backup; migration ${manifest.database.latest_migration ?? '(none)'}`);
  line('objects', `bucket ${target.bucket}: ${manifest.objects.items.length} objects, ${formatBytes(manifest.objects.bytes ?? 0)}, every SHA-256 read back and matching`);
  return 0;
}

let code;
try {
  code = await main();
} catch (error) {
  if (isShuttingDown()) await new Promise(() => {}); // a signal handler is stopping everything and exits
  reportError(error, ROOT);
  explainPartialRestore();
  code = error.exitCode || 1;
}
await runCleanups();
process.exit(code);
