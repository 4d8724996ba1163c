/**
 * One-parameter weighted least squares (src/physics/review/least-squares.ts), checked on synthetic data
 * with known answers and, for the uncertainty, by Monte Carlo.
 */
import { FitInputError, chiSquare, fitOneParameter, type OneParameterProblem } from '../../../src/physics/review/least-squares';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
/** Exact data: the estimate is limited only by rounding and the convergence test. */
const EXACT_RECOVERY_TOL = 1e-9;

/** mulberry32 (Tommy Ettinger's public-domain 32-bit generator), uniform in [0, 1). */
function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
/** Box-Muller: two uniforms to one standard normal (Box & Muller, Ann. Math. Stat. 29, 1958). */
function normal(rand: () => number): () => number {
  return () => Math.sqrt(-2 * Math.log(1 - rand())) * Math.cos(2 * Math.PI * rand());
}

const xs = [1, 2, 3, 4, 5, 6];
const us = [0.1, 0.2, 0.1, 0.3, 0.2, 0.1];
const linear = (measured: number[], extra: Partial<OneParameterProblem> = {}): OneParameterProblem => ({
  evaluate: async (a) => xs.map((x) => a * x), measured, uncertainties: us, start: 0, step: 0.1, lower: -10, upper: 10, ...extra,
});
/** weighted regression through the origin: a = S_xy / S_xx, var a = 1 / S_xx (Bevington & Robinson, ch. 6) */
const Sxx = xs.reduce((s, x, i) => s + (x * x) / us[i] ** 2, 0);

describe('chiSquare', () => {
  test('sum ((y - f) / u)^2, hand-computed: (1/0.5)^2 + (-2/1)^2 = 8', () => {
    expect(chiSquare([0, 5], [1, 3], [0.5, 1])).toBe(8);
  });
});

describe('fitOneParameter on exact data', () => {
  test('y = a x recovers a, and the uncertainty is 1 / sqrt(sum x^2 / u^2) (Bevington & Robinson ch. 6)', async () => {
    const fit = await fitOneParameter(linear(xs.map((x) => 2.5 * x)));
    expect(relErr(fit.value, 2.5)).toBeLessThan(EXACT_RECOVERY_TOL);
    expect(relErr(fit.uncertainty, 1 / Math.sqrt(Sxx))).toBeLessThan(EXACT_RECOVERY_TOL);
    expect(fit.converged).toBe(true);
    expect(fit.atBound).toBe(false);
    expect(fit.dof).toBe(5);
    expect(fit.chiSquare).toBeLessThan(1e-12);
    expect(fit.fitted.map((v, i) => relErr(v, 2.5 * xs[i])).every((e) => e < EXACT_RECOVERY_TOL)).toBe(true);
  });

  test('scatter beyond the stated uncertainties scales the uncertainty by sqrt(chi^2 / dof) (Bevington & Robinson ch. 6-8)', async () => {
    const measured = xs.map((x, i) => 2.5 * x + (i % 2 ? 0.4 : -0.4));
    const fit = await fitOneParameter(linear(measured));
    const a = xs.reduce((s, x, i) => s + (x * measured[i]) / us[i] ** 2, 0) / Sxx;
    const chi2 = xs.reduce((s, x, i) => s + ((measured[i] - a * x) / us[i]) ** 2, 0);
    expect(chi2 / 5).toBeGreaterThan(1);
    expect(relErr(fit.value, a)).toBeLessThan(EXACT_RECOVERY_TOL);
    expect(relErr(fit.chiSquare, chi2)).toBeLessThan(EXACT_RECOVERY_TOL);
    expect(relErr(fit.reducedChiSquare!, chi2 / 5)).toBeLessThan(EXACT_RECOVERY_TOL);
    expect(relErr(fit.uncertainty, Math.sqrt(chi2 / 5) / Math.sqrt(Sxx))).toBeLessThan(EXACT_RECOVERY_TOL);
  });

  test.each([[0.1, 0.7], [3, 0.7], [0, 2.2]])('y = exp(-p x) from p = %p recovers p = %p', async (start, p) => {
    const x = Array.from({ length: 9 }, (_, i) => i * 0.5);
    const fit = await fitOneParameter({
      evaluate: async (q) => x.map((v) => Math.exp(-q * v)), measured: x.map((v) => Math.exp(-p * v)),
      uncertainties: x.map(() => 0.01), start, step: 0.01, lower: 0, upper: 5,
    });
    expect(relErr(fit.value, p)).toBeLessThan(EXACT_RECOVERY_TOL);
    expect(fit.converged).toBe(true);
  });

  test('a model flat at the start (y = p^2 x at p = 0) still moves off it', async () => {
    const fit = await fitOneParameter({ ...linear(xs.map((x) => 2.25 * x)), evaluate: async (p) => xs.map((x) => p * p * x), step: 0.5 });
    expect(relErr(Math.abs(fit.value), 1.5)).toBeLessThan(EXACT_RECOVERY_TOL);
  });

  test('one measurement: dof 0 and no reduced chi-square', async () => {
    const fit = await fitOneParameter({ ...linear([5]), evaluate: async (a) => [2 * a], uncertainties: [0.1] });
    expect(relErr(fit.value, 2.5)).toBeLessThan(EXACT_RECOVERY_TOL);
    expect(fit.dof).toBe(0);
    expect(fit.reducedChiSquare).toBeNull();
    expect(relErr(fit.uncertainty, 0.05)).toBeLessThan(EXACT_RECOVERY_TOL);
  });
});

describe('fitOneParameter bounds', () => {
  test('an answer above the upper bound clamps to it, atBound true', async () => {
    const fit = await fitOneParameter(linear(xs.map((x) => 2.5 * x), { upper: 2 }));
    expect(fit.value).toBe(2);
    expect(fit.atBound).toBe(true);
    expect(fit.converged).toBe(true);
  });
  test('an answer below the lower bound clamps to it, starting on the bound', async () => {
    const fit = await fitOneParameter(linear(xs.map((x) => -1 * x), { lower: 0, start: 0 }));
    expect(fit.value).toBe(0);
    expect(fit.atBound).toBe(true);
  });
});

describe('fitOneParameter bad input names the field', () => {
  const good = linear(xs.map((x) => 2.5 * x));
  test.each<[string, Partial<OneParameterProblem>]>([
    ['measured', { measured: [] }],
    ['measured', { measured: [1, 2, NaN, 4, 5, 6] }],
    ['uncertainties', { uncertainties: [0.1, 0.1] }],
    ['uncertainties', { uncertainties: [0.1, 0.1, 0, 0.1, 0.1, 0.1] }],
    ['uncertainties', { uncertainties: [0.1, 0.1, Infinity, 0.1, 0.1, 0.1] }],
    ['start', { start: 11 }],
    ['start', { start: NaN }],
    ['step', { step: 0 }],
    ['step', { step: -1 }],
    ['bounds', { lower: 1, upper: 1 }],
    ['bounds', { lower: 2, upper: 1, start: 1.5 }],
  ])('%s', async (field, change) => {
    const error = await fitOneParameter({ ...good, ...change }).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(FitInputError);
    expect((error as FitInputError).field).toBe(field);
  });
  test('a model returning non-finite values fails saying where', async () => {
    await expect(fitOneParameter({ ...good, evaluate: async (a) => xs.map(() => (a > 1 ? NaN : a)) })).rejects.toThrow(
      /could not be evaluated at p = /,
    );
  });
});

describe('fitOneParameter uncertainty by Monte Carlo (y = exp(-p x), 400 noisy data sets, known sigma)', () => {
  /** 400 samples: the sample std is good to about 1/sqrt(2 * 399) = 3.5 %; 15 % leaves room for the sqrt(chi^2/dof) scaling. */
  const SPREAD_TOL = 0.15;
  const SETS = 400;
  test('the spread of the estimates matches the reported uncertainty; the mean is unbiased', async () => {
    const truth = 0.7;
    const sigma = 0.02;
    const x = Array.from({ length: 25 }, (_, i) => (i * 4) / 24);
    const exact = x.map((v) => Math.exp(-truth * v));
    const gauss = normal(mulberry32(20240611));
    const estimates: number[] = [];
    const reported: number[] = [];
    for (let k = 0; k < SETS; k++) {
      const fit = await fitOneParameter({
        evaluate: async (q) => x.map((v) => Math.exp(-q * v)), measured: exact.map((y) => y + sigma * gauss()),
        uncertainties: x.map(() => sigma), start: 0.5, step: 0.01, lower: 0, upper: 5,
      });
      expect(fit.converged).toBe(true);
      estimates.push(fit.value);
      reported.push(fit.uncertainty);
    }
    const mean = estimates.reduce((s, v) => s + v, 0) / SETS;
    const spread = Math.sqrt(estimates.reduce((s, v) => s + (v - mean) ** 2, 0) / (SETS - 1));
    const meanReported = reported.reduce((s, v) => s + v, 0) / SETS;
    expect(relErr(meanReported, spread)).toBeLessThan(SPREAD_TOL);
    // standard error of the mean = spread / sqrt(N); three of them (three-sigma, common practice)
    expect(Math.abs(mean - truth)).toBeLessThan((3 * spread) / Math.sqrt(SETS));
  });
});
