import { interpolateAt, linearScale, niceTicks } from '@/components/bench/chart-scale';

describe('chart axes', () => {
  test('round ticks that cover the data', () => {
    expect(niceTicks(0, 0.0172, 4)).toEqual([0, 0.005, 0.01, 0.015, 0.02]);
    expect(niceTicks(-0.003, 0.011, 4)).toEqual([-0.005, 0, 0.005, 0.01, 0.015]);
    expect(niceTicks(0, 1, 5)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
  });

  test('a flat series still gets a range', () => {
    const ticks = niceTicks(0, 0, 4);
    expect(ticks[0]).toBeLessThan(0);
    expect(ticks[ticks.length - 1]).toBeGreaterThan(0);
    expect(niceTicks(Number.NaN, 1)).toEqual([]);
  });

  test('linear scale, including an inverted pixel axis', () => {
    const y = linearScale(0, 1, 100, 0);
    expect(y(0)).toBe(100);
    expect(y(0.25)).toBe(75);
  });

  test('interpolation between sweep points, null at gaps and outside', () => {
    const pts = [{ tiltDeg: 0, coupling: 0.02 }, { tiltDeg: 5, coupling: 0.01 }, { tiltDeg: 10, coupling: null }];
    expect(interpolateAt(pts, 2.5)).toBeCloseTo(0.015, 12);
    expect(interpolateAt(pts, 7)).toBeNull();
    expect(interpolateAt(pts, 20)).toBeNull();
  });
});
