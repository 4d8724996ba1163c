/**
 * A plan's measurement list: the cartesian product of its axes (first axis outermost), each
 * pose measured `repeats` times in a row, the reference pose (the first pose measured) measured again
 * after every `referenceEvery` measurements to catch drift, in the plan's order. Pure.
 */
import { AXIS_LABELS, axisValueCount, expandAxis, type AxisQuantity, type PlanAxis } from './axes';
import { orderGrid, type OrderMode } from './order';

/** Largest plan (points including repeats and reference points). */
export const MAX_PLAN_POINTS = 5000;
export const MAX_AXES = 5;

/** Where the receiver sits for one point, in SI; frequency and load only when an axis sets them. */
export interface PlanPose {
  /** [m] */
  distance: number;
  /** [m] */
  lateralOffset: number;
  /** [degrees] */
  tiltDeg: number;
  /** [Hz] */
  frequencyHz?: number;
  /** [ohm] */
  loadResistance?: number;
}

/** What a point's pose takes from the setup when no axis sets it. */
export type BasePose = Pick<PlanPose, 'distance' | 'lateralOffset' | 'tiltDeg'>;

export interface PlanLayout {
  axes: PlanAxis[];
  repeats: number;
  referenceEvery: number | null;
  orderMode: OrderMode;
  shuffleSeed: number | null;
}

export interface PlannedPoint {
  /** measurement order, 1..n */
  seq: number;
  /** 1..repeats; a reference point is 1 */
  repeatIndex: number;
  isReference: boolean;
  pose: PlanPose;
}

/** Reference measurements added to `measurements` points: one after every N, never as the last point. */
function referenceCount(measurements: number, every: number | null): number {
  return every && measurements > 0 ? Math.floor((measurements - 1) / every) : 0;
}

/** Points in the plan, computed from the counts alone (NaN when an axis is not well formed). */
export function planPointCount(layout: Pick<PlanLayout, 'axes' | 'repeats' | 'referenceEvery'>): number {
  const grid = layout.axes.reduce((n, axis) => n * axisValueCount(axis), 1);
  const measurements = grid * layout.repeats;
  return measurements + referenceCount(measurements, layout.referenceEvery);
}

/** Bench time [minutes]: every point, reference points included, at the plan's minutes per point. */
export function estimatedMinutes(pointCount: number, minutesPerPoint: number): number {
  return pointCount * minutesPerPoint;
}

/** Why a plan is too big, naming what multiplies up; null when it fits. */
export function oversizeMessage(layout: Pick<PlanLayout, 'axes' | 'repeats' | 'referenceEvery'>): string | null {
  const count = planPointCount(layout);
  if (!(count > MAX_PLAN_POINTS)) return null;
  const factors = layout.axes.map((axis) => `${axisValueCount(axis).toLocaleString('en')} ${AXIS_LABELS[axis.quantity]} values`);
  if (layout.repeats > 1) factors.push(`${layout.repeats} repeats`);
  const references = count - planPointCount({ ...layout, referenceEvery: null });
  const extra = references > 0 ? ` plus ${references.toLocaleString('en')} reference points` : '';
  return `This plan has ${count.toLocaleString('en')} points (${factors.join(' x ')}${extra}); at most ${MAX_PLAN_POINTS.toLocaleString('en')} are allowed. Use fewer values or repeats.`;
}

/** The plan's points in measurement order; throws when the plan is over MAX_PLAN_POINTS. */
export function buildPlanPoints(layout: PlanLayout, base: BasePose): PlannedPoint[] {
  const oversize = oversizeMessage(layout);
  if (oversize) throw new RangeError(oversize);
  const values = layout.axes.map(expandAxis);
  const order = orderGrid(values.map((v) => v.length), layout.orderMode, layout.shuffleSeed);
  const poses = order.map((digits) => {
    const pose: PlanPose = { ...base };
    digits.forEach((digit, k) => {
      (pose as unknown as Record<AxisQuantity, number>)[layout.axes[k].quantity] = values[k][digit];
    });
    return pose;
  });

  const points: PlannedPoint[] = [];
  let measured = 0;
  const total = poses.length * layout.repeats;
  for (const pose of poses) {
    for (let r = 1; r <= layout.repeats; r++) {
      points.push({ seq: points.length + 1, repeatIndex: r, isReference: false, pose });
      measured++;
      if (layout.referenceEvery && measured % layout.referenceEvery === 0 && measured < total) {
        points.push({ seq: points.length + 1, repeatIndex: 1, isReference: true, pose: poses[0] });
      }
    }
  }
  return points;
}
