import type { PlanAxis } from '../../../src/lib/plans/axes';
import { mulberry32, orderGrid } from '../../../src/lib/plans/order';
import { buildPlanPoints, estimatedMinutes, MAX_PLAN_POINTS, oversizeMessage, planPointCount, type PlanLayout } from '../../../src/lib/plans/points';

const tilt: PlanAxis = { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'list', values: [0, 45, 90] };
const distance: PlanAxis = { quantity: 'distance', displayUnit: 'cm', mode: 'list', values: [0.05, 0.1] };
const base = { distance: 0.1, lateralOffset: 0.01, tiltDeg: 5 };
const layout = (extra: Partial<PlanLayout> = {}): PlanLayout => ({ axes: [tilt, distance], repeats: 1, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null, ...extra });
const poses = (l: PlanLayout) => buildPlanPoints(l, base).map((p) => [p.pose.tiltDeg, p.pose.distance]);

describe('plan points', () => {
  it('takes the cartesian product with the first axis outermost, and the setup for the rest of the pose', () => {
    const points = buildPlanPoints(layout(), base);
    expect(points.map((p) => p.seq)).toEqual([1, 2, 3, 4, 5, 6]);
    expect(poses(layout())).toEqual([[0, 0.05], [0, 0.1], [45, 0.05], [45, 0.1], [90, 0.05], [90, 0.1]]);
    expect(points[0].pose).toEqual({ distance: 0.05, lateralOffset: 0.01, tiltDeg: 0 });
  });

  it('measures each pose `repeats` times in a row', () => {
    const points = buildPlanPoints(layout({ repeats: 3 }), base);
    expect(points).toHaveLength(18);
    expect(points.slice(0, 4).map((p) => [p.repeatIndex, p.pose.distance])).toEqual([[1, 0.05], [2, 0.05], [3, 0.05], [1, 0.1]]);
  });

  it('re-measures the first pose after every N measurements, never as the last point', () => {
    const points = buildPlanPoints(layout({ referenceEvery: 2 }), base);
    // 6 measurements: references after the 2nd and 4th (not after the 6th, the last)
    expect(points.map((p) => (p.isReference ? 'R' : p.seq))).toEqual([1, 2, 'R', 4, 5, 'R', 7, 8]);
    expect(points.filter((p) => p.isReference).every((p) => p.pose.tiltDeg === 0 && p.pose.distance === 0.05)).toBe(true);
    expect(planPointCount(layout({ referenceEvery: 2 }))).toBe(8);
  });

  it('serpentine reverses the inner axis on alternate rows', () => {
    expect(poses(layout({ orderMode: 'serpentine' }))).toEqual([[0, 0.05], [0, 0.1], [45, 0.1], [45, 0.05], [90, 0.05], [90, 0.1]]);
  });

  it('serpentine over three axes moves one axis by one step between consecutive points', () => {
    const sizes = [3, 2, 4];
    const order = orderGrid(sizes, 'serpentine', null);
    expect(new Set(order.map((d) => d.join())).size).toBe(24);
    for (let i = 1; i < order.length; i++) {
      const moves = order[i].map((d, k) => Math.abs(d - order[i - 1][k]));
      expect(moves.reduce((a, b) => a + b, 0)).toBe(1);
    }
  });

  it('a shuffled order is a permutation fixed by its seed', () => {
    const a = orderGrid([5, 4], 'shuffled', 42).map((d) => d.join());
    const b = orderGrid([5, 4], 'shuffled', 42).map((d) => d.join());
    const c = orderGrid([5, 4], 'shuffled', 7).map((d) => d.join());
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
    expect([...a].sort()).toEqual(orderGrid([5, 4], 'as_listed', null).map((d) => d.join()).sort());
  });

  it('mulberry32 gives the same numbers in [0, 1) for the same seed', () => {
    const x = mulberry32(1);
    const y = mulberry32(1);
    const values = Array.from({ length: 100 }, () => x());
    expect(values).toEqual(Array.from({ length: 100 }, () => y()));
    expect(values.every((v) => v >= 0 && v < 1)).toBe(true);
  });

  it('refuses more than 5,000 points, naming the axes and repeats', () => {
    const big: PlanAxis = { quantity: 'distance', displayUnit: 'cm', mode: 'count', start: 0.05, stop: 0.5, count: 100, spacing: 'linear' };
    const wide: PlanAxis = { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'count', start: 0, stop: 90, count: 26, spacing: 'linear' };
    const l = layout({ axes: [big, wide], repeats: 2 });
    expect(planPointCount(l)).toBe(5200);
    expect(oversizeMessage(l)).toBe('This plan has 5,200 points (100 distance values x 26 tilt values x 2 repeats); at most 5,000 are allowed. Use fewer values or repeats.');
    expect(() => buildPlanPoints(l, base)).toThrow(RangeError);
    const fits = layout({ axes: [big, { ...wide, count: 25 }], repeats: 2 });
    expect(planPointCount(fits)).toBe(MAX_PLAN_POINTS);
    expect(oversizeMessage(fits)).toBeNull();
    expect(buildPlanPoints(fits, base)).toHaveLength(MAX_PLAN_POINTS);
  });

  it('estimates bench time as points x minutes per point', () => {
    expect(estimatedMinutes(planPointCount(layout({ repeats: 2 })), 1.5)).toBe(18);
  });
});
