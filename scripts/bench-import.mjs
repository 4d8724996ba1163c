#!/usr/bin/env node
/**
 * CSV import benchmark: a 5,000-point plan (tilt 50 values x depth 100 values) on the seeded pad study's
 * setup, on the bench with the cautions acknowledged, then a 10,000-row CSV (every point by open-circuit
 * voltage and by direct power, named in a method column) imported with the app's own
 * commitReadingImport, in one transaction, several times; the plan's readings are deleted between runs.
 * Prints the median check (preview) and import times against the target of 10 s.
 *
 * It starts a private MariaDB of its own (.data/bench/, 127.0.0.1:3490 + COUPLET_PORT_OFFSET) from
 * the same scripts as `npm test`, recreates its database, migrates and seeds it, and stops the server
 * at the end, so it runs beside `npm start` and `npm test`. The TypeScript sources are compiled on
 * require (scripts/lib/register-ts.cjs). Usage: node scripts/bench-import.mjs [--runs N]
 */
import path from 'node:path';
import Module, { createRequire } from 'node:module';
import { fail, info, ok, reportError, setPrefix, step } from './lib/log.mjs';
import { acquireLock, childEnv, getInstance, prepareDirs, readOrCreateSecret, recoverLeftovers, releaseLock, ROOT } from './lib/instance.mjs';
import { databaseUrl, ensureDatabase, startMariaDb } from './lib/mariadb.mjs';
import { migrate, seed } from './lib/database.mjs';
import { installSignalHandlers, onCleanup, runCleanups } from './lib/processes.mjs';

const runsArg = process.argv.indexOf('--runs');
const RUNS = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 3;
const TARGET_MS = 10_000;
/** A review page's data for the largest plan: well under the time a person waits for a page. */
const REVIEW_TARGET_MS = 2_000;
/** Above the dev (3407) and test (3408) ports, so all three can run at once. */

setPrefix('[couplet bench-import]');

/** The TypeScript sources, with `server-only` as the empty module it is on the server. */
function loadSources() {
  const require = createRequire(import.meta.url);
  require('./lib/register-ts.cjs');
  const serverOnly = require.resolve('server-only');
  const shim = new Module(serverOnly);
  shim.filename = serverOnly;
  shim.loaded = true;
  shim.exports = {};
  require.cache[serverOnly] = shim;
  const src = (file) => require(path.join(ROOT, 'src', file));
  return {
    ...src('lib/data/plans.ts'),
    ...src('lib/data/plan-points.ts'),
    ...src('lib/data/plan-predictions.ts'),
    ...src('lib/data/readings.ts'),
    ...src('lib/data/reading-import.ts'),
    ...src('lib/data/review.ts'),
    ...src('lib/data/plan-fits.ts'),
    ...src('lib/readings/csv-mapping.ts'),
    ...src('lib/readings/bench-cautions.ts'),
    ...src('lib/solver-pool/job.ts'),
    ...src('lib/validations/plan.ts'),
    ...src('lib/validations/reading-import.ts'),
    db: src('lib/db.ts').db,
  };
}

/** Every point by open-circuit voltage (V2 from the predicted M) and by direct power, with a repeatable scatter of about 2 %. */
function benchCsv(points) {
  const lines = ['seq,repeat,method,f_MHz,I1_mA,V2_mV,phase_deg,Pin_W,Pout_W'];
  const frequency = 6.78e6;
  for (const p of points) {
    const scatter = 1 + 0.02 * Math.sin(p.seq * 2.1);
    const rxVoltage = 2 * Math.PI * frequency * Math.abs(p.predicted.mutualInductance) * 0.25 * scatter;
    lines.push(`${p.seq},${p.repeatIndex},open_circuit,6.78,250,${(rxVoltage * 1e3).toPrecision(5)},89.2,,`);
    lines.push(`${p.seq},${p.repeatIndex},Direct power,,,,,1.2,${(1.2 * p.predicted.efficiency * scatter).toPrecision(4)}`);
  }
  return `${lines.join('\n')}\n`;
}

const median = (times) => [...times].sort((a, b) => a - b)[Math.floor(times.length / 2)];
const ms = (t) => `${t.toFixed(0)} ms`;

async function main() {
  const inst = getInstance('bench');
  prepareDirs(inst);
  const busy = acquireLock(inst);
  if (busy) {
    fail(`another bench-import is running (pid ${busy}); wait for it`);
    process.exit(1);
  }
  onCleanup('instance lock', () => releaseLock(inst));
  installSignalHandlers();
  await recoverLeftovers(inst);

  const password = readOrCreateSecret(path.join(inst.dir, 'db-password'), 18);
  await startMariaDb(inst);
  const url = databaseUrl(inst, password);
  const env = childEnv(inst, { databaseUrl: url, mailStandIn: false, nextauthSecret: readOrCreateSecret(path.join(inst.dir, 'nextauth-secret'), 32) });
  await ensureDatabase(inst, { password, recreate: true });
  await migrate(inst, env);
  await seed(inst, env);
  process.env.DATABASE_URL = url;
  const app = loadSources();
  onCleanup('database pool', () => app.db.destroy());

  step('building a 5,000-point plan on the bench…');
  const user = async (email) => {
    const row = await app.db('users').where({ email }).first('id', 'email', 'name', 'site_role');
    return { id: row.id, email: row.email, name: row.name, siteRole: row.site_role };
  };
  const researcher = await user('ines.okafor@couplet.test');
  const student = await user('tomasz.rehn@couplet.test');
  const study = await app.db('studies').where({ name: 'Seed-tray pad to buried soil probes' }).first('id');
  const setup = await app.db('setups').where({ study_id: study.id }).first('id');
  // Every point gets the prediction of the first pose solved: the import's cost does not depend on it,
  // and solving 5,000 poses of a spiral would make the set-up the benchmark.
  let solved = null;
  app.setPlanSolverPool({ solve: async (job) => (solved ??= app.runSolveJob(job)) });
  const plan = await app.createPlan(researcher, study.id, app.planCreateSchema.parse({
    name: 'Import benchmark', setupId: setup.id, repeats: 1, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null, minutesPerPoint: 1, notes: '',
    axes: [
      { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'count', start: 0, stop: 49, count: 50, spacing: 'linear' },
      { quantity: 'distance', displayUnit: 'cm', mode: 'count', start: 0.05, stop: 0.149, count: 100, spacing: 'linear' },
    ],
  }));
  await app.planPredictionRun(plan.id);
  await app.transitionPlan(researcher, study.id, plan.id, { to: 'on_bench' });
  await app.acknowledgeCautions(student, study.id, plan.id, app.BENCH_CAUTIONS_VERSION);
  const points = await app.listPlanPoints(student, study.id, plan.id);
  if (points.length !== 5000 || points.some((p) => !p.predicted)) throw new Error(`expected 5,000 predicted points, got ${points.length}`);

  const csv = benchCsv(points);
  const mapping = app.csvColumnMapSchema.parse(app.guessMapping(csv.slice(0, csv.indexOf('\n')).split(',')));
  const input = { csv, mapping, fileName: 'bench-import.csv' };
  ok(`plan ready; CSV of ${(csv.length / 1024 / 1024).toFixed(2)} MB, ${points.length * 2} rows`);

  const previews = [];
  const imports = [];
  for (let run = 0; run < RUNS; run++) {
    await app.db('readings').where({ plan_id: plan.id }).del();
    let t = performance.now();
    const report = await app.previewReadingImport(student, study.id, plan.id, input);
    previews.push(performance.now() - t);
    if (report.withProblems > 0 || report.fileProblems.length > 0) throw new Error(`the benchmark file has problems: ${JSON.stringify(report.rows[0] ?? report.fileProblems[0])}`);
    t = performance.now();
    const result = await app.commitReadingImport(student, study.id, plan.id, input);
    imports.push(performance.now() - t);
    if (result.count !== points.length * 2) throw new Error(`imported ${result.count} rows, expected ${points.length * 2}`);
    info(`run ${run + 1}: check ${ms(previews.at(-1))}, import ${ms(imports.at(-1))}`);
  }
  app.setPlanSolverPool(null);

  // The review of the same plan: 5,000 poses, 10,000 current readings, read and compared in one go, and a
  // fit of the extra receiver resistance to the efficiencies (the link network at every pose per step).
  const supervisor = await user('maren.solberg@couplet.test');
  const reviews = [];
  const fits = [];
  for (let run = 0; run < RUNS; run++) {
    let t = performance.now();
    const review = await app.getPlanReview(supervisor, study.id, plan.id, 'coupling');
    reviews.push(performance.now() - t);
    if (review.summary.compared !== points.length) throw new Error(`compared ${review.summary.compared} poses, expected ${points.length}`);
    t = performance.now();
    await app.runFit(supervisor, study.id, plan.id, { model: 'extra_rx_resistance', quantity: 'efficiency' });
    fits.push(performance.now() - t);
    info(`run ${run + 1}: review ${ms(reviews.at(-1))}, resistance fit ${ms(fits.at(-1))}`);
  }

  const importMedian = median(imports);
  console.log(`${points.length * 2}-row CSV (${points.length} points x open-circuit voltage + direct power, method column) into one plan`);
  console.log(`check (preview), median of ${RUNS}: ${ms(median(previews))} (runs: ${previews.map(ms).join(', ')})`);
  console.log(`import (one transaction), median of ${RUNS}: ${ms(importMedian)} (runs: ${imports.map(ms).join(', ')}); target < ${ms(TARGET_MS)}: ${importMedian < TARGET_MS ? 'met' : 'MISSED'}`);
  console.log(`review of ${points.length} poses (k), median of ${RUNS}: ${ms(median(reviews))} (runs: ${reviews.map(ms).join(', ')}); target < ${ms(REVIEW_TARGET_MS)}: ${median(reviews) < REVIEW_TARGET_MS ? 'met' : 'MISSED'}`);
  console.log(`extra-resistance fit over ${points.length} poses and stored, median of ${RUNS}: ${ms(median(fits))} (runs: ${fits.map(ms).join(', ')})`);
  return importMedian < TARGET_MS && median(reviews) < REVIEW_TARGET_MS ? 0 : 1;
}

let code = 1;
try {
  code = await main();
} catch (error) {
  reportError(error, ROOT);
}
await runCleanups();
process.exit(code);
