/**
 * Entry of a solver worker thread: `{ ready: true }` once loaded, then one job at a time, `{ id, job }` in,
 * `{ id, ...outcome }` out.
 * The production build bundles this file (with src/physics) as its own worker entry: Turbopack does so
 * for `new Worker(new URL('./solve-worker.ts', import.meta.url))` in server-pool.ts. Jest and the
 * benchmark start it from the TypeScript sources (source-worker.ts).
 */
import { parentPort } from 'node:worker_threads';
import { lowerThisThreadsPriority } from '../workers/thread-priority';
import { settleSolveJob, type SolveJob } from './job';

if (!parentPort) throw new Error('solve-worker.ts runs only as a worker thread');
const port = parentPort;

// solves take the CPU time the pages leave
lowerThisThreadsPriority();

port.on('message', (message: { id: number; job: SolveJob }) => {
  port.postMessage({ id: message.id, ...settleSolveJob(message.job) });
});
// the code is loaded: the pool starts the first job's clock now, not while the thread was starting
port.postMessage({ ready: true });
