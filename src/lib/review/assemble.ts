/**
 * A plan's review built from its points, current readings, marks and latest fit. Pure, so the page,
 * the PDF and the tests all see the same numbers: the server loads rows and calls this.
 *
 * Rules (they are also stated on the review page):
 * - an observation is one current reading's value of the quantity at one point, compared with that
 *   point's prediction; the automatic outlier rule flags it (src/physics/review/outliers.ts);
 * - points set aside by hand leave their observations out of the means, the summary and the fits;
 * - every distinct pose counts once in the summary, with the mean of its observations (repeats,
 *   reference revisits and methods together), so a pose measured five times does not outweigh others.
 */
import { compareToPrediction, errorMetrics, meanOfObservations } from '../../physics/review/agreement';
import { isAutoOutlier } from '../../physics/review/outliers';
import type { MeasurementMethod } from '../../physics/measurement/methods';
import type { Derivation } from '../../physics/measurement/types';
import type { PlanPoint } from '../data/plan-points';
import { poseKey } from '../plans/solve-job';
import type {
  AgreementSummary, FitResult, OutlierMark, PlanDecision, PlanReview, ReviewObservation, ReviewPose, ReviewQuantity,
} from './types';

/** A plan point as the review needs it (the run sheet's point; its solver version is not needed). */
export type ReviewPoint = Omit<PlanPoint, 'solverVersion'>;

export interface ReviewReading {
  id: number;
  pointId: number;
  method: MeasurementMethod;
  derived: Derivation;
}

export interface ReviewInput {
  plan: PlanReview['plan'];
  quantity: ReviewQuantity;
  tolerance: number;
  /** every point of the plan */
  points: readonly ReviewPoint[];
  /** the current version of each reading only */
  readings: readonly ReviewReading[];
  marks: readonly OutlierMark[];
  fit: FitResult | null;
  decisions: readonly PlanDecision[];
}

const predictedOf = (point: ReviewPoint, quantity: ReviewQuantity): number | null => {
  const value = point.predicted?.[quantity];
  return value === undefined || value === null || !Number.isFinite(value) ? null : value;
};

function observationsOf(input: ReviewInput, setAside: ReadonlySet<number>): ReviewObservation[] {
  const points = new Map(input.points.map((p) => [p.id, p]));
  const observations: ReviewObservation[] = [];
  for (const reading of input.readings) {
    const measured = reading.derived[input.quantity];
    const point = points.get(reading.pointId);
    if (!measured || !point || !Number.isFinite(measured.value)) continue;
    const predicted = predictedOf(point, input.quantity);
    const comparison = predicted === null ? null : compareToPrediction(measured.value, measured.uncertainty, predicted);
    observations.push({
      readingId: reading.id,
      pointId: point.id,
      seq: point.seq,
      repeatIndex: point.repeatIndex,
      isReference: point.isReference,
      poseKey: poseKey(point.pose),
      method: reading.method,
      value: measured.value,
      uncertainty: measured.uncertainty,
      residual: comparison?.residual ?? null,
      relative: comparison?.relative ?? null,
      normalized: comparison?.normalized ?? null,
      autoOutlier: isAutoOutlier(comparison?.normalized ?? null),
      setAside: setAside.has(point.id),
    });
  }
  return observations.sort((a, b) => a.seq - b.seq || a.method.localeCompare(b.method));
}

function posesOf(input: ReviewInput, observations: readonly ReviewObservation[]): ReviewPose[] {
  const refit = new Map((input.fit?.repredicted ?? []).map((r) => [r.poseKey, r.value]));
  const byKey = new Map<string, ReviewPose>();
  for (const point of [...input.points].sort((a, b) => a.seq - b.seq)) {
    const key = poseKey(point.pose);
    const pose = byKey.get(key);
    if (pose) {
      pose.pointIds.push(point.id);
      pose.seqs.push(point.seq);
      pose.predicted ??= predictedOf(point, input.quantity);
      continue;
    }
    byKey.set(key, {
      key, pose: point.pose, pointIds: [point.id], seqs: [point.seq], predicted: predictedOf(point, input.quantity),
      measured: null, residual: null, relative: null, normalized: null, autoOutlier: false, refit: refit.get(key) ?? null,
    });
  }
  for (const pose of byKey.values()) {
    const kept = observations.filter((o) => o.poseKey === pose.key && !o.setAside);
    if (kept.length === 0) continue;
    pose.measured = meanOfObservations(kept);
    if (pose.predicted === null) continue;
    const comparison = compareToPrediction(pose.measured.mean, pose.measured.uncertainty, pose.predicted);
    Object.assign(pose, comparison, { autoOutlier: isAutoOutlier(comparison.normalized) });
  }
  return [...byKey.values()];
}

function summaryOf(input: ReviewInput, poses: readonly ReviewPose[], observations: readonly ReviewObservation[]): AgreementSummary {
  const compared = poses.filter((p) => p.measured !== null && p.relative !== null);
  const metrics = errorMetrics(compared.map((p) => p.relative), input.tolerance);
  return {
    compared: compared.length,
    observations: compared.reduce((n, p) => n + (p.measured?.n ?? 0), 0),
    rmsRelative: metrics.rmsRelative,
    maxRelative: metrics.maxRelative,
    bias: metrics.bias,
    tolerance: input.tolerance,
    outsideTolerance: metrics.outsideTolerance,
    autoOutliers: observations.filter((o) => o.autoOutlier).length,
    setAside: input.marks.length,
  };
}

export function assembleReview(input: ReviewInput): PlanReview {
  const setAside = new Set(input.marks.map((m) => m.pointId));
  const observations = observationsOf(input, setAside);
  const poses = posesOf(input, observations);
  return {
    plan: input.plan,
    quantity: input.quantity,
    tolerance: input.tolerance,
    poses,
    observations,
    summary: summaryOf(input, poses, observations),
    marks: [...input.marks],
    fit: input.fit,
    decisions: [...input.decisions],
  };
}
