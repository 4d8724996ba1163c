/**
 * Starts solve-worker.ts from its TypeScript sources, for jest and the benchmark (plain Node 20 cannot
 * load .ts): an eval'd CommonJS bootstrap registers scripts/lib/register-ts.cjs, a require hook that
 * compiles .ts files with @swc/core (the compiler jest already uses), then requires the worker. The production server
 * never uses this: Turbopack bundles the worker (server-pool.ts).
 */
import { Worker } from 'node:worker_threads';
import { join } from 'node:path';

/** The worker entry in the source tree (resolved from the repository root, where jest and npm run). */
export const SOLVE_WORKER_SOURCE = join(process.cwd(), 'src', 'lib', 'solver-pool', 'solve-worker.ts');

/** The require hook that compiles .ts on load (shared with the benchmarks). */
const REGISTER_TS = join(process.cwd(), 'scripts', 'lib', 'register-ts.cjs');

const bootstrap = (entry: string) => `
require(${JSON.stringify(REGISTER_TS)});
require(${JSON.stringify(entry)});
`;

/** A worker thread running the solve worker compiled from source; `entry` may name a test fixture. */
export function createSourceWorker(entry: string = SOLVE_WORKER_SOURCE): Worker {
  return new Worker(bootstrap(entry), { eval: true });
}
