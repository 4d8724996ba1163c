import { toDisplayNumber } from './axis-units';
import type { AxisQuantity, AxisSpec, PlanPoint } from './plan-types';
import type { PredictedKey } from './predicted-quantities';

/**
 * Chart data from a plan's points, pure so it can be tested. Only first-repeat (repeatIndex 1), non-reference points
 * are plotted (repeats and drift checks predict the same value), and axes not on the chart are held at
 * the first value they take, so each line or cell is one planned pose.
 */

export const poseValue = (point: PlanPoint, quantity: AxisQuantity): number | undefined => point.pose[quantity];

function plotted(points: readonly PlanPoint[], axes: readonly AxisSpec[], shown: readonly AxisQuantity[]): PlanPoint[] {
  const firstRepeat = Math.min(...points.map((p) => p.repeatIndex));
  const base = points.filter((p) => !p.isReference && p.repeatIndex === firstRepeat && p.predicted !== null);
  const held = axes.filter((a) => !shown.includes(a.quantity));
  const heldAt = new Map(held.map((a) => [a.quantity, minOf(base.map((p) => poseValue(p, a.quantity)))]));
  return base.filter((p) => held.every((a) => poseValue(p, a.quantity) === heldAt.get(a.quantity)));
}

function minOf(values: (number | undefined)[]): number | undefined {
  const defined = values.filter((v): v is number => v !== undefined);
  return defined.length ? Math.min(...defined) : undefined;
}

const distinctSorted = (values: (number | undefined)[]) => [...new Set(values.filter((v): v is number => v !== undefined))].sort((a, b) => a - b);

const axisOf = (axes: readonly AxisSpec[], quantity: AxisQuantity) => axes.find((a) => a.quantity === quantity);

export interface LineSeries {
  /** the series axis value in display units, e.g. "30 deg"; "" when there is no series axis */
  name: string;
  /** [x in display units, y in SI], sorted by x */
  data: [number, number][];
}

/** One line per value of `seriesAxis` (or one line when null) of `quantity` against `xAxis`. */
export function buildLineSeries(
  points: readonly PlanPoint[],
  axes: readonly AxisSpec[],
  quantity: PredictedKey,
  xAxis: AxisQuantity,
  seriesAxis: AxisQuantity | null,
): LineSeries[] {
  const x = axisOf(axes, xAxis);
  if (!x) return [];
  const s = seriesAxis && seriesAxis !== xAxis ? axisOf(axes, seriesAxis) : undefined;
  const rows = plotted(points, axes, s ? [xAxis, s.quantity] : [xAxis]);
  const groups = s ? distinctSorted(rows.map((p) => poseValue(p, s.quantity))) : [undefined];
  return groups.map((group) => {
    const members = s ? rows.filter((p) => poseValue(p, s.quantity) === group) : rows;
    const data = members
      .map((p): [number, number] => [toDisplayNumber(poseValue(p, xAxis) ?? 0, xAxis, x.displayUnit), p.predicted![quantity] ?? Number.NaN])
      .sort((a, b) => a[0] - b[0]);
    const name = s && group !== undefined ? `${toDisplayNumber(group, s.quantity, s.displayUnit)} ${s.displayUnit}` : '';
    return { name, data };
  });
}

export interface HeatmapData {
  /** category labels along x and y, display units */
  xValues: number[];
  yValues: number[];
  /** [x index, y index, value in SI] */
  cells: [number, number, number][];
  min: number;
  max: number;
}

/** The `quantity` over two axes as a grid of cells, for a heatmap with a visualMap legend. */
export function buildHeatmap(points: readonly PlanPoint[], axes: readonly AxisSpec[], quantity: PredictedKey, xAxis: AxisQuantity, yAxis: AxisQuantity): HeatmapData {
  const x = axisOf(axes, xAxis);
  const y = axisOf(axes, yAxis);
  const empty = { xValues: [], yValues: [], cells: [], min: 0, max: 0 };
  if (!x || !y || xAxis === yAxis) return empty;
  const rows = plotted(points, axes, [xAxis, yAxis]);
  const xs = distinctSorted(rows.map((p) => poseValue(p, xAxis)));
  const ys = distinctSorted(rows.map((p) => poseValue(p, yAxis)));
  const cells: [number, number, number][] = [];
  for (const p of rows) {
    const value = p.predicted![quantity];
    if (value === null || !Number.isFinite(value)) continue;
    cells.push([xs.indexOf(poseValue(p, xAxis)!), ys.indexOf(poseValue(p, yAxis)!), value]);
  }
  const values = cells.map((c) => c[2]);
  return {
    xValues: xs.map((v) => toDisplayNumber(v, xAxis, x.displayUnit)),
    yValues: ys.map((v) => toDisplayNumber(v, yAxis, y.displayUnit)),
    cells,
    min: values.length ? Math.min(...values) : 0,
    max: values.length ? Math.max(...values) : 0,
  };
}

/** A log axis only helps, and only works, when every value is positive. */
export function canUseLog(series: readonly LineSeries[]): boolean {
  const values = series.flatMap((s) => s.data.map((d) => d[1]));
  return values.length > 0 && values.every((v) => v > 0);
}
