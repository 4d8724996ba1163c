/**
 * GUM first-order propagation (src/physics/measurement/uncertainty.ts).
 */
import { DEFAULT_ACCURACY } from '../../../src/physics/measurement/methods';
import {
  inputUncertainty,
  propagateUncertainty,
  readingUncertainties,
} from '../../../src/physics/measurement/uncertainty';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
/** Central differences with an eps^(1/3) step are good to about eps^(2/3) ~ 4e-11 relative. */
const DIFFERENCE_TOL = 1e-8;

describe('law of propagation of uncertainty (GUM, JCGM 100:2008, 5.1.2 eq. 10)', () => {
  test('product of powers: relative uncertainties add in quadrature weighted by the powers (GUM 5.1.6, eq. 12)', () => {
    // y = c x1^2 x2^-1 x3^0.5
    const f = (x: Record<string, number>) => 3.7 * x.a ** 2 * x.b ** -1 * Math.sqrt(x.c);
    const inputs = { a: 2.5, b: 0.04, c: 11 };
    const u = { a: 0.01, b: 0.0003, c: 0.2 };
    const r = propagateUncertainty(f, inputs, u);
    const relative = Math.hypot((2 * u.a) / inputs.a, (-1 * u.b) / inputs.b, (0.5 * u.c) / inputs.c);
    expect(relErr(r.value, f(inputs))).toBeLessThan(1e-15);
    expect(relErr(r.uncertainty / r.value, relative)).toBeLessThan(DIFFERENCE_TOL);
  });

  test('linear function: u_c^2 = sum c_i^2 u_i^2 exactly (GUM 5.1.3)', () => {
    const r = propagateUncertainty((x) => 2 * x.p - 5 * x.q, { p: 1.5, q: -3 }, { p: 0.01, q: 0.02 });
    expect(relErr(r.uncertainty, Math.hypot(0.02, 0.1))).toBeLessThan(DIFFERENCE_TOL);
    expect(relErr(r.contributions.p, 0.02)).toBeLessThan(DIFFERENCE_TOL);
    expect(relErr(r.contributions.q, 0.1)).toBeLessThan(DIFFERENCE_TOL);
  });

  test('an input at zero takes a step scaled from its uncertainty: sin x at 0 with u = 0.01 gives 0.01', () => {
    const r = propagateUncertainty((x) => Math.sin(x.phase), { phase: 0 }, { phase: 0.01 });
    expect(relErr(r.uncertainty, 0.01)).toBeLessThan(DIFFERENCE_TOL);
  });

  test('inputs without an uncertainty, or with zero, count as exact', () => {
    const r = propagateUncertainty((x) => x.a * x.b, { a: 2, b: 3 }, { a: 0 });
    expect(r.uncertainty).toBe(0);
    expect(r.contributions).toEqual({});
  });

  test('at a branch point the spread over one uncertainty on the defined side: sqrt(1 - x) at x = 1 gives sqrt(u)', () => {
    const r = propagateUncertainty((x) => Math.sqrt(1 - x.x), { x: 1 }, { x: 1e-3 });
    expect(r.value).toBe(0);
    expect(relErr(r.uncertainty, Math.sqrt(1e-3))).toBeLessThan(1e-12);
  });
  test('undefined on both sides: NaN', () => {
    expect(propagateUncertainty((x) => (x.x === 0 ? 0 : Number.NaN), { x: 0 }, { x: 1 }).uncertainty).toBeNaN();
  });

  test('a negative uncertainty is refused', () => {
    expect(() => propagateUncertainty((x) => x.a, { a: 1 }, { a: -1 })).toThrow(RangeError);
  });
});

describe('standard uncertainties from the instrument accuracy', () => {
  test('magnitudes take relative * |x|, angles the fixed phase uncertainty', () => {
    expect(inputUncertainty('voltage', -2, { relative: 0.01, phaseDeg: 1 })).toBeCloseTo(0.02, 15);
    expect(inputUncertainty('angle', 87, { relative: 0.01, phaseDeg: 1 })).toBe(1);
  });

  test('every field of the method present in the reading, and only those', () => {
    const u = readingUncertainties('open_circuit', { frequency: 1e6, txCurrent: 0.5, rxVoltage: 3, phaseDeg: 90, stray: 4 }, DEFAULT_ACCURACY);
    expect(u).toEqual({ frequency: 1e3, txCurrent: 0.5e-3, rxVoltage: 3e-3, phaseDeg: 0.5 });
  });

  test('a negative or non-finite accuracy is refused', () => {
    expect(() => readingUncertainties('open_circuit', {}, { relative: -0.1, phaseDeg: 0 })).toThrow(/relative uncertainty/);
    expect(() => readingUncertainties('open_circuit', {}, { relative: 0.1, phaseDeg: Number.NaN })).toThrow(/phase uncertainty/);
  });
});
