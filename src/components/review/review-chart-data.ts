import { toDisplayNumber, shownUnit } from '@/components/plans/axis-units';
import type { AxisQuantity, AxisSpec } from '@/components/plans/plan-types';
import type { ReviewObservation, ReviewPose } from '@/lib/review/types';

/**
 * Chart data for the review page, pure so it can be tested. Chart options (colours, symbols, how the
 * bars are drawn) are in review-chart-options.ts; this file only decides what is plotted where.
 */

/** How a reading is drawn: set aside by hand wins over the automatic flag. */
export type PointKind = 'ordinary' | 'autoOutlier' | 'setAside';
export const POINT_KINDS: readonly PointKind[] = ['ordinary', 'autoOutlier', 'setAside'];

export const kindOf = (o: Pick<ReviewObservation, 'setAside' | 'autoOutlier'>): PointKind => (o.setAside ? 'setAside' : o.autoOutlier ? 'autoOutlier' : 'ordinary');

const distinctSorted = (values: readonly number[]) => [...new Set(values)].sort((a, b) => a - b);
const byX = <T extends readonly number[]>(a: T, b: T) => a[0] - b[0];

export interface MeasuredPoint {
  x: number;
  mean: number;
  uncertainty: number;
  n: number;
  seqs: number[];
}

export interface AxisSeries {
  /** the series axis value in display units ("30 deg"); "" without a series axis */
  name: string;
  /** [x in display units, predicted SI], sorted by x */
  predicted: [number, number][];
  /** measured means with their standard uncertainty, sorted by x */
  measured: MeasuredPoint[];
  /** the latest fit's re-predicted values, sorted by x; empty without a fit */
  refit: [number, number][];
}

export interface HeldAxis {
  quantity: AxisQuantity;
  /** display units */
  value: number;
  unit: string;
}

export interface AxisChartData {
  series: AxisSeries[];
  /** axes neither on x nor the series axis, each held at one value */
  held: HeldAxis[];
}

/**
 * Predicted against measured over one swept axis, one series per value of `seriesAxis`. Axes not
 * shown are held at one value: the smallest value that has a measured mean, so the chart shows
 * measurements whenever there are any (the smallest value of all when nothing is measured).
 */
export function buildAxisChart(poses: readonly ReviewPose[], axes: readonly AxisSpec[], xAxis: AxisQuantity, seriesAxis: AxisQuantity | null): AxisChartData {
  const x = axes.find((a) => a.quantity === xAxis);
  if (!x) return { series: [], held: [] };
  const s = seriesAxis && seriesAxis !== xAxis ? axes.find((a) => a.quantity === seriesAxis) : undefined;
  const heldSpecs = axes.filter((a) => a.quantity !== xAxis && a.quantity !== s?.quantity);
  const measured = poses.filter((p) => p.measured !== null);
  const held = heldSpecs.map((a) => {
    const from = measured.length > 0 ? measured : poses;
    return { spec: a, si: Math.min(...from.map((p) => p.pose[a.quantity] ?? Number.POSITIVE_INFINITY)) };
  });
  const rows = poses.filter((p) => held.every((h) => p.pose[h.spec.quantity] === h.si));
  const display = (p: ReviewPose) => toDisplayNumber(p.pose[xAxis] ?? 0, xAxis, x.displayUnit);
  const groups = s ? distinctSorted(rows.map((p) => p.pose[s.quantity] ?? 0)) : [null];

  const series = groups.map((group): AxisSeries => {
    const members = s ? rows.filter((p) => (p.pose[s.quantity] ?? 0) === group) : rows;
    return {
      name: s && group !== null ? `${toDisplayNumber(group, s.quantity, s.displayUnit)} ${shownUnit(s.quantity, s.displayUnit)}` : '',
      predicted: members.filter((p) => p.predicted !== null).map((p): [number, number] => [display(p), p.predicted!]).sort(byX),
      measured: members
        .filter((p) => p.measured !== null)
        .map((p) => ({ x: display(p), mean: p.measured!.mean, uncertainty: p.measured!.uncertainty, n: p.measured!.n, seqs: p.seqs }))
        .sort((a, b) => a.x - b.x),
      refit: members.filter((p) => p.refit !== null).map((p): [number, number] => [display(p), p.refit!]).sort(byX),
    };
  });
  return {
    series,
    held: held.map((h) => ({ quantity: h.spec.quantity, value: toDisplayNumber(h.si, h.spec.quantity, h.spec.displayUnit), unit: shownUnit(h.spec.quantity, h.spec.displayUnit) })),
  };
}

export interface ParityPoint {
  predicted: number;
  measured: number;
  uncertainty: number;
  relative: number | null;
  seq: number;
  method: ReviewObservation['method'];
}

export interface ParityBand {
  /** half-width as a fraction: 0.05 is the ±5 % band */
  fraction: number;
  /** corners of the band between measured = (1 - f) predicted and (1 + f) predicted over the range */
  polygon: [number, number][];
}

export interface ParityData {
  points: Record<PointKind, ParityPoint[]>;
  /** the common range of both axes, padded and widened to whole ticks; null when nothing can be plotted */
  range: [number, number] | null;
  /** the tick step of both axes */
  step: number;
  bands: ParityBand[];
}

/** The shaded bands of the parity plot, as fractions of the prediction. */
export const PARITY_BANDS = [0.1, 0.05] as const;
/** Space around the data on the parity plot, as a fraction of its span. */
const RANGE_PADDING = 0.05;

/** Both ends of the values' span, widened by `padding` of the span (or of the value when all are equal). */
export function paddedRange(values: readonly number[], padding = RANGE_PADDING): [number, number] | null {
  const finite = values.filter(Number.isFinite);
  if (finite.length === 0) return null;
  const lo = Math.min(...finite);
  const hi = Math.max(...finite);
  const span = hi - lo || Math.abs(hi) || 1;
  return [lo - span * padding, hi + span * padding];
}

/** A tick step of 1, 2 or 5 times a power of ten that cuts `span` into about `ticks` parts. */
export function niceStep(span: number, ticks = 5): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / ticks;
  const magnitude = 10 ** Math.floor(Math.log10(raw));
  const f = raw / magnitude;
  const nice = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
  return nice * magnitude;
}

/** Twelve significant digits: 0.006000000000000001 -> 0.006, so tick labels read as typed. */
const clean = (v: number) => Number(v.toPrecision(12));

/** `range` widened out to whole tick steps, with the step, so both ends get a round label. */
export function niceRange(range: [number, number]): { range: [number, number]; step: number } {
  const step = niceStep(range[1] - range[0]);
  return { range: [clean(Math.floor(range[0] / step) * step), clean(Math.ceil(range[1] / step) * step)], step };
}

/**
 * Each reading with a prediction as one point (measured up, predicted across), grouped by how it is
 * drawn, with the line of equality's range and the ±10 % and ±5 % bands around it. Across zero the
 * band's corners make a bow-tie that meets at the origin, which is where the band really is.
 */
export function buildParity(observations: readonly ReviewObservation[]): ParityData {
  const points: Record<PointKind, ParityPoint[]> = { ordinary: [], autoOutlier: [], setAside: [] };
  for (const o of observations) {
    if (o.residual === null) continue;
    points[kindOf(o)].push({ predicted: o.value - o.residual, measured: o.value, uncertainty: o.uncertainty, relative: o.relative, seq: o.seq, method: o.method });
  }
  const all = POINT_KINDS.flatMap((k) => points[k]);
  const padded = paddedRange(all.flatMap((p) => [p.predicted, p.measured]));
  const nice = padded ? niceRange(padded) : null;
  const range = nice?.range ?? null;
  const bands = range
    ? PARITY_BANDS.map((fraction) => {
        const [lo, hi] = range;
        const polygon: [number, number][] = [[lo, lo * (1 - fraction)], [hi, hi * (1 - fraction)], [hi, hi * (1 + fraction)], [lo, lo * (1 + fraction)]];
        return { fraction, polygon };
      })
    : [];
  return { points, range, step: nice?.step ?? 1, bands };
}

export interface ResidualPoint {
  /** the chosen axis in display units */
  x: number;
  /** relative error in percent */
  percent: number;
  seq: number;
  method: ReviewObservation['method'];
}

export interface ResidualData {
  points: Record<PointKind, ResidualPoint[]>;
  /** x range of the chart, padded, so the zero line and tolerance band span it; null without points */
  xRange: [number, number] | null;
  /** the tolerance in percent */
  tolerancePercent: number;
}

/** Every reading's relative error [%] against one axis, across all poses, grouped by how it is drawn. */
export function buildResiduals(observations: readonly ReviewObservation[], poses: readonly ReviewPose[], axes: readonly AxisSpec[], xAxis: AxisQuantity, tolerance: number): ResidualData {
  const points: Record<PointKind, ResidualPoint[]> = { ordinary: [], autoOutlier: [], setAside: [] };
  const x = axes.find((a) => a.quantity === xAxis);
  const poseByKey = new Map(poses.map((p) => [p.key, p.pose]));
  if (x) {
    for (const o of observations) {
      const pose = poseByKey.get(o.poseKey);
      if (o.relative === null || !pose) continue;
      points[kindOf(o)].push({ x: toDisplayNumber(pose[xAxis] ?? 0, xAxis, x.displayUnit), percent: o.relative * 100, seq: o.seq, method: o.method });
    }
  }
  const xRange = paddedRange(POINT_KINDS.flatMap((k) => points[k].map((p) => p.x)));
  return { points, xRange, tolerancePercent: tolerance * 100 };
}
