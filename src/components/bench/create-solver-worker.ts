/**
 * The worker is created here, next to its file: Turbopack (and webpack) only bundle a worker written as
 * `new Worker(new URL('./file', import.meta.url))` with a literal relative path.
 */
export function createSolverWorker(): Worker {
  return new Worker(new URL('./solver.worker.ts', import.meta.url), { type: 'module', name: 'couplet-solver' });
}
