/**
 * The review of a plan as the API serves it and the review page, the PDF and the CSV export read it.
 * Types only (no server imports), so client components can use them. Values are SI; relative errors
 * are fractions (0.05 = 5 %).
 */
import type { PlanAxis } from '../plans/axes';
import type { PlanPose } from '../plans/points';
import type { PlanState } from '../plans/states';
import type { MeasurementMethod } from '../../physics/measurement/methods';
import type { StudyRole } from '../auth/permissions';

/** What is compared: each is derived from readings and predicted for every point. */
export const REVIEW_QUANTITIES = ['coupling', 'mutualInductance', 'efficiency'] as const;
export type ReviewQuantity = (typeof REVIEW_QUANTITIES)[number];

export const REVIEW_QUANTITY_LABELS: Record<ReviewQuantity, { label: string; symbol: string; unit: string }> = {
  coupling: { label: 'Coupling coefficient', symbol: 'k', unit: '' },
  mutualInductance: { label: 'Mutual inductance', symbol: 'M', unit: 'H' },
  efficiency: { label: 'Link efficiency', symbol: 'η', unit: '' },
};

/** One current reading's value of the quantity at one plan point, against the point's prediction. */
export interface ReviewObservation {
  readingId: number;
  pointId: number;
  seq: number;
  repeatIndex: number;
  isReference: boolean;
  poseKey: string;
  method: MeasurementMethod;
  value: number;
  /** standard uncertainty of `value` (GUM, from the reading's derivation) */
  uncertainty: number;
  /** value - predicted, or null without a prediction */
  residual: number | null;
  /** residual / predicted */
  relative: number | null;
  /** residual / uncertainty */
  normalized: number | null;
  /** |normalized| > OUTLIER_SIGMA (src/physics/review/outliers.ts) */
  autoOutlier: boolean;
  /** set aside by hand (an outlier mark on its point): left out of means, summary and fits */
  setAside: boolean;
}

/** Mean of the observations at one distinct pose (repeats, reference revisits and methods together). */
export interface MeasuredMean {
  mean: number;
  /** sqrt(u_B^2 + s^2/n): instrument part (rms of the readings' uncertainties) plus scatter of the mean */
  uncertainty: number;
  /** observations averaged */
  n: number;
}

/** One distinct pose of the plan with its prediction and the mean of what was measured there. */
export interface ReviewPose {
  key: string;
  pose: PlanPose;
  /** the plan points at this pose (repeats and reference revisits) */
  pointIds: number[];
  seqs: number[];
  predicted: number | null;
  /** null when nothing (not set aside) was measured here */
  measured: MeasuredMean | null;
  residual: number | null;
  relative: number | null;
  normalized: number | null;
  autoOutlier: boolean;
  /** the latest fit's re-predicted value here, or null without a fit */
  refit: number | null;
}

export interface AgreementSummary {
  /** poses with both a measured mean and a prediction */
  compared: number;
  /** observations behind them */
  observations: number;
  /** sqrt(mean(relative^2)) over compared poses, or null when none */
  rmsRelative: number | null;
  /** the relative error of largest magnitude (signed), or null */
  maxRelative: number | null;
  /** mean relative error (signed) */
  bias: number | null;
  /** the tolerance the summary counts against (fraction) */
  tolerance: number;
  /** compared poses with |relative| > tolerance */
  outsideTolerance: number;
  /** observations flagged by the automatic rule */
  autoOutliers: number;
  /** points set aside by hand */
  setAside: number;
}

export interface PersonRef {
  id: number;
  name: string;
}

/** A point set aside by hand as an outlier, with why. */
export interface OutlierMark {
  pointId: number;
  seq: number;
  reason: string;
  markedBy: PersonRef;
  createdAt: string;
}

/** Effective parameters a fit can estimate (src/lib/review/fit-models.ts). */
export const FIT_MODELS = ['tilt_offset', 'lateral_offset', 'distance_offset', 'extra_rx_resistance'] as const;
export type FitModel = (typeof FIT_MODELS)[number];

export const FIT_MODEL_INFO: Record<FitModel, { label: string; unit: string; quantities: readonly ReviewQuantity[]; explains: string }> = {
  tilt_offset: {
    label: 'Tilt error', unit: '°', quantities: ['coupling', 'mutualInductance'],
    explains: 'a fixed angle added to every planned tilt, as from a fixture that sits crooked',
  },
  lateral_offset: {
    label: 'Lateral offset error', unit: 'm', quantities: ['coupling', 'mutualInductance'],
    explains: 'a fixed sideways shift added to every planned offset, as from coils centred off their marks',
  },
  distance_offset: {
    label: 'Distance error', unit: 'm', quantities: ['coupling', 'mutualInductance'],
    explains: 'a fixed length added to every planned distance, as from measuring to the wrong face of a former',
  },
  extra_rx_resistance: {
    label: 'Extra receiver loss resistance', unit: 'Ω', quantities: ['efficiency'],
    explains: 'a series resistance added to the receiver coil, as from connectors, solder joints or capacitor ESR',
  },
};

/** A least-squares estimate of one effective parameter, kept apart from the plan's prediction. */
export interface FitResult {
  id: number;
  model: FitModel;
  quantity: ReviewQuantity;
  /** SI except tilt in degrees */
  value: number;
  /** standard uncertainty, scaled by sqrt(reduced chi-square) when that exceeds 1 */
  uncertainty: number;
  /** poses used (not set aside, with a measured mean and a prediction) */
  posesUsed: number;
  chiSquare: number;
  reducedChiSquare: number | null;
  /** rms relative error of the measured means against the re-predicted values */
  rmsRelativeAfter: number | null;
  /** re-predicted value of the quantity at every pose of the plan */
  repredicted: { poseKey: string; value: number }[];
  solverVersion: string;
  createdBy: PersonRef;
  createdAt: string;
}

export const REVIEW_DECISIONS = ['accepted', 'returned'] as const;
export type ReviewDecision = (typeof REVIEW_DECISIONS)[number];

/** A supervisor's decision on a plan in review, with the summary they decided on. */
export interface PlanDecision {
  id: number;
  decision: ReviewDecision;
  reason: string;
  reviewer: PersonRef;
  createdAt: string;
  /** the coupling summary at the time of the decision, or null when nothing was compared */
  summary: AgreementSummary | null;
}

/** A comment on the plan (pointId null) or on one of its points. */
export interface PlanComment {
  id: number;
  pointId: number | null;
  seq: number | null;
  body: string;
  author: PersonRef & { role: StudyRole | 'admin' };
  createdAt: string;
}

/** GET /api/studies/{id}/plans/{planId}/review?quantity=... */
export interface PlanReview {
  plan: { id: number; studyId: number; name: string; state: PlanState; axes: PlanAxis[]; pointCount: number };
  quantity: ReviewQuantity;
  tolerance: number;
  poses: ReviewPose[];
  observations: ReviewObservation[];
  summary: AgreementSummary;
  marks: OutlierMark[];
  /** the latest fit for this quantity, or null */
  fit: FitResult | null;
  decisions: PlanDecision[];
}
