#!/usr/bin/env node
/**
 * The tilt-error fit benchmark without the database: the 441 poses of scripts/bench-plan.mjs (two
 * 20-turn helices, tilt 0-90 degrees by 4.5 x distance 12-32 cm by 1 cm) "measured" at every planned tilt
 * plus 2 degrees with 0.5 % uncertainty, then the tilt error fitted back by the review's own least squares
 * (src/physics/review/least-squares.ts) with every step solved again on a pool of the server's default
 * size, exactly as runFit does, and the re-prediction at every pose. Usage: node scripts/bench-fit.mjs [--runs N]
 */
import os from 'node:os';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const require = createRequire(import.meta.url);
require('./lib/register-ts.cjs');
const plans = require(join(root, 'src/lib/plans/index.ts'));
const { fitOneParameter } = require(join(root, 'src/physics/review/least-squares.ts'));
const { offsetPose, searchRange } = require(join(root, 'src/lib/review/fit-models.ts'));
const { SolverPool } = require(join(root, 'src/lib/solver-pool/solver-pool.ts'));
const { createSourceWorker } = require(join(root, 'src/lib/solver-pool/source-worker.ts'));

const runsArg = process.argv.indexOf('--runs');
const RUNS = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 3;
const TILT_ERROR_DEG = 2;
const TARGET_MS = 30_000;

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

const couplingAt = async (offset, at = poses) =>
  (await plans.solvePoses(pool, geometry, at.map((pose) => offsetPose('tilt_offset', pose, offset)))).map((p) => p.coupling);

const measured = await couplingAt(TILT_ERROR_DEG);
const uncertainties = measured.map((k) => Math.max(Math.abs(k) * 0.005, 1e-6));
const times = [];
let result;
for (let run = 0; run < RUNS; run++) {
  const t = performance.now();
  result = await fitOneParameter({ evaluate: (p) => couplingAt(p), measured, uncertainties, ...searchRange('tilt_offset', poses, []) });
  await couplingAt(result.value);
  times.push(performance.now() - t);
}
await pool.close();
const median = [...times].sort((a, b) => a - b)[Math.floor(RUNS / 2)];
console.log(`tilt-error fit over ${poses.length} poses, pool of ${size}: estimate ${result.value.toFixed(4)} ± ${result.uncertainty.toExponential(2)} degrees (true ${TILT_ERROR_DEG}), ${result.iterations} iterations`);
console.log(`fit and re-prediction, median of ${RUNS}: ${median.toFixed(0)} ms (runs: ${times.map((t) => t.toFixed(0)).join(', ')} ms); target < ${TARGET_MS} ms: ${median < TARGET_MS ? 'met' : 'MISSED'}`);
process.exit(median < TARGET_MS && Math.abs(result.value - TILT_ERROR_DEG) < 1e-3 ? 0 : 1);
