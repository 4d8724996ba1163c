/**
 * The solving half of a plan's prediction run, without the database: distinct poses through a solver
 * pool, a few at a time. Pure (no server imports), so the server's runner and scripts/bench-plan.mjs run
 * the same code.
 */
import { SolverBusyError, SolverQuotaError } from '../solver-pool/errors';
import type { SolveJob, SolveJobResult } from '../solver-pool/job';
import type { PlanPose } from './points';
import type { PointPrediction } from './prediction';
import { pointPrediction, pointSolveJob, type PlanSetupGeometry } from './solve-job';

/**
 * Solves a run keeps on the pool at once: enough to keep its workers busy, far under its queue limit,
 * and within one owner's share (DEFAULT_PER_OWNER_LIMIT of the pool's config).
 */
export const IN_FLIGHT = 4;
/** How long and how often a run waits when the pool is full with other people's solves. */
const BUSY_RETRY_MS = 250;
const BUSY_RETRIES = 40;

export interface PoolLike {
  solve(job: SolveJob, options?: { owner?: string }): Promise<SolveJobResult>;
}

/** A pose whose solve failed, with what the pool threw. */
export class PoseError extends Error {
  constructor(readonly pose: PlanPose, readonly reason: unknown) {
    super('A plan point could not be solved.');
    this.name = 'PoseError';
  }
}

const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

async function solvePatiently(pool: PoolLike, job: SolveJob, owner: string | undefined): Promise<SolveJobResult> {
  for (let attempt = 0; ; attempt++) {
    try {
      return await pool.solve(job, { owner });
    } catch (error) {
      const full = error instanceof SolverBusyError || error instanceof SolverQuotaError;
      if (!full || attempt >= BUSY_RETRIES) throw error;
      await sleep(BUSY_RETRY_MS);
    }
  }
}

/**
 * Predictions of `poses` in order, at most IN_FLIGHT on the pool; the first failure is a PoseError.
 * `owner` names the run to the pool (e.g. "plan:12"), which shares workers fairly between owners.
 */
export async function solvePoses(pool: PoolLike, geometry: PlanSetupGeometry, poses: PlanPose[], owner?: string): Promise<PointPrediction[]> {
  const results: PointPrediction[] = new Array(poses.length);
  let next = 0;
  const lane = async () => {
    while (next < poses.length) {
      const i = next++;
      try {
        results[i] = pointPrediction(await solvePatiently(pool, pointSolveJob(geometry, poses[i]), owner));
      } catch (error) {
        throw new PoseError(poses[i], error);
      }
    }
  };
  await Promise.all(Array.from({ length: Math.min(IN_FLIGHT, poses.length) }, lane));
  return results;
}
