import 'server-only';
import type { Knex } from 'knex';
import { conflict, notFound } from '../http/errors';
import { PLAN_STATE_LABELS, type PlanState } from '../plans/states';

/** 404 unless the plan exists on this study (after the caller's access check on the study). */
export async function requirePlanInStudy(trx: Knex | Knex.Transaction, studyId: number, planId: number): Promise<void> {
  const plan = await trx('sweep_plans').where({ id: planId, study_id: studyId }).first('id');
  if (!plan) throw notFound('No such plan in this study.');
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
  const query = trx('sweep_plans').where({ id: planId, study_id: studyId });
  if (lock) query.forShare();
  const plan: { name: string; state: PlanState } | undefined = await query.first('name', 'state');
  if (!plan) throw notFound('No such plan in this study.');
  if (plan.state !== 'on_bench') throw conflict(refusal(PLAN_STATE_LABELS[plan.state]));
  return plan;
}
