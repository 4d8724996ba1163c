/**
 * The 441-pose benchmark plan both bench-plan.mjs and bench-fit.mjs use: two 20-turn helices (radius
 * 5 cm, length 4 cm, wire 1 mm), tilt 0-90 degrees by 4.5 x distance 12-32 cm by 1 cm, and a solver pool
 * of the server's default size whose workers start from the sources.
 */
import os from 'node:os';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const require = createRequire(import.meta.url);
require('./register-ts.cjs');
/** A TypeScript module of the sources, compiled on require. */
export const source = (file) => require(join(root, file));

export const plans = source('src/lib/plans/index.ts');

const helix = { kind: 'helix', radius: 0.05, turns: 20, length: 0.04, wireDiameter: 0.001 };
export const geometry = {
  transmitter: helix, receiver: helix, operatorPoint: null,
  circuit: { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 },
};
export const layout = {
  axes: [
    { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 90, step: 4.5 },
    { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.12, stop: 0.32, step: 0.01 },
  ],
  repeats: 1, referenceEvery: null, orderMode: 'serpentine', shuffleSeed: null,
};
export const points = plans.buildPlanPoints(layout, { distance: 0.12, lateralOffset: 0, tiltDeg: 0 });
export const poses = [...new Map(points.map((p) => [plans.poseKey(p.pose), p.pose])).values()];

/** A pool of max(1, cores - 1) workers, as the server sizes its own. */
export function benchPool() {
  const { SolverPool } = source('src/lib/solver-pool/solver-pool.ts');
  const { createSourceWorker } = source('src/lib/solver-pool/source-worker.ts');
  const size = Math.max(1, os.availableParallelism() - 1);
  const pool = new SolverPool({ size, queueLimit: 32, timeoutMs: 60_000, createWorker: () => createSourceWorker(join(root, 'src/lib/solver-pool/solve-worker.ts')) });
  return { pool, size };
}
