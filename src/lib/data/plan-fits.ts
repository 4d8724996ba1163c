import 'server-only';
import type { Knex } from 'knex';
import { SOLVER_VERSION } from '../../physics';
import { errorMetrics } from '../../physics/review/agreement';
import { efficiencyWithExtraReceiverResistance } from '../../physics/review/extra-resistance';
import { FitInputError, fitOneParameter } from '../../physics/review/least-squares';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import { conflict, HttpError, unprocessable } from '../http/errors';
import type { PlanState } from '../plans/states';
import type { PlanPose } from '../plans/points';
import type { PointPrediction } from '../plans/prediction';
import { poseKey, type PlanSetupGeometry } from '../plans/solve-job';
import { solvePoses } from '../plans/solve-poses';
import { isPoseModel, offsetPose, predictedLink, searchRange } from '../review/fit-models';
import { FIT_MODEL_INFO, REVIEW_QUANTITY_LABELS, type FitModel, type FitResult, type ReviewQuantity } from '../review/types';
import { recordAudit } from './audit';
import { fromJsonColumn, toJsonColumn } from './json-column';
import { loadGeometry, planPool } from './plan-predictions';
import { lockablePlanHead, reviewPoints, reviewWithin } from './review';

/**
 * Fits of one effective parameter to a plan's measured means by weighted least squares
 * (src/physics/review/least-squares.ts). A fit is stored beside the plan, never over its prediction:
 * the re-predicted values live in their own row, one row per run, and the review shows the latest.
 */

interface FitRow {
  id: number | string;
  model: FitModel;
  quantity: ReviewQuantity;
  value: number;
  uncertainty: number;
  poses_used: number;
  chi_square: number;
  reduced_chi_square: number | null;
  rms_relative_after: number | null;
  repredicted: unknown;
  solver_version: string;
  created_by: number;
  name: string;
  created_at: Date;
}

function toFit(row: FitRow): FitResult {
  return {
    id: Number(row.id), model: row.model, quantity: row.quantity, value: row.value, uncertainty: row.uncertainty,
    posesUsed: row.poses_used, chiSquare: row.chi_square, reducedChiSquare: row.reduced_chi_square, rmsRelativeAfter: row.rms_relative_after,
    repredicted: fromJsonColumn<FitResult['repredicted']>(row.repredicted), solverVersion: row.solver_version,
    createdBy: { id: row.created_by, name: row.name }, createdAt: new Date(row.created_at).toISOString(),
  };
}

function fitQuery(trx: Knex | Knex.Transaction, planId: number) {
  return trx('plan_fits').join('users', 'users.id', 'plan_fits.created_by').where('plan_fits.plan_id', planId).select('plan_fits.*', 'users.name');
}

/** The newest fit of the quantity on this plan, or null. */
export async function latestFit(trx: Knex | Knex.Transaction, planId: number, quantity: ReviewQuantity): Promise<FitResult | null> {
  const row: FitRow | undefined = await fitQuery(trx, planId).where('plan_fits.quantity', quantity).orderBy('plan_fits.id', 'desc').first();
  return row ? toFit(row) : null;
}

/** Every fit of the plan, oldest first (for the report). */
export async function listFits(trx: Knex | Knex.Transaction, planId: number): Promise<FitResult[]> {
  const rows: FitRow[] = await fitQuery(trx, planId).orderBy('plan_fits.id');
  return rows.map(toFit);
}

interface PosePoint {
  key: string;
  pose: PlanPose;
  predicted: PointPrediction;
}

/** The quantity at each pose for parameter value `p`, under `model`. */
function modelEvaluator(model: FitModel, quantity: ReviewQuantity, geometry: PlanSetupGeometry, owner: string) {
  return async (points: readonly PosePoint[], p: number): Promise<number[]> => {
    if (!isPoseModel(model)) {
      return points.map((point) => efficiencyWithExtraReceiverResistance(predictedLink(geometry.circuit, point.pose, point.predicted), p));
    }
    const pool = await planPool();
    // the operator's field is not needed to fit k or M
    const predictions = await solvePoses(pool, { ...geometry, operatorPoint: null }, points.map((point) => offsetPose(model, point.pose, p)), owner);
    return predictions.map((prediction) => prediction[quantity]);
  };
}

/** What the person can act on, never internals: which parameter value the solver could not take. */
function evaluationFailure(model: FitModel, error: unknown): HttpError {
  if (error instanceof HttpError && error.status !== 422) return error;
  console.error('Fit evaluation failed', error);
  return unprocessable(`The ${FIT_MODEL_INFO[model].label.toLowerCase()} could not be fitted: the solver could not evaluate the model across the search range. Set aside points that sit near a limit of the setup, or choose another parameter.`, [{ path: 'model', message: 'Choose another parameter or set points aside.' }]);
}

/** An accepted plan's review is closed: its figures stay as they were accepted. */
function refuseClosedReview(state: PlanState): void {
  if (state === 'accepted') throw conflict('This plan is accepted: its review is closed.');
}

export interface FitInput {
  model: FitModel;
  quantity: ReviewQuantity;
}

/** Fits one effective parameter to the plan's measured means of `quantity` (researchers, supervisors). */
export async function runFit(actor: SessionUser, studyId: number, planId: number, input: FitInput): Promise<FitResult> {
  await requireStudyAccess(actor, studyId, 'review.analyse');
  const info = FIT_MODEL_INFO[input.model];
  if (!info.quantities.includes(input.quantity)) {
    throw unprocessable('Some fields need attention.', [{ path: 'model', message: `${info.label} explains ${info.quantities.map((q) => REVIEW_QUANTITY_LABELS[q].label.toLowerCase()).join(' or ')}, not ${REVIEW_QUANTITY_LABELS[input.quantity].label.toLowerCase()}.` }]);
  }
  const head = await lockablePlanHead(db, studyId, planId);
  refuseClosedReview(head.state);
  const points = await reviewPoints(db, planId);
  const review = await reviewWithin(db, head, input.quantity, null, points);
  const predictedByKey = new Map<string, PointPrediction>();
  for (const point of points) if (point.predicted) predictedByKey.set(poseKey(point.pose), point.predicted);
  const all: PosePoint[] = review.poses.flatMap((p) => (predictedByKey.has(p.key) ? [{ key: p.key, pose: p.pose, predicted: predictedByKey.get(p.key)! }] : []));
  const used = review.poses.filter((p) => p.measured !== null && p.predicted !== null && predictedByKey.has(p.key));
  if (used.length < 2) {
    throw unprocessable('Some fields need attention.', [{ path: 'quantity', message: `A fit needs measured ${REVIEW_QUANTITY_LABELS[input.quantity].label.toLowerCase()} at two or more poses with predictions; this plan has ${used.length}.` }]);
  }
  const geometry = await loadGeometry(planId);
  if (!geometry) throw unprocessable('The plan has no setup to fit against.');
  const evaluate = modelEvaluator(input.model, input.quantity, geometry, `plan-fit:${planId}`);
  const usedPoints = used.map((p) => ({ key: p.key, pose: p.pose, predicted: predictedByKey.get(p.key)! }));
  const range = searchRange(input.model, usedPoints.map((p) => p.pose), usedPoints.map((p) => p.predicted));

  let fit;
  let repredictedValues: number[];
  try {
    fit = await fitOneParameter({
      evaluate: (p) => evaluate(usedPoints, p),
      measured: used.map((p) => p.measured!.mean),
      uncertainties: used.map((p) => p.measured!.uncertainty),
      ...range,
    });
    repredictedValues = await evaluate(all, fit.value);
  } catch (error) {
    if (error instanceof FitInputError) throw unprocessable('Some fields need attention.', [{ path: 'quantity', message: error.message }]);
    throw evaluationFailure(input.model, error);
  }
  if (!Number.isFinite(fit.uncertainty)) {
    throw unprocessable('Some fields need attention.', [{ path: 'model', message: `The measured poses do not depend on the ${info.label.toLowerCase()}, so it cannot be estimated from them.` }]);
  }
  const after = errorMetrics(used.map((p, i) => (fit.fitted[i] === 0 ? null : (p.measured!.mean - fit.fitted[i]) / Math.abs(fit.fitted[i]))), review.tolerance);
  const repredicted = all.map((p, i) => ({ poseKey: p.key, value: repredictedValues[i] }));

  const id = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'review.analyse', trx);
    refuseClosedReview((await lockablePlanHead(trx, studyId, planId, 'share')).state);
    const [inserted] = await trx('plan_fits').insert({
      plan_id: planId, model: input.model, quantity: input.quantity, value: fit.value, uncertainty: fit.uncertainty,
      poses_used: used.length, chi_square: fit.chiSquare, reduced_chi_square: fit.reducedChiSquare, rms_relative_after: after.rmsRelative,
      repredicted: toJsonColumn(repredicted), solver_version: SOLVER_VERSION, created_by: actor.id,
    });
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'fit.run', targetTable: 'plan_fits', targetId: inserted,
      details: { planId, planName: head.name, model: input.model, quantity: input.quantity, value: fit.value, uncertainty: fit.uncertainty },
    });
    return inserted as number;
  });
  const row: FitRow = await fitQuery(db, planId).where('plan_fits.id', id).first();
  return toFit(row);
}
