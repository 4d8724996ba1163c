import 'server-only';
import { Worker } from 'node:worker_threads';
import { solverPoolConfig } from './config';
import type { SolveJob, SolveJobResult } from './job';
import { SolverPool, type SolveOptions } from './solver-pool';

/**
 * The web server's one solver pool (cached on globalThis so `next dev` reloads do not start more).
 *
 * The worker is written as `new Worker(new URL('./solve-worker.ts', import.meta.url))` on purpose:
 * Turbopack (Next 16) recognises exactly this form, bundles solve-worker.ts with src/physics as a
 * separate Node.js entry chunk and rewrites the URL to it, in `next build` and in `next dev` alike. Any
 * other form (a variable, a string path) would be left to Node at run time, which cannot load .ts.
 */
function createServerPool(): SolverPool {
  return new SolverPool({
    ...solverPoolConfig(process.env),
    createWorker: () => new Worker(new URL('./solve-worker.ts', import.meta.url)),
  });
}

const holder = globalThis as typeof globalThis & { coupletSolverPool?: SolverPool };

export function serverSolverPool(): SolverPool {
  holder.coupletSolverPool ??= createServerPool();
  return holder.coupletSolverPool;
}

/**
 * Solves on a worker thread. Throws 422 (input), 429 (the owner's share is taken), 503 (busy, timed out)
 * or 500 (worker failure) HttpErrors.
 */
export function solveOnServer(job: SolveJob, options?: SolveOptions): Promise<SolveJobResult> {
  return serverSolverPool().solve(job, options);
}
