/**
 * Means with uncertainty, comparison with a prediction and agreement metrics (src/physics/review/agreement.ts).
 * Expected values are worked by hand from the formulas named beside each check.
 */
import { compareToPrediction, errorMetrics, meanOfObservations } from '../../../src/physics/review/agreement';

/** Hand-worked decimals below are exact to far better than this; the code only adds rounding. */
const ROUNDING_TOL = 1e-12;
const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe('meanOfObservations', () => {
  // values 10.1, 9.9, 10.3, 9.7: mean 10.0, deviations +-0.1, +-0.3, sum of squares 0.2
  const values = [10.1, 9.9, 10.3, 9.7];

  test('type A alone: u = s / sqrt(n), s^2 = sum (x - mean)^2 / (n - 1) (GUM JCGM 100:2008 4.2.2-4.2.3)', () => {
    const r = meanOfObservations(values.map((value) => ({ value, uncertainty: 0 })));
    expect(relErr(r.mean, 10)).toBeLessThan(ROUNDING_TOL);
    // s^2 = 0.2 / 3, s^2 / n = 0.2 / 12 = 1/60
    expect(relErr(r.uncertainty, Math.sqrt(1 / 60))).toBeLessThan(ROUNDING_TOL);
    expect(r.n).toBe(4);
  });

  test('type A and type B combined in quadrature: u^2 = rms(u_i)^2 + s^2/n (GUM 5.1.2 for uncorrelated parts; common practice)', () => {
    const u = [0.1, 0.1, 0.2, 0.2];
    const r = meanOfObservations(values.map((value, i) => ({ value, uncertainty: u[i] })));
    // u_B^2 = (0.01 + 0.01 + 0.04 + 0.04) / 4 = 0.025; s^2 / n = 1/60; u = sqrt(0.025 + 1/60) = 0.2041241452...
    expect(relErr(r.uncertainty, Math.sqrt(0.025 + 1 / 60))).toBeLessThan(ROUNDING_TOL);
    expect(relErr(r.uncertainty, 0.2041241452)).toBeLessThan(1e-9);
  });

  test('identical repeats leave the instrument part alone: it does not average down (type B, GUM 4.3)', () => {
    const r = meanOfObservations([1, 2, 3].map(() => ({ value: 2, uncertainty: 0.05 })));
    expect(relErr(r.uncertainty, 0.05)).toBeLessThan(ROUNDING_TOL);
  });

  test('n = 1: the observation and its own uncertainty, no scatter term', () => {
    expect(meanOfObservations([{ value: 5, uncertainty: 0.3 }])).toEqual({ mean: 5, uncertainty: 0.3, n: 1 });
  });

  test('an empty list throws RangeError', () => {
    expect(() => meanOfObservations([])).toThrow(RangeError);
  });
});

describe('compareToPrediction (definitions: residual = measured - predicted)', () => {
  test('residual, relative to |predicted| and normalized by the uncertainty', () => {
    const c = compareToPrediction(1.1, 0.05, 1);
    expect(Math.abs(c.residual - 0.1)).toBeLessThan(ROUNDING_TOL);
    expect(Math.abs(c.relative! - 0.1)).toBeLessThan(ROUNDING_TOL);
    expect(Math.abs(c.normalized! - 2)).toBeLessThan(ROUNDING_TOL);
  });
  test('a negative prediction: the relative error keeps the residual sign (divides by |predicted|)', () => {
    const c = compareToPrediction(-0.9, 0.1, -1);
    expect(Math.abs(c.relative! - 0.1)).toBeLessThan(ROUNDING_TOL);
    expect(Math.abs(c.normalized! - 1)).toBeLessThan(ROUNDING_TOL);
  });
  test('predicted 0 gives no relative error; a zero, negative or non-finite uncertainty no normalized one', () => {
    expect(compareToPrediction(0.2, 0.1, 0).relative).toBeNull();
    for (const u of [0, -0.1, NaN, Infinity]) expect(compareToPrediction(1.2, u, 1).normalized).toBeNull();
    expect(compareToPrediction(1.2, 0.1, 1).relative).not.toBeNull();
  });
});

describe('errorMetrics', () => {
  test('rms, signed largest, bias and count over the finite values only (hand-computed)', () => {
    const m = errorMetrics([0.03, -0.05, null, 0.01, NaN], 0.04);
    expect(m.count).toBe(3);
    // rms = sqrt((0.0009 + 0.0025 + 0.0001) / 3) = sqrt(0.0035 / 3)
    expect(relErr(m.rmsRelative!, Math.sqrt(0.0035 / 3))).toBeLessThan(ROUNDING_TOL);
    expect(m.maxRelative).toBe(-0.05);
    // bias = (0.03 - 0.05 + 0.01) / 3 = -0.01 / 3
    expect(relErr(m.bias!, -0.01 / 3)).toBeLessThan(ROUNDING_TOL);
    expect(m.outsideTolerance).toBe(1);
  });
  test('a value exactly at the tolerance is inside; just beyond it is outside, either sign', () => {
    expect(errorMetrics([0.04, -0.04], 0.04).outsideTolerance).toBe(0);
    expect(errorMetrics([0.0401, -0.0401, 0.02], 0.04).outsideTolerance).toBe(2);
  });
  test('nothing finite: count 0 and null statistics', () => {
    expect(errorMetrics([], 0.05)).toEqual({ count: 0, rmsRelative: null, maxRelative: null, bias: null, outsideTolerance: 0 });
    expect(errorMetrics([null, NaN, Infinity], 0.05)).toEqual({ count: 0, rmsRelative: null, maxRelative: null, bias: null, outsideTolerance: 0 });
  });
});
