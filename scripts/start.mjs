#!/usr/bin/env node
// `npm start`: bring up the whole application for development and demos, and keep it in the
// foreground until Ctrl-C, which stops everything this command started.
//
//   npm start              production build (rebuilt only when sources changed) + next start
//   npm run dev            the same services with `next dev` (hot reload) instead
//
// What runs (instance "dev", data in .data/dev/):
//   MariaDB  127.0.0.1:3407, database couplet   (skipped when DATABASE_URL is set)
//   mail     SMTP 127.0.0.1:1025, inbox http://127.0.0.1:1080   (skipped when SMTP_HOST is set)
//   S3       http://127.0.0.1:4569, bucket couplet   (skipped when S3_ENDPOINT is set)
//   app      http://127.0.0.1:3000
//
// Only Node's built-in modules are imported up front: this must run before `npm ci`.
import fs from 'node:fs';
import path from 'node:path';
import { bold, dim, fail, info, ok, reportError, setPrefix, rel, warn } from './lib/log.mjs';
import { acquireLock, childEnv, getInstance, markerEnv, prepareDirs, readOrCreateSecret, recoverLeftovers, releaseLock } from './lib/instance.mjs';
import { installSignalHandlers, isShuttingDown, onCleanup, shutdown } from './lib/processes.mjs';
import { ensureNodeModules } from './lib/deps.mjs';
import { ensureSystemPackages } from './lib/system-packages.mjs';
import { databaseUrl, ensureDatabase, startMariaDb } from './lib/mariadb.mjs';
import { migrate, seedIfFresh } from './lib/database.mjs';
import { startMail } from './lib/mail.mjs';
import { startS3 } from './lib/s3.mjs';
import { buildIfNeeded, startNext } from './lib/next-app.mjs';

const args = process.argv.slice(2);
const dev = args.includes('--dev');
if (args.includes('--help') || args.includes('-h')) {
  console.log('usage: npm start            (or: node scripts/start.mjs [--dev])\n  --dev   run `next dev` instead of build + `next start`');
  process.exit(0);
}
setPrefix('[couplet]');

const inst = getInstance('dev');
prepareDirs(inst);

const busy = acquireLock(inst);
if (busy) {
  ok(`Couplet is already running (pid ${busy}) at ${inst.appUrl}`);
  info('stop it with Ctrl-C in its terminal (or `kill ' + busy + '`) before starting it again');
  process.exit(0);
}
onCleanup('instance lock', () => releaseLock(inst)); // registered first, so released last
installSignalHandlers();

/** Print new lines of the app's log as they arrive (the server writes to the file, not to us). */
function follow(file, offset) {
  let pos = offset;
  setInterval(() => {
    let size;
    try {
      size = fs.statSync(file).size;
    } catch {
      return;
    }
    if (size < pos) pos = 0; // truncated
    if (size === pos) return;
    const fd = fs.openSync(file, 'r');
    const buf = Buffer.alloc(Math.min(size - pos, 1 << 20));
    const n = fs.readSync(fd, buf, 0, buf.length, pos);
    fs.closeSync(fd);
    pos += n;
    process.stdout.write(buf.subarray(0, n));
  }, 500);
}

/** A service dying while we run is fatal: say which, point at its log, stop the rest. */
function watch(child, name, logFile) {
  child.on('exit', (code, sig) => {
    if (isShuttingDown()) return;
    fail(`${name} stopped unexpectedly (${sig || `code ${code}`}); see ${rel(inst.root, logFile)}`);
    shutdown(1);
  });
}

async function main() {
  await recoverLeftovers(inst);
  await ensureNodeModules(inst.root, inst.logsDir, markerEnv(inst));

  const ownDb = !process.env.DATABASE_URL;
  const standIn = !process.env.SMTP_HOST;
  const s3StandIn = !process.env.S3_ENDPOINT;
  if (ownDb) await ensureSystemPackages(['mariadb-server'], { root: inst.root, logsDir: inst.logsDir });

  const nextauthSecret = process.env.NEXTAUTH_SECRET || readOrCreateSecret(path.join(inst.dir, 'nextauth-secret'), 32);
  let dbUrl = process.env.DATABASE_URL;
  let db = null;
  if (ownDb) {
    const password = readOrCreateSecret(path.join(inst.dir, 'db-password'), 18);
    db = await startMariaDb(inst);
    await ensureDatabase(inst, { password, recreate: false });
    dbUrl = databaseUrl(inst, password);
  } else {
    info('DATABASE_URL is set: using that database, not starting MariaDB');
  }
  const env = childEnv(inst, { databaseUrl: dbUrl, mailStandIn: standIn, s3StandIn, nextauthSecret });

  await migrate(inst, env);
  await seedIfFresh(inst, env, ownDb);

  let mail = null;
  if (standIn) mail = await startMail(inst, env);
  else info(`SMTP_HOST is set: mail goes to ${process.env.SMTP_HOST}, no stand-in started`);

  let s3 = null;
  if (s3StandIn) s3 = await startS3(inst, env);
  else info(`S3_ENDPOINT is set: files go to ${process.env.S3_ENDPOINT}, no stand-in started`);

  if (!dev) await buildIfNeeded(inst, env);
  const app = await startNext(inst, env, { dev });

  if (db) watch(db, 'MariaDB', path.join(inst.logsDir, 'mariadb-error.log'));
  if (mail) watch(mail, 'The mail stand-in', path.join(inst.logsDir, 'mail.log'));
  if (s3) watch(s3, 'The S3 stand-in', path.join(inst.logsDir, 's3.log'));
  watch(app.child, 'The app', app.logFile);

  const line = (k, v) => console.log(`  ${k.padEnd(15)} ${v}`);
  console.log('');
  console.log(bold(`Couplet is running${dev ? ' (next dev)' : ''}`));
  line('App:', bold(inst.appUrl));
  line('Demo accounts:', 'see README.md (section "Demo accounts")');
  line('Mail inbox:', standIn ? `${inst.inboxUrl}  (SMTP 127.0.0.1:${inst.smtpPort})` : `not running (SMTP_HOST=${process.env.SMTP_HOST})`);
  line('File storage:', s3StandIn ? `${inst.s3Url}  (S3 stand-in, bucket ${env.S3_BUCKET}, objects in ${rel(inst.root, inst.s3Dir)}/)` : `S3_ENDPOINT=${process.env.S3_ENDPOINT}`);
  line('Database:', ownDb ? `mysql://couplet@127.0.0.1:${inst.dbPort}/${inst.dbName} (password in ${rel(inst.root, inst.dir)}/db-password)` : 'DATABASE_URL from your environment');
  line('Logs:', `${rel(inst.root, inst.logsDir)}/`);
  console.log(dim('Press Ctrl-C to stop everything. App log follows:'));
  console.log('');
  follow(app.logFile, app.logOffset);
}

main().catch((err) => {
  if (isShuttingDown()) return; // a signal is already stopping everything
  reportError(err, inst.root);
  warn(`logs: ${rel(inst.root, inst.logsDir)}/`);
  shutdown(err.exitCode || 1);
});
