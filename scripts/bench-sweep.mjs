/**
 * The 441-placement sweep for scripts/bench.mjs: two 20-turn helices (radius 5 cm, length 4 cm,
 * wire 1 mm) at 21 tilts (0-90 degrees by 4.5) x 21 distances (12-32 cm by 1 cm), tolerance 1e-6, solved
 * in this thread and through the solver's worker-thread pool (src/lib/solver-pool, the one the server
 * uses, with its workers started from the TypeScript sources). Each time is the median of SWEEPS runs on
 * a pool whose workers are already started; the start-up is reported on its own.
 */
import os from 'node:os';
import { join } from 'node:path';

export const TILTS = Array.from({ length: 21 }, (_, i) => 4.5 * i);
export const DISTANCES = Array.from({ length: 21 }, (_, i) => 0.12 + 0.01 * i);
const SWEEPS = 3;

const helix = { kind: 'helix', radius: 0.05, turns: 20, length: 0.04, wireDiameter: 0.001 };
const circuit = { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 };
export const sweepRequests = () => TILTS.flatMap((tiltDeg) => DISTANCES.map((distance) => ({
  transmitter: helix, receiver: helix, placement: { distance, tiltDeg }, circuit, tolerance: 1e-6,
})));

function median(values) {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)];
}

/** { ms, results } of the median of SWEEPS runs of an async sweep. */
async function timed(run) {
  const times = [];
  let results;
  for (let i = 0; i < SWEEPS; i++) {
    const t = performance.now();
    results = await run();
    times.push(performance.now() - t);
  }
  return { ms: median(times), results };
}

const worstDeviation = (results, reference) =>
  Math.max(...results.map((r, i) => Math.abs(r.mutualInductance / reference[i].mutualInductance - 1)));
const evaluations = (results) => results.reduce((n, r) => n + r.accuracy.integrandEvaluations, 0);

/**
 * Rows [name, ms, largest |M / M(this thread) - 1|, evaluations]; `requireTs` loads .ts sources. Pools of
 * max(1, CPUs - 1) workers (the server default: one core stays with the web server) and of every CPU.
 */
export async function sweepRows(requireTs, root) {
  const physics = requireTs(join(root, 'src/physics/index.ts'));
  const { SolverPool } = requireTs(join(root, 'src/lib/solver-pool/solver-pool.ts'));
  const { createSourceWorker } = requireTs(join(root, 'src/lib/solver-pool/source-worker.ts'));
  const entry = join(root, 'src/lib/solver-pool/solve-worker.ts');
  const requests = sweepRequests();

  const direct = await timed(async () => requests.map((r) => physics.solve(r)));
  const rows = [['this thread, no workers', direct.ms, 0, evaluations(direct.results)]];
  const notes = [];
  const cpus = os.availableParallelism();
  for (const size of [...new Set([Math.max(1, cpus - 1), cpus])]) {
    const pool = new SolverPool({ size, queueLimit: requests.length, timeoutMs: 60_000, createWorker: () => createSourceWorker(entry) });
    const t = performance.now();
    await Promise.all(Array.from({ length: size }, () => pool.solve(requests[0]))); // start every worker
    notes.push(`pool of ${size}: workers started in ${(performance.now() - t).toFixed(0)} ms (compiling the sources; not in the sweep time)`);
    const swept = await timed(() => Promise.all(requests.map((r) => pool.solve(r))));
    const name = `pool of ${size} worker${size > 1 ? 's' : ''}${size === Math.max(1, cpus - 1) ? ' (server default)' : ''}`;
    rows.push([name, swept.ms, worstDeviation(swept.results, direct.results), evaluations(swept.results)]);
    await pool.close();
  }
  return { rows, notes, cpus };
}
