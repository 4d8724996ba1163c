/**
 * Size of the server's solver pool, from the environment (parsed with zod once, by server-pool.ts):
 *   SOLVER_WORKERS      worker threads, default max(1, CPUs - 1) so one core stays for the web server
 *   SOLVER_QUEUE_LIMIT  jobs that may wait for a worker before requests get 503, default 32
 *   SOLVER_PER_OWNER_LIMIT  jobs one person (or one plan run) may have running or waiting before their next
 *                       gets 429, default 4, so one client's flood cannot take the whole queue
 *   SOLVER_TIMEOUT_MS   longest run of one job, default 10000; a pair of 2,000-turn helices can need longer
 *                       (17 s measured on the 2-core dev machine) and is stopped with a message instead
 */
import { availableParallelism } from 'node:os';
import { z } from 'zod';

export const DEFAULT_QUEUE_LIMIT = 32;
export const DEFAULT_TIMEOUT_MS = 10_000;
/** Enough for a plan run's parallel solves (IN_FLIGHT in src/lib/plans/solve-poses.ts). */
export const DEFAULT_PER_OWNER_LIMIT = 4;
/** More threads than this gain nothing for a per-request solver and only hold memory. */
const MAX_WORKERS = 64;

const solverEnvSchema = z.object({
  SOLVER_WORKERS: z.coerce.number().int().min(1).max(MAX_WORKERS).optional(),
  SOLVER_QUEUE_LIMIT: z.coerce.number().int().min(0).max(10_000).default(DEFAULT_QUEUE_LIMIT),
  SOLVER_TIMEOUT_MS: z.coerce.number().int().min(100).max(600_000).default(DEFAULT_TIMEOUT_MS),
  SOLVER_PER_OWNER_LIMIT: z.coerce.number().int().min(1).max(10_000).default(DEFAULT_PER_OWNER_LIMIT),
});

export interface SolverPoolConfig {
  size: number;
  queueLimit: number;
  perOwnerLimit: number;
  timeoutMs: number;
}

/** The pool's size, queue and time limit; throws naming the variable when one is malformed. */
export function solverPoolConfig(env: Record<string, string | undefined>, cpus = availableParallelism()): SolverPoolConfig {
  // an empty variable counts as unset (z.coerce would read "" as 0)
  const present = Object.fromEntries(Object.entries(env).filter(([, v]) => v !== undefined && v.trim() !== ''));
  const parsed = solverEnvSchema.safeParse(present);
  if (!parsed.success) {
    const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
    throw new Error(`Invalid solver pool environment: ${problems}`);
  }
  const { SOLVER_WORKERS, SOLVER_QUEUE_LIMIT, SOLVER_PER_OWNER_LIMIT, SOLVER_TIMEOUT_MS } = parsed.data;
  return {
    size: SOLVER_WORKERS ?? Math.max(1, cpus - 1),
    queueLimit: SOLVER_QUEUE_LIMIT,
    perOwnerLimit: SOLVER_PER_OWNER_LIMIT,
    timeoutMs: SOLVER_TIMEOUT_MS,
  };
}
