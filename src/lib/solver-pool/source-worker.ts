/**
 * Starts solve-worker.ts from its TypeScript sources, for jest and the benchmark (plain Node 20 cannot
 * load .ts): an eval'd CommonJS bootstrap registers a require hook that compiles .ts files with @swc/core
 * (a dev dependency, the compiler jest already uses), then requires the worker. The production server
 * never uses this: Turbopack bundles the worker (server-pool.ts).
 */
import { Worker } from 'node:worker_threads';
import { join } from 'node:path';

/** The worker entry in the source tree (resolved from the repository root, where jest and npm run). */
export const SOLVE_WORKER_SOURCE = join(process.cwd(), 'src', 'lib', 'solver-pool', 'solve-worker.ts');

const bootstrap = (entry: string) => `
const { readFileSync } = require('node:fs');
const { createRequire } = require('node:module');
const swc = createRequire(${JSON.stringify(entry)})('@swc/core');
require.extensions['.ts'] = (module, filename) => {
  const { code } = swc.transformSync(readFileSync(filename, 'utf8'), {
    filename, jsc: { parser: { syntax: 'typescript' }, target: 'es2022' }, module: { type: 'commonjs' },
  });
  module._compile(code, filename);
};
require(${JSON.stringify(entry)});
`;

/** A worker thread running the solve worker compiled from source; `entry` may name a test fixture. */
export function createSourceWorker(entry: string = SOLVE_WORKER_SOURCE): Worker {
  return new Worker(bootstrap(entry), { eval: true });
}
