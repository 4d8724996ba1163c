import 'server-only';
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { SOLVER_VERSION } from '../../physics';
import type { CircuitSpec, CoilSpec } from '../../physics/types';
import { db } from '../db';
import { HttpError } from '../http/errors';
import { poseKey, type PlanSetupGeometry } from '../plans/solve-job';
import { PoseError, solvePoses, type PoolLike } from '../plans/solve-poses';
import type { PlanPose } from '../plans/points';
import type { PointPrediction } from '../plans/prediction';
import { fromJsonColumn, toJsonColumn } from './json-column';

/**
 * Computes a plan's predicted values in the background. Each run has its own id, stored on
 * the plan when the run begins (in the transaction that changed the points). The run solves the distinct
 * poses on the solver pool and writes batches into `pending_predicted`, each batch in a transaction that
 * first checks the plan still names this run and is still running; a newer run, a cancel or a deleted
 * plan stops it there. When every batch is in, one transaction moves the pending values into
 * `predicted`, so a plan never shows predictions of two runs, and a failed or cancelled recompute leaves
 * the earlier predictions in place.
 */

/** Points written per transaction. */
export const PREDICTION_BATCH = 50;

let poolOverride: PoolLike | null = null;

/** Tests and the benchmark run plans on a pool whose workers start from the sources. */
export function setPlanSolverPool(pool: PoolLike | null): void {
  poolOverride = pool;
}

export async function planPool(): Promise<PoolLike> {
  // Imported on first use: server-pool.ts bundles the worker (Turbopack), which jest cannot load.
  return poolOverride ?? (await import('../solver-pool/server-pool')).serverSolverPool();
}

const runs = new Map<number, Promise<void>>();
/** Run ids computing in this server process; a 'running' plan whose run id is not here was interrupted. */
const activeRunIds = new Set<string>();

/** The plan's current computation (resolved when it ends, however it ends); resolved when none runs. */
export function planPredictionRun(planId: number): Promise<void> {
  return runs.get(planId) ?? Promise.resolve();
}

/** Marks a new run in the caller's transaction (which changed the points); returns its id. */
export async function beginPredictionRun(trx: Knex.Transaction, planId: number, { fresh = false }: { fresh?: boolean } = {}): Promise<string> {
  const runId = randomUUID();
  const [{ total }] = await trx('sweep_points').where({ plan_id: planId }).count({ total: '*' });
  // points just inserted hold no pending values (and an UPDATE would lock the index's end: see writePoints)
  if (!fresh) await trx('sweep_points').where({ plan_id: planId }).update({ pending_predicted: null });
  await trx('sweep_plans').where({ id: planId }).update({
    prediction_status: 'running', prediction_progress: 0, prediction_total: Number(total), prediction_error: null, prediction_run_id: runId,
  });
  return runId;
}

/** Starts a begun run after its transaction committed; the promise never rejects. */
export function launchPredictionRun(planId: number, runId: string): Promise<void> {
  activeRunIds.add(runId);
  const run: Promise<void> = computePredictions(planId, runId)
    .catch((error) => console.error('Plan prediction run failed unexpectedly', planId, error))
    .finally(() => {
      activeRunIds.delete(runId);
      if (runs.get(planId) === run) runs.delete(planId);
    });
  runs.set(planId, run);
  return run;
}

/** Locks the plan and tells whether this run may still write. */
async function stillCurrent(trx: Knex.Transaction, planId: number, runId: string): Promise<boolean> {
  const row = await trx('sweep_plans').where({ id: planId }).forUpdate().first('prediction_run_id', 'prediction_status');
  return !!row && row.prediction_run_id === runId && row.prediction_status === 'running';
}

/** The setup's coils, circuit and operator point behind a plan, or null when the plan is gone. */
export async function loadGeometry(planId: number): Promise<PlanSetupGeometry | null> {
  const row = await db('sweep_plans')
    .join('setups', 'setups.id', 'sweep_plans.setup_id')
    .join('coils as tx', 'tx.id', 'setups.transmitter_coil_id')
    .join('coils as rx', 'rx.id', 'setups.receiver_coil_id')
    .where('sweep_plans.id', planId)
    .first('tx.spec as tx', 'rx.spec as rx', 'setups.circuit as circuit', 'setups.operator_point as operatorPoint');
  if (!row) return null;
  return {
    transmitter: fromJsonColumn<CoilSpec>(row.tx),
    receiver: fromJsonColumn<CoilSpec>(row.rx),
    circuit: fromJsonColumn<CircuitSpec>(row.circuit),
    operatorPoint: row.operatorPoint === null ? null : fromJsonColumn<[number, number, number]>(row.operatorPoint),
  };
}

/** What went wrong, for the person: which pose, and what to change; never internals. */
function failureMessage(error: unknown): string {
  const cause = error instanceof PoseError ? error.reason : error;
  let where = '';
  if (error instanceof PoseError) {
    const p = error.pose;
    const parts = [`distance ${+(p.distance * 100).toPrecision(6)} cm`, `lateral offset ${+(p.lateralOffset * 100).toPrecision(6)} cm`, `tilt ${p.tiltDeg} degrees`];
    if (p.frequencyHz !== undefined) parts.push(`frequency ${p.frequencyHz} Hz`);
    if (p.loadResistance !== undefined) parts.push(`load ${p.loadResistance} ohm`);
    where = ` at ${parts.join(', ')}`;
  }
  if (cause instanceof HttpError && cause.status === 422) {
    const detail = cause.issues.map((i) => i.message).join(' ');
    return `The point${where} cannot be solved: ${detail || cause.message} Change the plan's axes or the setup, then recompute.`;
  }
  if (cause instanceof HttpError) return `The solver stopped on the point${where}: ${cause.message}`;
  return `The solver failed on the point${where}. The earlier predictions are kept; try Recompute.`;
}

async function markFailed(planId: number, runId: string, message: string): Promise<void> {
  await db.transaction(async (trx) => {
    if (!(await stillCurrent(trx, planId, runId))) return;
    await trx('sweep_points').where({ plan_id: planId }).update({ pending_predicted: null });
    await trx('sweep_plans').where({ id: planId }).update({ prediction_status: 'failed', prediction_error: message });
  });
}

/** One run: solve the distinct poses in batches, write each batch if still current, then publish. */
export async function computePredictions(planId: number, runId: string): Promise<void> {
  const geometry = await loadGeometry(planId);
  if (!geometry) return; // the plan was deleted
  const points: { id: number; pose: unknown }[] = await db('sweep_points').where({ plan_id: planId }).orderBy('seq').select('id', 'pose');
  const groups = new Map<string, { pose: PlanPose; ids: number[] }>();
  for (const point of points) {
    const pose = fromJsonColumn<PlanPose>(point.pose);
    const key = poseKey(pose);
    const group = groups.get(key) ?? { pose, ids: [] };
    group.ids.push(point.id);
    groups.set(key, group);
  }
  const distinct = [...groups.values()];
  const pool = await planPool();

  let done = 0;
  for (let start = 0; start < distinct.length; start += PREDICTION_BATCH) {
    const batch = distinct.slice(start, start + PREDICTION_BATCH);
    let predictions: PointPrediction[];
    try {
      predictions = await solvePoses(pool, geometry, batch.map((g) => g.pose), `plan:${planId}`);
    } catch (error) {
      await markFailed(planId, runId, failureMessage(error));
      return;
    }
    done += batch.reduce((n, g) => n + g.ids.length, 0);
    const current = await db.transaction(async (trx) => {
      if (!(await stillCurrent(trx, planId, runId))) return false;
      for (const [i, group] of batch.entries()) {
        await trx('sweep_points').whereIn('id', group.ids).update({ pending_predicted: toJsonColumn(predictions[i]) });
      }
      await trx('sweep_plans').where({ id: planId }).update({ prediction_progress: done });
      return true;
    });
    if (!current) return; // replaced, cancelled or deleted: the newer state owns the plan
  }

  await db.transaction(async (trx) => {
    if (!(await stillCurrent(trx, planId, runId))) return;
    await trx('sweep_points').where({ plan_id: planId }).update({
      predicted: trx.raw('pending_predicted'), pending_predicted: null, solver_version: SOLVER_VERSION,
    });
    await trx('sweep_plans').where({ id: planId }).update({
      prediction_status: 'done', prediction_progress: points.length, solver_version: SOLVER_VERSION,
    });
  });
}

export interface BegunRun {
  planId: number;
  runId: string;
}

/**
 * A setup's coils or circuit changed (PRODUCT.md: predictions are recomputed when coils change): begins
 * a run for every plan built on these setups, in the caller's transaction. Launch them after it commits.
 * Accepted plans keep the predictions they were accepted against: they are the study's record.
 */
export async function beginRunsForSetups(trx: Knex.Transaction, setupIds: number[]): Promise<BegunRun[]> {
  if (setupIds.length === 0) return [];
  const planIds: number[] = await trx('sweep_plans').whereIn('setup_id', setupIds).whereNot('state', 'accepted').orderBy('id').forUpdate().pluck('id');
  const begun: BegunRun[] = [];
  for (const planId of planIds) begun.push({ planId, runId: await beginPredictionRun(trx, planId) });
  return begun;
}

export function launchPredictionRuns(begun: BegunRun[]): void {
  for (const { planId, runId } of begun) void launchPredictionRun(planId, runId);
}

/**
 * A plan left 'running' by a server that stopped mid-run has nobody computing it. When its run id is
 * not computing in this process, mark it failed (earlier predictions stay) so the page offers Recompute
 * instead of a progress bar that never moves. Returns whether it did.
 */
export async function failInterruptedRun(planId: number, runId: string | null): Promise<boolean> {
  if (runId === null || activeRunIds.has(runId)) return false;
  await markFailed(planId, runId, 'The computation was interrupted (the server restarted). The earlier predictions are kept; use Recompute to finish it.');
  return true;
}
