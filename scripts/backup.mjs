#!/usr/bin/env node
// `npm run backup`: a consistent copy of Couplet's data, the MariaDB database and every object of
// the S3 bucket, in one folder that `npm run restore` brings back.
//
//   npm run backup                                   instance dev, into backups/couplet-<UTC time>/
//   npm run backup -- --out /srv/backups/monday      another folder (must not exist or be empty)
//   npm run backup -- --instance test                the test instance's database and bucket
//
// DATABASE_URL and S3_ENDPOINT (with the other S3_* variables) point it at a real server and bucket,
// as for `npm start`. Otherwise the instance's own MariaDB and S3 stand-in are used: those of a
// running `npm start` / `npm test`, or started for the backup and stopped again afterwards.
//
// The folder:
//   database.sql    mariadb-dump --single-transaction of the database (one snapshot of all tables)
//   objects/<key>   every object of the bucket, byte for byte
//   manifest.json   when, which app version and migration, rows per table, every object's key,
//                   size, content type and SHA-256, and the SHA-256 of database.sql
//
// Why the objects are listed after the dump, never before: rows name objects (attachments.object_key),
// and the app stores an object before it commits the row that names it (src/lib/data/attachments.ts:
// putObject, then the insert; the object is removed again only when that insert fails), and never
// removes an object whose row exists. mariadb-dump --single-transaction reads every table from the one
// snapshot it takes when it starts. Listing the bucket once the dump has finished, so after that
// snapshot, therefore finds the object of every row in the dump: the row was committed before the
// snapshot, its object stored before the row. The listing may hold a few objects no row in the dump
// names (an upload that was in flight); they are kept, harmlessly. Listing first and dumping second
// could miss the object of a row committed in between. Keys hold a random UUID and an object is never
// rewritten, so an object does not change while it is copied.
import fs from 'node:fs';
import path from 'node:path';
import { StepError, bold, fail, ok, reportError, rel, setPrefix, step } from './lib/log.mjs';
import { isShuttingDown, onCleanup, runCleanups, runStep } from './lib/processes.mjs';
import { ensureDatabase, rootSql } from './lib/mariadb.mjs';
import {
  DATABASE_NAME,
  DUMP_FILE,
  INSTANCES,
  MANIFEST_FILE,
  MANIFEST_FORMAT,
  OBJECTS_DIR,
  OBJECT_CONCURRENCY,
  ROOT,
  clientLogin,
  connect,
  countDumpRows,
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
  s3Client,
  usageError,
} from './lib/backup-common.mjs';

const USAGE = `usage: npm run backup -- [--instance dev|test] [--out DIR]
  --instance NAME   whose database and bucket (default dev); DATABASE_URL / S3_* override them
  --out DIR         the new backup folder (default backups/couplet-<UTC time> in the project);
                    it must not exist yet, or be empty`;

setPrefix('[couplet backup]');
const opts = parseOptions({ instance: { type: 'string', default: 'dev' }, out: { type: 'string' } }, USAGE);
if (!INSTANCES.includes(opts.instance)) usageError(`--instance must be one of ${INSTANCES.join(', ')} (got "${opts.instance}")`, USAGE);

const startedAt = new Date();
const stamp = startedAt.toISOString().replace(/[-:]/g, '').replace(/\.\d+Z$/, 'Z');
const outDir = opts.out
  ? resolveUserPath(opts.out)
  : path.join(ROOT, 'backups', `couplet-${opts.instance === 'dev' ? '' : `${opts.instance}-`}${stamp}`);
if (fs.existsSync(outDir) && (!fs.statSync(outDir).isDirectory() || fs.readdirSync(outDir).length)) {
  usageError(`--out: ${outDir} already exists and is not an empty folder; a backup never overwrites another`, USAGE);
}
// Everything is written next to the target and renamed into place at the end, so a folder with the
// target's name is always a complete backup.
const workDir = `${outDir}.partial-${process.pid}`;

async function dumpDatabase(inst, db) {
  const file = path.join(workDir, DUMP_FILE);
  const login = clientLogin(db);
  step(`dumping database ${db.database} (${db.label}) with mariadb-dump --single-transaction…`);
  const logFile = path.join(inst.logsDir, 'backup-dump.log');
  await runStep({
    title: 'mariadb-dump',
    cmd: mariadbTool('mariadb-dump'),
    args: [
      ...login.args,
      '--single-transaction',
      '--routines',
      '--triggers',
      '--hex-blob',
      // the app account has no PROCESS privilege, which dumping tablespaces needs (InnoDB needs none here)
      '--no-tablespaces',
      `--result-file=${file}`,
      db.database,
    ],
    env: login.env,
    logFile,
    live: false,
    hint: `see ${rel(ROOT, logFile)}`,
  });
  const { sha256, size } = await fileSha256(file);
  const tables = await countDumpRows(file);
  if (!Object.keys(tables).length) {
    throw new StepError('mariadb-dump', `the dump of ${db.database} holds no tables`, { hint: 'is this the right database? `npm start` creates and seeds it' });
  }
  return { file: DUMP_FILE, bytes: size, sha256, tables };
}

/**
 * Facts from the live database that the dump's text does not give directly. Migrations run only when
 * `npm start` starts, before the app serves anything, so the live latest migration is the dumped one.
 */
async function databaseFacts(db) {
  const conn = await connect(db);
  try {
    const [[{ version }]] = await conn.query('SELECT VERSION() AS version');
    let latestMigration = null;
    try {
      const [rows] = await conn.query('SELECT name FROM knex_migrations ORDER BY id DESC LIMIT 1');
      latestMigration = rows[0]?.name ?? null;
    } catch (error) {
      if (error.code !== 'ER_NO_SUCH_TABLE') throw error;
    }
    return { version, latestMigration };
  } finally {
    await conn.end();
  }
}

async function copyObjects(s3) {
  const store = await s3Client(s3);
  step(`copying the objects of bucket ${s3.bucket} (${s3.endpoint})…`);
  const objectsDir = path.join(workDir, OBJECTS_DIR);
  fs.mkdirSync(objectsDir, { recursive: true });
  let listed;
  try {
    listed = await listObjects(store, s3.bucket);
  } catch (error) {
    throw new StepError('list the bucket', describeS3Error(error, s3), { hint: 'check S3_ENDPOINT, S3_BUCKET and the credentials' });
  }
  const files = listed.map((o) => objectPath(objectsDir, o.key)); // refuses every unsafe key before the first download
  const items = await mapLimit(listed, OBJECT_CONCURRENCY, async (o, i) => {
    let got;
    try {
      got = await downloadObject(store, s3.bucket, o.key, files[i]);
    } catch (error) {
      throw new StepError('download an object', `${o.key}: ${describeS3Error(error, s3)}`);
    }
    if (got.size !== o.size) throw new StepError('download an object', `${o.key}: listed with ${o.size} bytes, downloaded ${got.size}`);
    return { key: o.key, size: got.size, sha256: got.sha256, content_type: got.contentType };
  });
  store.client.destroy();
  return { bucket: s3.bucket, count: items.length, bytes: items.reduce((sum, o) => sum + o.size, 0), items };
}

async function main() {
  const { inst, db, s3, runningPid } = await openServices(opts.instance, { title: 'backup' });
  if (db.own) {
    if (!DATABASE_NAME.test(db.database)) throw new Error(`unexpected database name ${db.database}`);
    const exists = await rootSql(inst, `SELECT COUNT(*) FROM information_schema.schemata WHERE schema_name = '${db.database}';`);
    if (Number(exists.trim()) === 0) {
      throw new StepError('backup', `the ${inst.name} instance has no database ${db.database}: nothing to back up`, {
        hint: inst.name === 'dev' ? '`npm start` creates and seeds it' : '`npm test` creates it while it runs',
      });
    }
    // Started here: the password file may have been regenerated while the datadir survived, so
    // realign the account as `npm start` does. A running instance has done that already.
    if (!runningPid) await ensureDatabase(inst, { password: db.password, recreate: false });
  }

  onCleanup('unfinished backup folder', () => fs.rmSync(workDir, { recursive: true, force: true }));
  // It holds every account's password hash and all study data: readable by its owner only.
  fs.mkdirSync(workDir, { recursive: true, mode: 0o700 });
  const dump = await dumpDatabase(inst, db);
  const facts = await databaseFacts(db);
  // Only now, after the dump's snapshot: see the header comment.
  const objects = await copyObjects(s3);

  const pkg = JSON.parse(fs.readFileSync(path.join(ROOT, 'package.json'), 'utf8'));
  const manifest = {
    format: MANIFEST_FORMAT,
    created_at: startedAt.toISOString(),
    instance: process.env.DATABASE_URL ? null : inst.name,
    app: { name: pkg.name, version: pkg.version },
    database: {
      name: db.database,
      server_version: facts.version,
      latest_migration: facts.latestMigration,
      dump: { file: dump.file, bytes: dump.bytes, sha256: dump.sha256 },
      // counted in database.sql itself, so they describe the dumped snapshot exactly
      tables: dump.tables,
    },
    objects,
  };
  fs.writeFileSync(path.join(workDir, MANIFEST_FILE), `${JSON.stringify(manifest, null, 2)}\n`);
  if (fs.existsSync(outDir)) fs.rmdirSync(outDir); // checked empty above
  fs.renameSync(workDir, outDir);

  const rows = Object.values(dump.tables).reduce((a, b) => a + b, 0);
  console.log('');
  ok(bold(`backup written to ${rel(ROOT, outDir)}`));
  const line = (k, v) => console.log(`  ${k.padEnd(10)} ${v}`);
  line('database', `${db.database}: ${Object.keys(dump.tables).length} tables, ${rows} rows, ${DUMP_FILE} ${formatBytes(dump.bytes)}; migration ${facts.latestMigration ?? '(none)'}`);
  line('objects', `bucket ${s3.bucket}: ${objects.count} objects, ${formatBytes(objects.bytes)}`);
  line('app', `${pkg.name} ${pkg.version}`);
  line('restore', `npm run restore -- --from ${rel(ROOT, outDir)}${opts.instance === 'dev' ? '' : ` --instance ${opts.instance}`}`);
}

let code = 0;
try {
  await main();
} catch (error) {
  if (isShuttingDown()) await new Promise(() => {}); // a signal handler is stopping everything and exits
  reportError(error, ROOT);
  fail('no backup was written');
  code = error.exitCode || 1;
}
await runCleanups(); // also removes the unfinished folder after a failure
process.exit(code);
