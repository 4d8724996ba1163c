/**
 * Entry of a solver worker thread: `{ ready: true }` once loaded, then one job at a time, `{ id, job }` in,
 * `{ id, ...outcome }` out.
 * The production build bundles this file (with src/physics) as its own worker entry: Turbopack does so
 * for `new Worker(new URL('./solve-worker.ts', import.meta.url))` in server-pool.ts. Jest and the
 * benchmark start it from the TypeScript sources (source-worker.ts).
 */
import { setPriority } from 'node:os';
import { parentPort } from 'node:worker_threads';
import { settleSolveJob, type SolveJob } from './job';

if (!parentPort) throw new Error('solve-worker.ts runs only as a worker thread');
const port = parentPort;

/**
 * Niceness of solver threads. On Linux a priority set for "process 0" applies to the calling thread
 * only, so the web server's own thread keeps its priority and pages stay quick while long solves run;
 * the solves take the CPU time the pages leave. Other systems would lower the whole process, so there
 * the solver keeps the normal priority, as it does where the system refuses.
 */
const SOLVER_NICENESS = 10;
if (process.platform === 'linux') {
  try {
    setPriority(SOLVER_NICENESS);
  } catch {
    // not permitted here: solve at the inherited priority
  }
}

port.on('message', (message: { id: number; job: SolveJob }) => {
  port.postMessage({ id: message.id, ...settleSolveJob(message.job) });
});
// the code is loaded: the pool starts the first job's clock now, not while the thread was starting
port.postMessage({ ready: true });
