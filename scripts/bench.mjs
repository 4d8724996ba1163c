#!/usr/bin/env node
/**
 * Solver benchmark: median time of one solve of two 20-turn helices (radius 5 cm, length 4 cm,
 * 12 cm apart) at tolerance 1e-6 and 1e-4, against a naive straight-segment midpoint Neumann sum with
 * 256 segments a turn on the same paths, with each one's error against a 1e-12 reference; then the
 * 441-placement sweep in this thread and through the solver's worker-thread pool (bench-sweep.mjs).
 * Runs the TypeScript sources directly: .ts files are compiled on require by @swc/core (a dev dependency).
 * Usage: node scripts/bench.mjs [--runs N]
 */
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { sweepRows } from './bench-sweep.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const require = createRequire(import.meta.url);
require('./lib/register-ts.cjs');
const physics = require(join(root, 'src/physics/index.ts'));
const { mutualInductance } = require(join(root, 'src/physics/neumann.ts'));
const { samplePath } = require(join(root, 'src/physics/geometry/coil-path.ts'));

const runsArg = process.argv.indexOf('--runs');
const RUNS = runsArg > 0 ? Number(process.argv[runsArg + 1]) : 41;
const NAIVE_RUNS = 7;
const SEGMENTS_PER_TURN = 256;

const helix = { kind: 'helix', radius: 0.05, turns: 20, length: 0.04, wireDiameter: 0.001 };
const request = (tolerance) => ({
  transmitter: helix, receiver: helix, placement: { distance: 0.12 },
  circuit: { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 },
  tolerance,
});

function median(fn, runs) {
  const times = [];
  let result;
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    result = fn();
    times.push(performance.now() - t);
  }
  times.sort((a, b) => a - b);
  return { ms: times[Math.floor(runs / 2)], result };
}

/** Midpoint rule on the chords between path points: M = mu0/4pi sum_i sum_j (dl_i . dl_j) / |m_i - m_j|. */
function naiveNeumann(tx, rx) {
  const seg = (path) => {
    const p = samplePath(path, SEGMENTS_PER_TURN);
    const n = p.length / 3 - 1;
    const m = new Float64Array(3 * n);
    const d = new Float64Array(3 * n);
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < 3; k++) {
        m[3 * i + k] = 0.5 * (p[3 * i + k] + p[3 * i + 3 + k]);
        d[3 * i + k] = p[3 * i + 3 + k] - p[3 * i + k];
      }
    }
    return { n, m, d };
  };
  const a = seg(tx);
  const b = seg(rx);
  let sum = 0;
  for (let i = 0; i < a.n; i++) {
    const x = a.m[3 * i], y = a.m[3 * i + 1], z = a.m[3 * i + 2];
    const u = a.d[3 * i], v = a.d[3 * i + 1], w = a.d[3 * i + 2];
    let s = 0;
    for (let j = 0; j < b.n; j++) {
      const dx = x - b.m[3 * j], dy = y - b.m[3 * j + 1], dz = z - b.m[3 * j + 2];
      s += (u * b.d[3 * j] + v * b.d[3 * j + 1] + w * b.d[3 * j + 2]) / Math.sqrt(dx * dx + dy * dy + dz * dz);
    }
    sum += s;
  }
  return { value: 1e-7 * sum, evaluations: a.n * b.n };
}

const paths = () => physics.requestPaths(request(1e-6));
const reference = mutualInductance(paths().tx, paths().rx, 1e-12).value;
const rel = (x) => Math.abs(x / reference - 1);

// warm up the JIT on every path measured
for (let i = 0; i < 20; i++) { physics.solve(request(1e-6)); physics.solve(request(1e-4)); }
naiveNeumann(paths().tx, paths().rx);

const tight = median(() => physics.solve(request(1e-6)), RUNS);
const live = median(() => physics.solve(request(1e-4)), RUNS);
const naive = median(() => { const p = paths(); return naiveNeumann(p.tx, p.rx); }, NAIVE_RUNS);

const rows = [
  ['solve, tolerance 1e-6', tight.ms, rel(tight.result.mutualInductance), tight.result.accuracy.estimatedRelativeError, tight.result.accuracy.integrandEvaluations],
  ['solve, tolerance 1e-4 (live)', live.ms, rel(live.result.mutualInductance), live.result.accuracy.estimatedRelativeError, live.result.accuracy.integrandEvaluations],
  [`naive midpoint M, ${SEGMENTS_PER_TURN} seg/turn`, naive.ms, rel(naive.result.value), NaN, naive.result.evaluations],
];
const pad = (s, n) => String(s).padEnd(n);
console.log(`Two 20-turn helices, radius 5 cm, length 4 cm, 12 cm apart; M reference ${(reference * 1e6).toFixed(12)} uH (tolerance 1e-12)`);
console.log(`median of ${RUNS} solves (${NAIVE_RUNS} naive sums), node ${process.version}, solver ${physics.SOLVER_VERSION}\n`);
console.log(`${pad('case', 34)}${pad('median ms', 12)}${pad('true rel. error of M', 22)}${pad('estimated', 12)}evaluations`);
for (const [name, ms, err, est, evals] of rows) {
  console.log(`${pad(name, 34)}${pad(ms.toFixed(3), 12)}${pad(err.toExponential(2), 22)}${pad(Number.isNaN(est) ? '-' : est.toExponential(2), 12)}${evals}`);
}
const speedup = naive.ms / tight.ms;
const accuracy = rel(naive.result.value) / Math.max(rel(tight.result.mutualInductance), Number.EPSILON);
console.log(`\nsolve at 1e-6 vs naive sum: ${speedup.toFixed(1)}x faster (target >= 50), ${accuracy.toExponential(2)}x more accurate (target >= 100)`);
console.log(`live setting 1e-4: ${live.ms.toFixed(3)} ms (target < 5 ms)`);

const sweep = await sweepRows(require, root);
console.log(`\n441 placements: two 20-turn helices (as above), tilt 0-90 deg by 4.5 x distance 12-32 cm by 1 cm, tolerance 1e-6`);
console.log(`median of 3 sweeps, ${sweep.cpus} CPUs; every placement's M compared with this thread's\n`);
console.log(`${pad('sweep', 40)}${pad('median ms', 12)}${pad('ms / placement', 16)}${pad('max |dM/M| vs thread', 22)}evaluations`);
for (const [name, ms, deviation, evals] of sweep.rows) {
  console.log(`${pad(name, 40)}${pad(ms.toFixed(1), 12)}${pad((ms / 441).toFixed(3), 16)}${pad(deviation.toExponential(1), 22)}${evals}`);
}
for (const note of sweep.notes) console.log(note);
const served = sweep.rows.find(([name]) => name.includes('server default'));
console.log(`\n441-point sweep through the server's pool: ${served[1].toFixed(0)} ms (target < 2000 ms)`);
