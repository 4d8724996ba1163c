#!/usr/bin/env node
/**
 * The 441-point plan benchmark without the database: the plan of two 20-turn helices (radius 5 cm, length
 * 4 cm, wire 1 mm; tilt 0-90 degrees by 4.5 x distance 12-32 cm by 1 cm, tolerance 1e-6) expanded by
 * src/lib/plans and solved in batches of 50 with the runner's own code (solvePoses) on a pool of the
 * server's default size, workers started from the sources. The end-to-end time with the database writes
 * is measured by unit/lib/data/plans.test.ts. Usage: node scripts/bench-plan.mjs [--runs N]
 */
import { benchPool, geometry, plans, points, poses } from './lib/bench-helices.mjs';

const runsArg = process.argv.indexOf('--runs');
const RUNS = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 3;
const BATCH = 50;

const { pool, size } = benchPool();
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
