#!/usr/bin/env node
/**
 * The 441-point plan benchmark without the database: the plan of two 20-turn helices (radius 5 cm, length
 * 4 cm, wire 1 mm; tilt 0-90 degrees by 4.5 x distance 12-32 cm by 1 cm, tolerance 1e-6) expanded by
 * src/lib/plans and solved in batches of 50 with the runner's own code (solvePoses) on a pool of the
 * server's default size, workers started from the sources. The end-to-end time with the database writes
 * is measured by unit/lib/data/plans.test.ts. Usage: node scripts/bench-plan.mjs [--runs N]
 */
import os from 'node:os';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const require = createRequire(import.meta.url);
require('./lib/register-ts.cjs');
const plans = require(join(root, 'src/lib/plans/index.ts'));
const { SolverPool } = require(join(root, 'src/lib/solver-pool/solver-pool.ts'));
const { createSourceWorker } = require(join(root, 'src/lib/solver-pool/source-worker.ts'));

const runsArg = process.argv.indexOf('--runs');
const RUNS = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 3;
const BATCH = 50;

const helix = { kind: 'helix', radius: 0.05, turns: 20, length: 0.04, wireDiameter: 0.001 };
const geometry = {
  transmitter: helix, receiver: helix, operatorPoint: null,
  circuit: { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 },
};
const layout = {
  axes: [
    { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 90, step: 4.5 },
    { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.12, stop: 0.32, step: 0.01 },
  ],
  repeats: 1, referenceEvery: null, orderMode: 'serpentine', shuffleSeed: null,
};

const points = plans.buildPlanPoints(layout, { distance: 0.12, lateralOffset: 0, tiltDeg: 0 });
const poses = [...new Map(points.map((p) => [plans.poseKey(p.pose), p.pose])).values()];
const size = Math.max(1, os.availableParallelism() - 1);
const pool = new SolverPool({ size, queueLimit: 32, timeoutMs: 60_000, createWorker: () => createSourceWorker(join(root, 'src/lib/solver-pool/solve-worker.ts')) });
await pool.solve(plans.pointSolveJob(geometry, poses[0])); // start the workers (compiling the sources)

const times = [];
for (let run = 0; run < RUNS; run++) {
  const t = performance.now();
  for (let start = 0; start < poses.length; start += BATCH) await plans.solvePoses(pool, geometry, poses.slice(start, start + BATCH));
  times.push(performance.now() - t);
}
await pool.close();
times.sort((a, b) => a - b);
console.log(`${points.length}-point plan (${poses.length} distinct poses), pool of ${size}, batches of ${BATCH}, ${plans.IN_FLIGHT} in flight`);
console.log(`solving, median of ${RUNS}: ${times[Math.floor(RUNS / 2)].toFixed(0)} ms (runs: ${times.map((t) => t.toFixed(0)).join(', ')} ms)`);
