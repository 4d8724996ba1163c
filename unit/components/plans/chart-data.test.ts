import { buildHeatmap, buildLineSeries, canUseLog } from '@/components/plans/chart-data';
import type { AxisSpec, PlanPoint, PointPrediction } from '@/components/plans/plan-types';

const axes: AxisSpec[] = [
  { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 60, step: 30 },
  { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.05, stop: 0.1, step: 0.05 },
];

const prediction = (coupling: number): PointPrediction => ({
  mutualInductance: coupling * 1e-6, coupling, txSelfInductance: 1e-5, rxSelfInductance: 1e-6,
  txResistance: 0.1, rxResistance: 0.05, efficiency: 0.5, loadPower: 1, fieldRatio: null,
});

/** A made-up k: 0.1 / (tilt index + 1) / (distance in cm); exact values so cells can be checked. */
const kOf = (tilt: number, distance: number) => 0.1 / (tilt / 30 + 1) / (distance * 100);

let seq = 0;
const point = (tilt: number, distance: number, extra: Partial<PlanPoint> = {}): PlanPoint => ({
  id: ++seq, seq, repeatIndex: 1, isReference: false, pose: { tiltDeg: tilt, distance, lateralOffset: 0 },
  predicted: prediction(kOf(tilt, distance)), solverVersion: '1.0.0', ...extra,
});

// Serpentine order, a second repeat and a reference point, as the server stores them.
const points: PlanPoint[] = [
  point(0, 0.05), point(0, 0.05, { repeatIndex: 2, predicted: prediction(99) }), point(0, 0.1),
  point(30, 0.1), point(0, 0.05, { isReference: true, predicted: prediction(-1) }), point(30, 0.05),
  point(60, 0.05), point(60, 0.1),
];

describe('chart series from plan points', () => {
  test('one line per tilt, k against distance in cm, sorted by x; repeats and references left out', () => {
    const series = buildLineSeries(points, axes, 'coupling', 'distance', 'tiltDeg');
    expect(series.map((s) => s.name)).toEqual(['0 deg', '30 deg', '60 deg']);
    expect(series[1].data).toEqual([[5, kOf(30, 0.05)], [10, kOf(30, 0.1)]]);
    expect(series.flatMap((s) => s.data.map((d) => d[1]))).not.toContain(99);
  });

  test('without a series axis, the other axis is held at its first value', () => {
    const series = buildLineSeries(points, axes, 'coupling', 'tiltDeg', null);
    expect(series).toHaveLength(1);
    expect(series[0].data).toEqual([[0, kOf(0, 0.05)], [30, kOf(30, 0.05)], [60, kOf(60, 0.05)]]);
  });

  test('log scale only when every value is above zero', () => {
    expect(canUseLog(buildLineSeries(points, axes, 'coupling', 'distance', 'tiltDeg'))).toBe(true);
    const negative = points.map((p) => ({ ...p, predicted: p.predicted && { ...p.predicted, mutualInductance: -1e-9 } }));
    expect(canUseLog(buildLineSeries(negative, axes, 'mutualInductance', 'distance', 'tiltDeg'))).toBe(false);
  });
});

describe('heatmap matrix from plan points', () => {
  test('cells sit at the index of their x and y value, with the min and max for the legend', () => {
    const heat = buildHeatmap(points, axes, 'coupling', 'tiltDeg', 'distance');
    expect(heat.xValues).toEqual([0, 30, 60]);
    expect(heat.yValues).toEqual([5, 10]);
    expect(heat.cells).toHaveLength(6);
    expect(heat.cells).toContainEqual([2, 1, kOf(60, 0.1)]);
    expect(heat.cells).toContainEqual([0, 0, kOf(0, 0.05)]);
    expect(heat.max).toBe(kOf(0, 0.05));
    expect(heat.min).toBe(kOf(60, 0.1));
  });

  test('the same axis twice gives nothing to draw', () => {
    expect(buildHeatmap(points, axes, 'coupling', 'tiltDeg', 'tiltDeg').cells).toEqual([]);
  });
});
