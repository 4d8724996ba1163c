import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import { conflict, notFound, unprocessable } from '../http/errors';
import { planReviewUrl, recordDecision } from './plan-decisions';
import { activeMemberEmails } from './members';
import { enqueueMail, kickOutbox } from '../mail/outbox';
import { planSubmittedMail } from '../mail/templates';
import type { PlanAxis } from '../plans/axes';
import type { OrderMode } from '../plans/order';
import { buildPlanPoints, estimatedMinutes, type BasePose } from '../plans/points';
import type { PredictionStatus } from '../plans/prediction';
import { findTransition, PLAN_STATE_LABELS, type PlanState } from '../plans/states';
import { planCreateSchema, type PlanCreate, type PlanTransitionInput, type PlanUpdate } from '../validations/plan';
import { recordAudit } from './audit';
import { retryOnDeadlock } from '../db-retry';
import { fromJsonColumn, toJsonColumn } from './json-column';
import { planOfStudy } from './plan-lookup';
import { beginPredictionRun, failInterruptedRun, launchPredictionRun } from './plan-predictions';

/** A sweep plan as the API shows it; values SI. */
export interface PlanPrediction {
  status: PredictionStatus;
  /** points computed so far */
  done: number;
  total: number;
  error: string | null;
  solverVersion: string | null;
}

export interface Plan {
  id: number;
  studyId: number;
  setupId: number;
  name: string;
  state: PlanState;
  axes: PlanAxis[];
  repeats: number;
  referenceEvery: number | null;
  orderMode: OrderMode;
  shuffleSeed: number | null;
  minutesPerPoint: number;
  notes: string;
  pointCount: number;
  estimatedMinutes: number;
  prediction: PlanPrediction;
  createdAt: string;
  updatedAt: string;
}

interface PlanRow {
  id: number;
  study_id: number;
  setup_id: number;
  name: string;
  state: PlanState;
  axes: unknown;
  repeats: number;
  reference_every: number | null;
  order_mode: OrderMode;
  shuffle_seed: number | null;
  minutes_per_point: number;
  notes: string | null;
  prediction_status: PredictionStatus;
  prediction_progress: number;
  prediction_total: number;
  prediction_error: string | null;
  solver_version: string | null;
  created_at: Date;
  updated_at: Date;
  point_count: number | string;
}

function toPrediction(row: PlanRow): PlanPrediction {
  return { status: row.prediction_status, done: row.prediction_progress, total: row.prediction_total, error: row.prediction_error, solverVersion: row.solver_version };
}

function toPlan(row: PlanRow): Plan {
  const pointCount = Number(row.point_count);
  return {
    id: row.id,
    studyId: row.study_id,
    setupId: row.setup_id,
    name: row.name,
    state: row.state,
    axes: fromJsonColumn<PlanAxis[]>(row.axes),
    repeats: row.repeats,
    referenceEvery: row.reference_every,
    orderMode: row.order_mode,
    shuffleSeed: row.shuffle_seed,
    minutesPerPoint: row.minutes_per_point,
    notes: row.notes ?? '',
    pointCount,
    estimatedMinutes: estimatedMinutes(pointCount, row.minutes_per_point),
    prediction: toPrediction(row),
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

/** Plans with their point counts. */
function planQuery(trx: Knex | Knex.Transaction, studyId: number) {
  return trx('sweep_plans')
    .where('sweep_plans.study_id', studyId)
    .select('sweep_plans.*', trx('sweep_points').count('*').where('sweep_points.plan_id', trx.ref('sweep_plans.id')).as('point_count'));
}

/** The study's plans by name. */
export async function listPlans(viewer: SessionUser, studyId: number): Promise<Plan[]> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const rows: PlanRow[] = await planQuery(db, studyId).orderBy('sweep_plans.name').orderBy('sweep_plans.id');
  return rows.map(toPlan);
}

/** One plan of the study; 404 when it is not in this study. */
export async function getPlan(viewer: SessionUser, studyId: number, planId: number): Promise<Plan> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const row: PlanRow | undefined = await planQuery(db, studyId).where('sweep_plans.id', planId).first();
  if (!row) throw notFound('No such plan in this study.');
  return toPlan(row);
}

/** The prediction progress, for polling. */
export async function getPlanProgress(viewer: SessionUser, studyId: number, planId: number): Promise<PlanPrediction> {
  const plan = await getPlan(viewer, studyId, planId);
  if (plan.prediction.status === 'running') {
    const row = await db('sweep_plans').where({ id: planId }).first('prediction_run_id');
    if (await failInterruptedRun(planId, row?.prediction_run_id ?? null)) return (await getPlan(viewer, studyId, planId)).prediction;
  }
  return plan.prediction;
}

async function refuseDuplicateName(trx: Knex.Transaction, studyId: number, name: string, exceptId?: number): Promise<void> {
  const query = trx('sweep_plans').where({ study_id: studyId, name });
  if (exceptId !== undefined) query.whereNot('id', exceptId);
  if (await query.first('id')) {
    throw conflict(`This study already has a plan named “${name}”.`, [{ path: 'name', message: 'Choose another name.' }]);
  }
}

/** The setup's placement (what a pose keeps when no axis sets it); the setup is locked for share. */
async function setupBase(trx: Knex.Transaction, studyId: number, setupId: number): Promise<BasePose> {
  const row = await trx('setups').where({ id: setupId, study_id: studyId }).forShare().first('placement');
  if (!row) throw unprocessable('Some fields need attention.', [{ path: 'setupId', message: 'Choose a setup of this study.' }]);
  const placement = fromJsonColumn<BasePose>(row.placement);
  return { distance: placement.distance, lateralOffset: placement.lateralOffset ?? 0, tiltDeg: placement.tiltDeg ?? 0 };
}

/**
 * Writes the design's points (replacing the old ones of an existing plan), and begins a prediction run;
 * returns its id. A new plan has nothing to delete or reset, and must not try: a DELETE or UPDATE that
 * matches no rows still takes gap locks at the end of the index, where every other new plan inserts,
 * and plans created at the same moment would deadlock on them.
 */
async function writePoints(trx: Knex.Transaction, planId: number, design: PlanCreate, base: BasePose, { fresh }: { fresh: boolean }): Promise<string> {
  let points;
  try {
    points = buildPlanPoints(design, base);
  } catch (error) {
    if (error instanceof RangeError) throw unprocessable('Some fields need attention.', [{ path: 'axes', message: error.message }]);
    throw error;
  }
  if (!fresh) await trx('sweep_points').where({ plan_id: planId }).del();
  const rows = points.map((p) => ({ plan_id: planId, seq: p.seq, repeat_index: p.repeatIndex, is_reference: p.isReference, pose: toJsonColumn(p.pose) }));
  await trx.batchInsert('sweep_points', rows, 500);
  return beginPredictionRun(trx, planId, { fresh });
}

function designColumns(design: PlanCreate) {
  return {
    name: design.name,
    setup_id: design.setupId,
    axes: toJsonColumn(design.axes),
    repeats: design.repeats,
    reference_every: design.referenceEvery,
    order_mode: design.orderMode,
    shuffle_seed: design.shuffleSeed,
    minutes_per_point: design.minutesPerPoint,
    notes: design.notes || null,
  };
}

/** Creates a draft plan with its points and starts computing their predictions (researchers, admins). */
export async function createPlan(actor: SessionUser, studyId: number, input: PlanCreate): Promise<Plan> {
  const { planId, runId } = await retryOnDeadlock(() => db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    await refuseDuplicateName(trx, studyId, input.name);
    const base = await setupBase(trx, studyId, input.setupId);
    const [id] = await trx('sweep_plans').insert({ study_id: studyId, ...designColumns(input), state: 'draft', created_by: actor.id });
    const run = await writePoints(trx, id, input, base, { fresh: true });
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'plan.create', targetTable: 'sweep_plans', targetId: id, details: { name: input.name } });
    return { planId: id as number, runId: run };
  }));
  void launchPredictionRun(planId, runId);
  return getPlan(actor, studyId, planId);
}

/** The columns that make up a plan's design, as lockPlan reads them. */
type DesignRow = Pick<
  PlanRow,
  'name' | 'setup_id' | 'state' | 'axes' | 'repeats' | 'reference_every' | 'order_mode' | 'shuffle_seed' | 'minutes_per_point' | 'notes'
>;

const lockPlan = (trx: Knex.Transaction, studyId: number, planId: number): Promise<DesignRow> =>
  planOfStudy<DesignRow>(trx, studyId, planId, ['*'], 'update');

function refuseUnlessDraft(row: DesignRow): void {
  if (row.state !== 'draft') throw conflict(`This plan is ${PLAN_STATE_LABELS[row.state]}: only a draft changes its axes.`);
}

/**
 * Changes a draft. A change to the setup, axes, repeats, reference or order rewrites the points and
 * restarts the predictions; a new name, notes or minutes per point keep both.
 */
export async function updatePlan(actor: SessionUser, studyId: number, planId: number, input: PlanUpdate): Promise<Plan> {
  const runId = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    const row = await lockPlan(trx, studyId, planId);
    refuseUnlessDraft(row);
    const current = {
      name: row.name, setupId: row.setup_id, axes: fromJsonColumn<PlanAxis[]>(row.axes), repeats: row.repeats, referenceEvery: row.reference_every,
      orderMode: row.order_mode, shuffleSeed: row.shuffle_seed, minutesPerPoint: row.minutes_per_point, notes: row.notes ?? '',
    };
    const merged = { ...current, ...Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined)) };
    const design = planCreateSchema.parse(merged);
    if (design.name !== current.name) await refuseDuplicateName(trx, studyId, design.name, planId);
    const layoutKeys = ['setupId', 'axes', 'repeats', 'referenceEvery', 'orderMode', 'shuffleSeed'] as const;
    const layoutChanged = layoutKeys.some((key) => JSON.stringify(design[key]) !== JSON.stringify(current[key]));
    await trx('sweep_plans').where({ id: planId }).update({ ...designColumns(design), updated_at: trx.fn.now() });
    const run = layoutChanged ? await writePoints(trx, planId, design, await setupBase(trx, studyId, design.setupId), { fresh: false }) : null;
    const fields = Object.keys(input).filter((key) => input[key as keyof PlanUpdate] !== undefined);
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'plan.update', targetTable: 'sweep_plans', targetId: planId, details: { name: design.name, fields } });
    return run;
  });
  if (runId) void launchPredictionRun(planId, runId);
  return getPlan(actor, studyId, planId);
}

/** Deletes a draft with its points; a plan that went to the bench stays. */
export async function deletePlan(actor: SessionUser, studyId: number, planId: number): Promise<void> {
  await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    const row = await lockPlan(trx, studyId, planId);
    if (row.state !== 'draft') throw conflict(`This plan is ${PLAN_STATE_LABELS[row.state]}: only a draft can be deleted.`);
    await trx('sweep_plans').where({ id: planId }).del();
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'plan.delete', targetTable: 'sweep_plans', targetId: planId, details: { name: row.name } });
  });
}

/**
 * Moves a plan along its states (src/lib/plans/states.ts): 409 for a step the states do not allow,
 * 403 when the actor's role may not take it. The reason goes to the audit trail.
 */
export async function transitionPlan(actor: SessionUser, studyId: number, planId: number, input: PlanTransitionInput): Promise<Plan> {
  const mailQueued = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.view', trx);
    const row = await lockPlan(trx, studyId, planId);
    const transition = findTransition(row.state, input.to);
    if (!transition) {
      throw conflict(`A plan ${PLAN_STATE_LABELS[row.state]} cannot move to ${PLAN_STATE_LABELS[input.to]}.`, [{ path: 'to', message: 'Choose an allowed next state.' }]);
    }
    await requireStudyAccess(actor, studyId, transition.action, trx);
    await trx('sweep_plans').where({ id: planId }).update({ state: input.to, updated_at: trx.fn.now() });
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'plan.transition', targetTable: 'sweep_plans', targetId: planId,
      details: { name: row.name, from: row.state, to: input.to, ...(input.reason ? { reason: input.reason } : {}) },
    });
    if (input.to === 'in_review') await notifyReviewers(trx, actor, studyId, planId, row.name);
    if (row.state === 'in_review') await recordDecision(trx, actor, studyId, planId, row.name, input);
    return input.to === 'in_review' || row.state === 'in_review';
  });
  if (mailQueued) kickOutbox();
  return getPlan(actor, studyId, planId);
}

/**
 * A plan goes to review with at least one reading, and the study's supervisors hear of it. The mail
 * joins the outbox inside the transaction, so it is stored exactly when the plan moves and no
 * supervisor misses a submission; a mail relay that is down only delays it.
 */
async function notifyReviewers(trx: Knex.Transaction, actor: SessionUser, studyId: number, planId: number, planName: string): Promise<void> {
  const logged = await trx('readings').where({ plan_id: planId }).countDistinct({ n: 'point_id' }).first();
  const pointsLogged = Number(logged?.n ?? 0);
  if (pointsLogged === 0) throw conflict('Log at least one reading before sending the plan for review.');
  const supervisors = await activeMemberEmails(trx, studyId, ['supervisor']);
  const study = await trx('studies').where({ id: studyId }).first('name');
  const link = planReviewUrl(studyId, planId);
  const pointCount = Number((await trx('sweep_points').where({ plan_id: planId }).count({ n: '*' }).first())?.n ?? 0);
  const mail = planSubmittedMail({ studyName: study.name, planName, submitterName: actor.name, link, pointsLogged, pointCount });
  for (const supervisor of supervisors) {
    await enqueueMail(trx, { to: supervisor.email, ...mail }, { kind: 'plan.submitted', studyId });
  }
}

/** Computes the plan's predictions again on the same points (e.g. after the setup's coils changed). */
export async function recomputePredictions(actor: SessionUser, studyId: number, planId: number): Promise<PlanPrediction> {
  const runId = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    const row = await lockPlan(trx, studyId, planId);
    if (row.state === 'accepted') throw conflict('This plan is accepted: it keeps the predictions it was accepted against.');
    return beginPredictionRun(trx, planId);
  });
  void launchPredictionRun(planId, runId);
  return getPlanProgress(actor, studyId, planId);
}

/** Stops a running computation at its next batch; the earlier predictions stay. */
export async function cancelPredictions(actor: SessionUser, studyId: number, planId: number): Promise<PlanPrediction> {
  await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'study.edit', trx);
    await lockPlan(trx, studyId, planId);
    const updated = await trx('sweep_plans').where({ id: planId, prediction_status: 'running' }).update({ prediction_status: 'cancelled' });
    if (updated === 0) throw conflict('No computation is running for this plan.');
    await trx('sweep_points').where({ plan_id: planId }).update({ pending_predicted: null });
  });
  return getPlanProgress(actor, studyId, planId);
}
