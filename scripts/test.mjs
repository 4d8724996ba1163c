#!/usr/bin/env node
// `npm test`: everything the test suites need, on the isolated "test" instance (.data/test/,
// MariaDB 127.0.0.1:3408 with couplet_test recreated each run, SMTP 1026 / inbox 1081, S3 stand-in
// 4570 emptied each run, app 3100),
// then jest (unit/) and playwright (e2e/), then a summary. Stops everything it started, also on
// failure and Ctrl-C. `npm start` may run at the same time: nothing is shared.
//
//   npm test                      all suites
//   npm test -- --unit-only       jest only (no app build, no chromium)
//   npm test -- --e2e-only        playwright only
//   npm test -- invite            only test files matching "invite" (passed to jest and playwright)
//   npm test -- --keep            leave the services running after the tests (stop with Ctrl-C)
//
// Other arguments are passed to both runners. Ends with the line "Total: N passed, M failed".
import fs from 'node:fs';
import path from 'node:path';
import { bold, dim, red, fail, info, ok, reportError, setPrefix, step, rel, StepError } from './lib/log.mjs';
import { acquireLock, childEnv, getInstance, markerEnv, prepareDirs, readOrCreateSecret, recoverLeftovers, releaseLock } from './lib/instance.mjs';
import { installSignalHandlers, isShuttingDown, onCleanup, runCleanups, runStep } from './lib/processes.mjs';
import { ensureNodeModules } from './lib/deps.mjs';
import { CHROMIUM, ensureSystemPackages } from './lib/system-packages.mjs';
import { databaseUrl, ensureDatabase, startMariaDb } from './lib/mariadb.mjs';
import { migrate, seed } from './lib/database.mjs';
import { clearMailDir, startMail } from './lib/mail.mjs';
import { clearS3Objects, resetS3Dir, startS3 } from './lib/s3.mjs';
import { buildIfNeeded, startNext } from './lib/next-app.mjs';
import { formatCounts, jestCounts, playwrightCounts } from './lib/test-results.mjs';

// ---------------------------------------------------------------------------------------------
// arguments

const argv = process.argv.slice(2);
if (argv.includes('--help') || argv.includes('-h')) {
  // The header comment of this file is the help text.
  const lines = fs.readFileSync(new URL(import.meta.url), 'utf8').split('\n').slice(1);
  console.log(lines.slice(0, lines.findIndex((l) => !l.startsWith('//'))).map((l) => l.replace(/^\/\/ ?/, '')).join('\n'));
  process.exit(0);
}
const unitOnly = argv.includes('--unit-only');
const e2eOnly = argv.includes('--e2e-only');
const keep = argv.includes('--keep');
const passArgs = argv.filter((a) => !['--unit-only', '--e2e-only', '--keep'].includes(a));
// With a filter a suite may legitimately have no matching test.
const filtered = passArgs.some((a) => !a.startsWith('-'));
if (unitOnly && e2eOnly) {
  console.error('--unit-only and --e2e-only exclude each other');
  process.exit(2);
}
const runUnit = !e2eOnly;
const runE2e = !unitOnly;

setPrefix('[couplet test]');
const inst = getInstance('test');
prepareDirs(inst);
const JEST_JSON = path.join(inst.dir, 'jest-results.json');
const E2E_JSON = path.join(inst.dir, 'e2e-results.json');

const busy = acquireLock(inst);
if (busy) {
  fail(`another \`npm test\` is running (pid ${busy}); wait for it or stop it first`);
  process.exit(1);
}
onCleanup('instance lock', () => releaseLock(inst));
installSignalHandlers();

// ---------------------------------------------------------------------------------------------

const bin = (name) => path.join(inst.root, 'node_modules', '.bin', name);
const anyExists = (...files) => files.some((f) => fs.existsSync(path.join(inst.root, f)));

/** Drop and recreate couplet_test, migrate, seed: every suite starts from the same data. */
async function freshDatabase(env, password) {
  await ensureDatabase(inst, { password, recreate: true });
  await migrate(inst, env);
  await seed(inst, env);
}

async function runJest(env) {
  if (!anyExists('jest.config.ts', 'jest.config.js', 'jest.config.mjs', 'jest.config.cjs')) {
    throw new StepError('unit tests (jest)', 'jest.config.ts is missing at the repository root', {
      hint: 'the jest configuration (unit tests live in unit/) is not there yet',
    });
  }
  step('unit tests: jest');
  const args = ['--ci', '--json', `--outputFile=${JEST_JSON}`, ...(filtered ? ['--passWithNoTests'] : []), ...passArgs];
  const { code } = await runStep({
    title: 'unit tests (jest)',
    cmd: bin('jest'),
    args,
    env,
    cwd: inst.root,
    logFile: path.join(inst.logsDir, 'jest.log'),
    allowFailure: true,
  });
  return code;
}

async function runPlaywright(env) {
  if (!anyExists('playwright.config.ts', 'playwright.config.js', 'playwright.config.mjs')) {
    throw new StepError('e2e tests (playwright)', 'playwright.config.ts is missing at the repository root', {
      hint: `the playwright configuration (tests in e2e/, executablePath ${CHROMIUM}) is not there yet`,
    });
  }
  step('end-to-end tests: playwright (Debian chromium)');
  // list for people, json for the summary; set here so the summary never depends on the config.
  const args = ['test', '--reporter=list,json', ...(filtered ? ['--pass-with-no-tests'] : []), ...passArgs];
  const { code } = await runStep({
    title: 'e2e tests (playwright)',
    cmd: bin('playwright'),
    args,
    env: { ...env, PLAYWRIGHT_JSON_OUTPUT_NAME: E2E_JSON, BASE_URL: inst.appUrl, PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: '1' },
    cwd: inst.root,
    logFile: path.join(inst.logsDir, 'playwright.log'),
    allowFailure: true,
  });
  return code;
}

// ---------------------------------------------------------------------------------------------

const exitCodes = { unit: null, e2e: null };
let stepFailure = null;
const started = Date.now();

async function main() {
  for (const f of [JEST_JSON, E2E_JSON]) fs.rmSync(f, { force: true }); // never report an old run
  await recoverLeftovers(inst);
  await ensureNodeModules(inst.root, inst.logsDir, markerEnv(inst));
  await ensureSystemPackages(['mariadb-server', ...(runE2e ? ['chromium'] : [])], { root: inst.root, logsDir: inst.logsDir });

  // Tests always use their own server and stand-in, whatever DATABASE_URL / SMTP_HOST say: the
  // database is dropped each run, and e2e tests read the invitations from the stand-in's inbox.
  if (process.env.DATABASE_URL) info('DATABASE_URL is ignored by npm test: tests use their own MariaDB on 127.0.0.1:3408');
  if (process.env.SMTP_HOST) info('SMTP_HOST is ignored by npm test: tests use the mail stand-in on 127.0.0.1:1026');
  // Tests upload throw-away files and drop the rows that name them: never into a real bucket.
  if (process.env.S3_ENDPOINT) info(`S3_ENDPOINT is ignored by npm test: tests use the S3 stand-in on ${inst.s3Url}`);
  const password = readOrCreateSecret(path.join(inst.dir, 'db-password'), 18);
  const nextauthSecret = readOrCreateSecret(path.join(inst.dir, 'nextauth-secret'), 32);
  await startMariaDb(inst);
  const env = childEnv(inst, { databaseUrl: databaseUrl(inst, password), mailStandIn: true, s3StandIn: true, nextauthSecret });
  await freshDatabase(env, password);

  clearMailDir(inst);
  await startMail(inst, env);
  resetS3Dir(inst);
  await startS3(inst, env);

  if (runUnit) exitCodes.unit = await runJest(env);

  if (runE2e) {
    if (runUnit) {
      // Unit tests may have written to the database and sent mail: e2e starts from seed data again.
      step('resetting the test database, inbox and file storage for the end-to-end tests…');
      await freshDatabase(env, password);
      clearMailDir(inst);
      clearS3Objects(inst);
    }
    await buildIfNeeded(inst, env);
    await startNext(inst, env);
    exitCodes.e2e = await runPlaywright(env);
  }
}

function summary() {
  const lines = [];
  const total = { passed: 0, failed: 0, skipped: 0 };
  const add = (c) => {
    total.passed += c.passed;
    total.failed += c.failed;
    total.skipped += c.skipped;
  };
  const suite = (label, enabled, code, counts, skipReason) => {
    if (!enabled) return lines.push(`${label} not run (${skipReason})`);
    if (code === null) return lines.push(`${label} not run (an earlier step failed)`);
    if (!counts) {
      add({ passed: 0, failed: 1, skipped: 0 });
      return lines.push(`${label} ${red('no results')}: the runner exited with code ${code} without writing its JSON report`);
    }
    add(counts);
    const text = formatCounts(counts) + (counts.notes.length ? ` (${counts.notes.join('; ')})` : '');
    lines.push(`${label} ${counts.failed ? red(text) : text}`);
  };
  suite('unit (jest):      ', runUnit, exitCodes.unit, exitCodes.unit === null ? null : jestCounts(JEST_JSON, exitCodes.unit), '--e2e-only');
  suite('e2e (playwright): ', runE2e, exitCodes.e2e, exitCodes.e2e === null ? null : playwrightCounts(E2E_JSON, exitCodes.e2e), '--unit-only');
  if (stepFailure) {
    // A step that kept tests from running is a failure too, so the last line never reads "0 failed".
    total.failed += 1;
    lines.push(`${red('step failed:')}       ${stepFailure.stepName || 'setup'}: ${stepFailure.message}`);
  }
  console.log('');
  console.log(bold('──────── test summary ────────'));
  for (const l of lines) console.log(l);
  console.log(dim(`results: ${rel(inst.root, JEST_JSON)}, ${rel(inst.root, E2E_JSON)}; logs: ${rel(inst.root, inst.logsDir)}/; ${Math.round((Date.now() - started) / 1000)} s`));
  // The last line, exactly "Total: N passed, M failed[, K skipped]" (read by CI).
  console.log(`Total: ${formatCounts(total)}`);
  return total.failed === 0 ? 0 : 1;
}

try {
  await main();
} catch (err) {
  if (isShuttingDown()) await new Promise(() => {}); // a signal handler is stopping everything and will exit
  stepFailure = err instanceof StepError ? err : new StepError('npm test', err.message);
  reportError(err, inst.root);
  fail(`logs: ${rel(inst.root, inst.logsDir)}/`);
}
if (keep && !stepFailure) {
  summary();
  ok(`--keep: services stay up (app ${inst.appUrl}, inbox ${inst.inboxUrl}); Ctrl-C stops them`);
  await new Promise(() => {});
}
if (!isShuttingDown()) {
  step('stopping the test services…');
  await runCleanups();
  process.exit(summary());
}
