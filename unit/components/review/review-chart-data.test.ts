import type { AxisSpec } from '@/components/plans/plan-types';
import { buildAxisChart, buildParity, buildResiduals, kindOf, niceRange, niceStep, paddedRange, PARITY_BANDS } from '@/components/review/review-chart-data';
import type { MeasuredMean, ReviewObservation, ReviewPose } from '@/lib/review/types';

/**
 * The review's chart data from hand-made poses and readings. Expected values follow from the
 * definitions the review uses (src/lib/review/types.ts): residual = measured - predicted,
 * relative = residual / predicted; the parity bands are measured = (1 ± f) predicted.
 */

/** Float noise allowed when a value goes through a unit conversion (cm, %). */
const CLOSE_DIGITS = 12;

const axes: AxisSpec[] = [
  { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'list', values: [0, 30] },
  { quantity: 'distance', displayUnit: 'cm', mode: 'list', values: [0.05, 0.1] },
  { quantity: 'lateralOffset', displayUnit: 'mm', mode: 'list', values: [0, 0.002] },
];

const key = (tilt: number, distance: number, offset: number) => JSON.stringify([distance, offset, tilt, null, null]);

function pose(tilt: number, distance: number, offset: number, predicted: number | null, measured: MeasuredMean | null, extra: Partial<ReviewPose> = {}): ReviewPose {
  return {
    key: key(tilt, distance, offset), pose: { tiltDeg: tilt, distance, lateralOffset: offset }, pointIds: [1], seqs: [1],
    predicted, measured, residual: null, relative: null, normalized: null, autoOutlier: false, refit: null, ...extra,
  };
}

const m = (mean: number, uncertainty = 0.001, n = 1): MeasuredMean => ({ mean, uncertainty, n });

describe('measured and predicted against one axis', () => {
  // offset 0 is measured only at tilt 30; offset 2 mm is not measured at all
  const poses = [
    pose(0, 0.05, 0, 0.2, null),
    pose(0, 0.1, 0, 0.1, null),
    pose(30, 0.1, 0, 0.08, m(0.085, 0.002, 3), { seqs: [4, 9], refit: 0.084 }),
    pose(30, 0.05, 0, 0.16, m(0.15)),
    pose(0, 0.05, 0.002, 0.19, null),
    pose(30, 0.05, 0.002, 0.15, null),
  ];

  test('one series per tilt, x in the axis display unit, sorted, with means, bars and the fit', () => {
    const chart = buildAxisChart(poses, axes, 'distance', 'tiltDeg');
    expect(chart.series.map((s) => s.name)).toEqual(['0 deg', '30 deg']);
    const [flat, tilted] = chart.series;
    expect(flat.predicted).toEqual([[5, 0.2], [10, 0.1]]);
    expect(flat.measured).toEqual([]);
    expect(tilted.measured).toEqual([
      { x: 5, mean: 0.15, uncertainty: 0.001, n: 1, seqs: [1] },
      { x: 10, mean: 0.085, uncertainty: 0.002, n: 3, seqs: [4, 9] },
    ]);
    expect(tilted.refit).toEqual([[10, 0.084]]);
  });

  test('an axis off the chart is held at its smallest measured value and named', () => {
    const chart = buildAxisChart(poses, axes, 'distance', 'tiltDeg');
    expect(chart.held).toEqual([{ quantity: 'lateralOffset', value: 0, unit: 'mm' }]);
    // the 2 mm poses are not on the chart
    expect(chart.series.flatMap((s) => s.predicted.map((p) => p[1]))).not.toContain(0.19);
  });

  test('held at the measured value even when a smaller value exists but was not measured', () => {
    // only tilt 30 is measured; tilt 0 has predictions but no readings
    const chart = buildAxisChart(poses, axes, 'distance', null);
    expect(chart.held.find((h) => h.quantity === 'tiltDeg')?.value).toBe(30);
    expect(chart.series).toHaveLength(1);
    expect(chart.series[0].name).toBe('');
    expect(chart.series[0].measured.map((p) => p.x)).toEqual([5, 10]);
  });

  test('nothing measured: held at the smallest value of all, predicted line only', () => {
    const none = poses.map((p) => ({ ...p, measured: null }));
    const chart = buildAxisChart(none, axes, 'distance', null);
    expect(chart.held).toEqual([
      { quantity: 'tiltDeg', value: 0, unit: 'deg' },
      { quantity: 'lateralOffset', value: 0, unit: 'mm' },
    ]);
    expect(chart.series[0].predicted).toEqual([[5, 0.2], [10, 0.1]]);
  });

  test('an axis the plan does not sweep gives no chart', () => {
    expect(buildAxisChart(poses, axes, 'frequencyHz', null)).toEqual({ series: [], held: [] });
  });
});

function observation(seq: number, value: number, predicted: number | null, extra: Partial<ReviewObservation> = {}): ReviewObservation {
  const residual = predicted === null ? null : value - predicted;
  return {
    readingId: seq, pointId: seq, seq, repeatIndex: 1, isReference: false, poseKey: key(0, 0.05, 0), method: 'split_peaks',
    value, uncertainty: 0.001, residual, relative: residual === null ? null : residual / predicted!, normalized: residual === null ? null : residual / 0.001,
    autoOutlier: false, setAside: false, ...extra,
  };
}

describe('parity plot', () => {
  const observations = [
    observation(1, 0.105, 0.1),
    observation(2, 0.16, 0.2, { autoOutlier: true }),
    observation(3, 0.3, 0.25, { autoOutlier: true, setAside: true }),
    observation(4, 0.5, null),
  ];

  test('set aside wins over the automatic flag; a reading without a prediction is left out', () => {
    expect(kindOf(observations[2])).toBe('setAside');
    const parity = buildParity(observations);
    expect(parity.points.ordinary.map((p) => p.seq)).toEqual([1]);
    expect(parity.points.autoOutlier.map((p) => p.seq)).toEqual([2]);
    expect(parity.points.setAside.map((p) => p.seq)).toEqual([3]);
    // predicted is recovered from value - residual
    expect(parity.points.autoOutlier[0].predicted).toBeCloseTo(0.2, CLOSE_DIGITS);
  });

  test('range spans predicted and measured, padded by 5 % of the span, then widened to whole ticks', () => {
    const parity = buildParity(observations);
    // values 0.1 .. 0.3: span 0.2, padded to 0.09 .. 0.31; a fifth of 0.22 is 0.044, so ticks every 0.05
    expect(parity.step).toBeCloseTo(0.05, CLOSE_DIGITS);
    expect(parity.range).toEqual([0.05, 0.35]);
  });

  test('each band lies between (1 - f) and (1 + f) times the prediction at both ends', () => {
    const parity = buildParity(observations);
    const [lo, hi] = parity.range!;
    expect(parity.bands.map((b) => b.fraction)).toEqual([...PARITY_BANDS]);
    const five = parity.bands.find((b) => b.fraction === 0.05)!;
    expect(five.polygon).toEqual([[lo, lo * 0.95], [hi, hi * 0.95], [hi, hi * 1.05], [lo, lo * 1.05]]);
  });

  test('no reading with a prediction: no range and no bands', () => {
    expect(buildParity([observation(1, 0.5, null)])).toEqual({ points: { ordinary: [], autoOutlier: [], setAside: [] }, range: null, step: 1, bands: [] });
  });
});

describe('residuals', () => {
  const poses = [pose(0, 0.05, 0, 0.1, m(0.105)), pose(0, 0.1, 0, 0.05, m(0.045))];
  const observations = [
    observation(1, 0.105, 0.1),
    observation(2, 0.045, 0.05, { poseKey: key(0, 0.1, 0), autoOutlier: true }),
  ];

  test('relative error in percent against the axis in display units', () => {
    const data = buildResiduals(observations, poses, axes, 'distance', 0.05);
    expect(data.points.ordinary).toHaveLength(1);
    expect(data.points.ordinary[0].x).toBe(5);
    expect(data.points.ordinary[0].percent).toBeCloseTo(5, CLOSE_DIGITS);
    expect(data.points.autoOutlier[0].x).toBe(10);
    expect(data.points.autoOutlier[0].percent).toBeCloseTo(-10, CLOSE_DIGITS);
    expect(data.tolerancePercent).toBeCloseTo(5, CLOSE_DIGITS);
  });

  test('x range padded so the zero line and band span every point', () => {
    const data = buildResiduals(observations, poses, axes, 'distance', 0.05);
    expect(data.xRange![0]).toBeCloseTo(4.75, CLOSE_DIGITS);
    expect(data.xRange![1]).toBeCloseTo(10.25, CLOSE_DIGITS);
  });

  test('a reading at a pose the review does not list is skipped', () => {
    const stray = observation(3, 0.2, 0.1, { poseKey: 'elsewhere' });
    const data = buildResiduals([stray], poses, axes, 'distance', 0.05);
    expect(data.points.ordinary).toEqual([]);
    expect(data.xRange).toBeNull();
  });
});

describe('padded range', () => {
  test('a single value is widened around itself instead of collapsing to a point', () => {
    const [lo, hi] = paddedRange([10])!;
    expect(lo).toBeLessThan(10);
    expect(hi).toBeGreaterThan(10);
    expect(hi - 10).toBeCloseTo(10 - lo, CLOSE_DIGITS);
  });

  test('zero alone still gives a range', () => {
    expect(paddedRange([0])).toEqual([-0.05, 0.05]);
  });
});

describe('round ticks', () => {
  test('steps of 1, 2 or 5 times a power of ten, about five to a span', () => {
    expect(niceStep(60)).toBe(10);
    expect(niceStep(0.011)).toBeCloseTo(0.002, CLOSE_DIGITS);
    expect(niceStep(3.2e-7)).toBeCloseTo(5e-8, 20);
    expect(niceStep(0)).toBe(1);
  });

  test('a range widened to whole steps keeps the data inside and reads without float tails', () => {
    expect(niceRange([0.00641, 0.0174])).toEqual({ range: [0.006, 0.018], step: 0.002 });
    expect(niceRange([-3, 63])).toEqual({ range: [-10, 70], step: 10 });
  });
});
