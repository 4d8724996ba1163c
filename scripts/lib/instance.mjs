// The isolated instances (dev for `npm start`, test for `npm test`, bench and load for the benchmarks): their ports, directories,
// secrets, the lock that keeps two runs of the same instance apart, recovery after a killed run,
// and the environment every child process gets.
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { info, warn } from './log.mjs';
import {
  findProcessesWithEnv,
  isAlive,
  processCmdline,
  readPidFile,
  removeFile,
  stopTree,
} from './processes.mjs';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

// Ports differ per instance so `npm start` and `npm test` can run side by side; none is 3306 so a
// system MariaDB/MySQL never collides with ours.
const SETTINGS = {
  dev: { dbPort: 3407, dbName: 'couplet', smtpPort: 1025, inboxPort: 1080, s3Port: 4569, appPort: 3000, distDir: '.next' },
  test: { dbPort: 3408, dbName: 'couplet_test', smtpPort: 1026, inboxPort: 1081, s3Port: 4570, appPort: 3100, distDir: '.next-test' },
  // scripts/bench-import.mjs: only its MariaDB runs; the other ports are reserved, never opened
  bench: { dbPort: 3490, dbName: 'couplet_bench', smtpPort: 1027, inboxPort: 1082, s3Port: 4571, appPort: 3190, distDir: '.next-bench' },
  // scripts/load.mjs: the whole service set and a production build of its own
  load: { dbPort: 3491, dbName: 'couplet_load', smtpPort: 1028, inboxPort: 1083, s3Port: 4572, appPort: 3191, distDir: '.next-load' },
  // e2e/faults.spec.ts: its own MariaDB, S3 stand-in and a second `next start` of the test build
  // (it never builds), so the spec can kill them without touching the services of `npm test`; the
  // SMTP and inbox ports are reserved, never opened
  faults: { dbPort: 3492, dbName: 'couplet_faults', smtpPort: 1029, inboxPort: 1084, s3Port: 4573, appPort: 3192, distDir: '.next-test' },
};

/** The stand-in's bucket and s3rver's fixed credentials (it accepts no others). */
export const S3_STAND_IN = { bucket: 'couplet', region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' };

export const MARKER = 'COUPLET_INSTANCE_DIR';

/**
 * COUPLET_PORT_OFFSET shifts every port of an instance, so several checkouts (parallel work trees,
 * CI jobs on one host) can each run their own `npm test` at the same time.
 */
function portOffset() {
  const raw = process.env.COUPLET_PORT_OFFSET ?? '0';
  const offset = Number(raw);
  if (!Number.isInteger(offset) || offset < 0 || offset > 20000) {
    throw new Error(`COUPLET_PORT_OFFSET must be a whole number from 0 to 20000 (got "${raw}")`);
  }
  return offset;
}

export function getInstance(name) {
  const base = SETTINGS[name];
  if (!base) throw new Error(`unknown instance ${name}`);
  const offset = portOffset();
  const s = {
    ...base,
    dbPort: base.dbPort + offset,
    smtpPort: base.smtpPort + offset,
    inboxPort: base.inboxPort + offset,
    s3Port: base.s3Port + offset,
    appPort: base.appPort + offset,
  };
  const dir = path.join(ROOT, '.data', name);
  const mariadbDir = path.join(dir, 'mariadb');
  // A Unix socket path must fit in sun_path (108 bytes). In a deeply nested checkout fall back to
  // a per-checkout name in the temp dir.
  let socket = path.join(mariadbDir, 'mysqld.sock');
  if (Buffer.byteLength(socket) > 100) {
    const h = crypto.createHash('sha1').update(dir).digest('hex').slice(0, 12);
    socket = path.join(os.tmpdir(), `couplet-${name}-${h}.sock`);
  }
  return {
    name,
    ...s,
    root: ROOT,
    dir,
    logsDir: path.join(dir, 'logs'),
    runDir: path.join(dir, 'run'),
    mailDir: path.join(dir, 'mail'),
    s3Dir: path.join(dir, 's3'),
    mariadbDir,
    socket,
    mariadbPidFile: path.join(mariadbDir, 'mysqld.pid'),
    appUrl: `http://127.0.0.1:${s.appPort}`,
    inboxUrl: `http://127.0.0.1:${s.inboxPort}`,
    s3Url: `http://127.0.0.1:${s.s3Port}`,
  };
}

/** Create the instance directories. The instance dir is 0700: it holds secrets and the root socket. */
export function prepareDirs(inst) {
  for (const d of [inst.dir, inst.logsDir, inst.runDir, inst.mailDir]) fs.mkdirSync(d, { recursive: true });
  fs.chmodSync(inst.dir, 0o700);
}

/** A random secret generated once and kept in the instance dir (mode 600), so restarts keep it. */
export function readOrCreateSecret(file, bytes = 32) {
  try {
    const v = fs.readFileSync(file, 'utf8').trim();
    if (v) return v;
  } catch {}
  // base64url: safe inside a mysql:// URL and in SQL string literals without escaping.
  const value = crypto.randomBytes(bytes).toString('base64url');
  fs.writeFileSync(file, `${value}\n`, { mode: 0o600 });
  fs.chmodSync(file, 0o600);
  return value;
}

/**
 * Only one run per instance at a time. Returns null when we got the lock, or the pid of the live
 * run that holds it. A lock left by a killed run is stale (its pid is dead) and taken over.
 */
export function acquireLock(inst) {
  const file = path.join(inst.runDir, 'owner.pid');
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      fs.writeFileSync(file, `${process.pid}\n`, { flag: 'wx' });
      return null;
    } catch (e) {
      if (e.code !== 'EEXIST') throw e;
    }
    const pid = readPidFile(file);
    if (pid && pid !== process.pid && isAlive(pid) && /scripts\/(start|test|bench-import|load|backup|restore)\.mjs/.test(processCmdline(pid))) {
      return pid;
    }
    removeFile(file);
  }
  throw new Error(`could not take the lock ${file}`);
}

export function releaseLock(inst) {
  const file = path.join(inst.runDir, 'owner.pid');
  if (readPidFile(file) === process.pid) removeFile(file);
}

/**
 * After a killed run: remove pid files of dead processes and stop processes of ours that are still
 * running (found by pid file or by the environment marker). Call only while holding the lock, so
 * nothing found here can belong to a live run.
 */
export async function recoverLeftovers(inst) {
  const pidFiles = [inst.mariadbPidFile];
  try {
    for (const f of fs.readdirSync(inst.runDir)) if (f.endsWith('.pid') && f !== 'owner.pid') pidFiles.push(path.join(inst.runDir, f));
  } catch {}

  const orphans = new Set(findProcessesWithEnv(MARKER, inst.dir));
  for (const f of pidFiles) {
    const pid = readPidFile(f);
    if (!pid) continue;
    if (!isAlive(pid)) {
      info(`removed stale pid file ${path.relative(ROOT, f)} (process ${pid} is gone)`);
      removeFile(f);
    } else if (processCmdline(pid).includes(inst.dir)) {
      // e.g. a mariadbd on our datadir that was started by hand, without the marker
      orphans.add(pid);
    }
  }
  if (!orphans.size) return;
  const list = [...orphans].map((p) => `${p} (${processCmdline(p).slice(0, 60)})`);
  warn(`an earlier run was killed and left processes behind; stopping them: ${list.join(', ')}`);
  // SIGTERM lets mariadbd shut down cleanly; give it time to flush.
  await Promise.all([...orphans].map((pid) => stopTree(pid, { timeoutMs: 60000 })));
  for (const f of pidFiles) if (!isAlive(readPidFile(f))) removeFile(f);
}

/** process.env plus the marker that lets a later run find orphans of this instance. */
export function markerEnv(inst) {
  return { ...process.env, [MARKER]: inst.dir, COUPLET_INSTANCE: inst.name };
}

/**
 * The environment for every child (knex, Next, jest, playwright, the stand-ins).
 * `databaseUrl` is the DATABASE_URL; with `mailStandIn` / `s3StandIn` false the user's SMTP_* /
 * S3_* settings are passed on as they are.
 */
export function childEnv(inst, { databaseUrl, mailStandIn, s3StandIn, nextauthSecret }) {
  const env = { ...process.env };
  // Each child gets the NODE_ENV it needs (Next: production, jest sets "test" itself); a
  // NODE_ENV left in the developer's shell must not leak into the wrong tool.
  delete env.NODE_ENV;
  Object.assign(env, {
    [MARKER]: inst.dir,
    COUPLET_INSTANCE: inst.name,
    COUPLET_DIST_DIR: inst.distDir,
    DATABASE_URL: databaseUrl,
    NEXTAUTH_URL: inst.appUrl,
    APP_URL: inst.appUrl,
    NEXTAUTH_SECRET: nextauthSecret,
    MAIL_FROM: process.env.MAIL_FROM || 'Couplet <no-reply@couplet.test>',
    NEXT_TELEMETRY_DISABLED: '1',
  });
  if (mailStandIn) {
    Object.assign(env, {
      SMTP_HOST: '127.0.0.1',
      SMTP_PORT: String(inst.smtpPort),
      SMTP_SECURE: 'false',
      MAIL_INBOX_URL: inst.inboxUrl,
    });
  }
  if (s3StandIn) {
    Object.assign(env, {
      S3_ENDPOINT: inst.s3Url,
      S3_REGION: S3_STAND_IN.region,
      S3_BUCKET: S3_STAND_IN.bucket,
      S3_ACCESS_KEY_ID: S3_STAND_IN.accessKeyId,
      S3_SECRET_ACCESS_KEY: S3_STAND_IN.secretAccessKey,
      S3_FORCE_PATH_STYLE: 'true',
    });
    // Browsers reach the stand-in at its own address; a public URL of another store must not leak in.
    delete env.S3_PUBLIC_URL;
  }
  return env;
}
