import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import type { PlanAxis } from '../plans/axes';
import type { PlanState } from '../plans/states';
import { assembleReview, type ReviewPoint, type ReviewReading } from '../review/assemble';
import type { AgreementSummary, FitResult, OutlierMark, PlanDecision, PlanReview, ReviewQuantity } from '../review/types';
import type { MeasurementMethod } from '../../physics/measurement/methods';
import type { Derivation } from '../../physics/measurement/types';
import { latestFit } from './plan-fits';
import { fromJsonColumn } from './json-column';
import { planOfStudy, type PlanLock } from './plan-lookup';
import { planPointRows } from './plan-points';

/**
 * Loading a plan's review: points, current readings, marks, the latest fit and the decisions, then
 * the pure assembly in src/lib/review/assemble.ts. Readers need only see the study.
 */

interface PlanHead {
  id: number;
  study_id: number;
  name: string;
  state: PlanState;
  axes: unknown;
  review_tolerance: number;
}

export const lockablePlanHead = (trx: Knex | Knex.Transaction, studyId: number, planId: number, lock: PlanLock = null): Promise<PlanHead> =>
  planOfStudy<PlanHead>(trx, studyId, planId, ['id', 'study_id', 'name', 'state', 'axes', 'review_tolerance'], lock);

/** The plan's points as the review reads them. */
export const reviewPoints = (trx: Knex | Knex.Transaction, planId: number): Promise<ReviewPoint[]> => planPointRows(trx, planId);

/** The current version of every reading of the plan (no later version of the same point and method). */
export async function currentReadings(trx: Knex | Knex.Transaction, planId: number): Promise<ReviewReading[]> {
  const rows: { id: number | string; point_id: number | string; method: MeasurementMethod; derived: unknown }[] = await trx('readings as r')
    .where('r.plan_id', planId)
    .whereNotExists(
      trx('readings as later').select(trx.raw('1'))
        .whereRaw('later.point_id = r.point_id AND later.method = r.method AND later.version > r.version'),
    )
    .select('r.id', 'r.point_id', 'r.method', 'r.derived');
  return rows.map((row) => ({ id: Number(row.id), pointId: Number(row.point_id), method: row.method, derived: fromJsonColumn<Derivation>(row.derived) }));
}

export async function outlierMarks(trx: Knex | Knex.Transaction, planId: number): Promise<OutlierMark[]> {
  const rows: { point_id: number | string; seq: number; reason: string; marked_by: number; name: string; created_at: Date }[] = await trx('outlier_marks')
    .join('sweep_points', 'sweep_points.id', 'outlier_marks.point_id')
    .join('users', 'users.id', 'outlier_marks.marked_by')
    .where('outlier_marks.plan_id', planId)
    .orderBy('sweep_points.seq')
    .select('outlier_marks.point_id', 'sweep_points.seq', 'outlier_marks.reason', 'outlier_marks.marked_by', 'users.name', 'outlier_marks.created_at');
  return rows.map((row) => ({
    pointId: Number(row.point_id), seq: row.seq, reason: row.reason,
    markedBy: { id: row.marked_by, name: row.name }, createdAt: new Date(row.created_at).toISOString(),
  }));
}

export async function planDecisions(trx: Knex | Knex.Transaction, planId: number): Promise<PlanDecision[]> {
  const rows: { id: number | string; decision: PlanDecision['decision']; reason: string | null; reviewer_id: number; name: string; summary: unknown; created_at: Date }[] =
    await trx('plan_reviews')
      .join('users', 'users.id', 'plan_reviews.reviewer_id')
      .where('plan_reviews.plan_id', planId)
      .orderBy('plan_reviews.created_at')
      .orderBy('plan_reviews.id')
      .select('plan_reviews.*', 'users.name');
  return rows.map((row) => ({
    id: Number(row.id), decision: row.decision, reason: row.reason ?? '',
    reviewer: { id: row.reviewer_id, name: row.name }, createdAt: new Date(row.created_at).toISOString(),
    summary: row.summary === null ? null : fromJsonColumn<AgreementSummary>(row.summary),
  }));
}

/** Everything the review of one quantity needs, read in one transaction so the parts agree. */
export async function reviewWithin(
  trx: Knex | Knex.Transaction,
  head: PlanHead,
  quantity: ReviewQuantity,
  fit?: FitResult | null,
  /** the plan's points when the caller has read them already (a fit needs them too) */
  pointsRead?: ReviewPoint[],
): Promise<PlanReview> {
  const [points, readings, marks, decisions, latest] = [
    pointsRead ?? await reviewPoints(trx, head.id),
    await currentReadings(trx, head.id),
    await outlierMarks(trx, head.id),
    await planDecisions(trx, head.id),
    fit === undefined ? await latestFit(trx, head.id, quantity) : fit,
  ];
  return assembleReview({
    plan: { id: head.id, studyId: head.study_id, name: head.name, state: head.state, axes: fromJsonColumn<PlanAxis[]>(head.axes), pointCount: points.length },
    quantity,
    tolerance: head.review_tolerance,
    points,
    readings,
    marks,
    fit: latest,
    decisions,
  });
}

/** The review of one quantity of a plan, for anyone who can see the study. */
export async function getPlanReview(viewer: SessionUser, studyId: number, planId: number, quantity: ReviewQuantity): Promise<PlanReview> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  return db.transaction(async (trx) => reviewWithin(trx, await lockablePlanHead(trx, studyId, planId), quantity));
}
