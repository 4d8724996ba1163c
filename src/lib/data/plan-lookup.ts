import 'server-only';
import type { Knex } from 'knex';
import { conflict, notFound } from '../http/errors';
import { PLAN_STATE_LABELS, type PlanState } from '../plans/states';

/** How a plan's row is read: as it is, share-locked (writes at the bench) or locked for a change. */
export type PlanLock = 'update' | 'share' | null;

/**
 * The plan's row on this study with `columns`, locked as asked; 404 when the plan is not on this study
 * (after the caller's access check on the study). The one lookup the plan guards below and the review's
 * plan head share.
 */
export async function planOfStudy<Row>(trx: Knex | Knex.Transaction, studyId: number, planId: number, columns: readonly string[], lock: PlanLock = null): Promise<Row> {
  const query = trx('sweep_plans').where({ id: planId, study_id: studyId });
  if (lock === 'update') query.forUpdate();
  if (lock === 'share') query.forShare();
  const row = (await query.first(...columns)) as Row | undefined;
  if (!row) throw notFound('No such plan in this study.');
  return row;
}

/** 404 unless the plan exists on this study (after the caller's access check on the study). */
export async function requirePlanInStudy(trx: Knex | Knex.Transaction, studyId: number, planId: number): Promise<void> {
  await planOfStudy(trx, studyId, planId, ['id']);
}

/**
 * The plan of this study (404 otherwise), which must be on the bench: 409 with `refusal(state)`
 * otherwise. With `lock` the row is share-locked: many writes at the bench may run at once, but a
 * state change (FOR UPDATE) waits until the caller's transaction ends.
 */
export async function requirePlanOnBench(
  trx: Knex | Knex.Transaction,
  studyId: number,
  planId: number,
  refusal: (stateLabel: string) => string,
  { lock = false }: { lock?: boolean } = {},
): Promise<{ name: string; state: PlanState }> {
  const plan = await planOfStudy<{ name: string; state: PlanState }>(trx, studyId, planId, ['name', 'state'], lock ? 'share' : null);
  if (plan.state !== 'on_bench') throw conflict(refusal(PLAN_STATE_LABELS[plan.state]));
  return plan;
}
