#!/usr/bin/env node
/**
 * The tilt-error fit benchmark without the database: the 441 poses of scripts/bench-plan.mjs (two
 * 20-turn helices, tilt 0-90 degrees by 4.5 x distance 12-32 cm by 1 cm) "measured" at every planned tilt
 * plus 2 degrees with 0.5 % uncertainty, then the tilt error fitted back by the review's own least squares
 * (src/physics/review/least-squares.ts) with every step solved again on a pool of the server's default
 * size, exactly as runFit does, and the re-prediction at every pose. Usage: node scripts/bench-fit.mjs [--runs N]
 */
import { benchPool, geometry, plans, poses, source } from './lib/bench-helices.mjs';

const { fitOneParameter } = source('src/physics/review/least-squares.ts');
const { offsetPose, searchRange } = source('src/lib/review/fit-models.ts');

const runsArg = process.argv.indexOf('--runs');
const RUNS = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 3;
const TILT_ERROR_DEG = 2;
const TARGET_MS = 30_000;
const { pool, size } = benchPool();

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
