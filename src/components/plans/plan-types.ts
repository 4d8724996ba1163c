/**
 * The plan API's JSON as the browser sees it (src/app/api/studies/[studyId]/plans/**). Values are SI
 * (m, deg, Hz, ohm); `displayUnit` says how the person typed an axis, so it is shown back that way.
 */
import type { Plan as ApiPlan, PlanPrediction } from '@/lib/data/plans';
import type { PlanPoint as ApiPlanPoint } from '@/lib/data/plan-points';
import type { PlanAxis } from '@/lib/plans/axes';
import type { OrderMode } from '@/lib/plans/order';
import type { PlanPose } from '@/lib/plans/points';
import type { PointPrediction as ApiPointPrediction, PredictionStatus as ApiPredictionStatus } from '@/lib/plans/prediction';
import type { PlanState as ApiPlanState } from '@/lib/plans/states';

export { AXIS_QUANTITIES, type AxisQuantity } from '@/lib/plans/axes';
export { ORDER_MODES, type OrderMode } from '@/lib/plans/order';
export { MAX_PLAN_POINTS } from '@/lib/plans/points';
export { PLAN_STATES } from '@/lib/plans/states';

// The server's own types (src/lib/plans, src/lib/data/plans*), imported as types only.
export type AxisSpec = PlanAxis;
export type Plan = ApiPlan;
export type PlanPoint = ApiPlanPoint;
export type PlanProgress = PlanPrediction;
export type PointPose = PlanPose;
export type PointPrediction = ApiPointPrediction;
export type PlanState = ApiPlanState;
export type PredictionStatus = ApiPredictionStatus;

/** The body of POST /plans and PATCH /plans/{planId}. */
export interface PlanInput {
  name: string;
  setupId: number;
  axes: AxisSpec[];
  repeats: number;
  referenceEvery: number | null;
  orderMode: OrderMode;
  shuffleSeed: number | null;
  minutesPerPoint: number;
  notes: string;
}

/** Our plain names for the states (PRODUCT.md), exactly as people read them. */
export { PLAN_STATE_LABELS as STATE_LABEL } from '@/lib/plans/states';

export const ORDER_LABEL: Record<OrderMode, string> = {
  as_listed: 'as listed',
  serpentine: 'serpentine (fewest fixture moves)',
  shuffled: 'shuffled',
};

export const PREDICTION_LABEL: Record<PredictionStatus, string> = {
  none: 'not computed',
  running: 'computing',
  done: 'predicted',
  failed: 'failed',
  cancelled: 'cancelled',
};
