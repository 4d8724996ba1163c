/**
 * Skin depth and the exact round-wire skin-effect ratio (src/physics/skin-effect.ts, bessel-complex.ts).
 */
import { asymptoticRatio, ASYMPTOTIC_SWITCH, seriesRatio } from '../../src/physics/bessel-complex';
import { cx } from '../../src/physics/complex';
import { MATERIALS } from '../../src/physics/resistance';
import { roundWireImpedanceRatio, skinDepth } from '../../src/physics/skin-effect';
import { kelvinRacOverRdc } from './oracles/kelvin';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
const RHO_CU = MATERIALS.copper.resistivity20;

describe('copper skin depth (REFERENCES.md; D. K. Cheng, Field and Wave Electromagnetics, table 8-1)', () => {
  /** the references print 3 significant digits: half a unit in the last place */
  test.each([[60, 8.53e-3], [100e3, 0.209e-3], [1e6, 66.1e-6], [6.78e6, 25.4e-6]])('%p Hz -> %p m', (f, delta) => {
    const printed = Number(delta.toPrecision(3));
    expect(Math.abs(skinDepth(RHO_CU, f) - printed)).toBeLessThanOrEqual(0.5 * 10 ** (Math.floor(Math.log10(printed)) - 2) + 1e-15);
  });
});

describe('Rac/Rdc = Re[(qa/2) J0(qa)/J1(qa)] (Terman, Radio Engineers\' Handbook, 1943, table)', () => {
  test.each([[1, 1.005], [2, 1.078], [3, 1.318], [4, 1.678], [5, 2.043], [6, 2.394], [8, 3.094], [10, 3.799], [15, 5.562]])(
    'x = %p -> %p to 3 decimals', (x, table) => {
      expect(Math.abs(roundWireImpedanceRatio(x).re - table)).toBeLessThanOrEqual(0.0005);
    });
  test('matches Kelvin ber/bei series (A&S 9.9.10, independent oracle) to 1e-11 for x = 0.1..20', () => {
    for (let x = 0.1; x <= 20; x += 0.37) expect(relErr(roundWireImpedanceRatio(x).re, kelvinRacOverRdc(x))).toBeLessThan(1e-11);
  });
  test('large x: Re -> x / (2 sqrt 2) + 1/4 and Im -> x / (2 sqrt 2) (REFERENCES.md)', () => {
    for (const x of [100, 1e3, 1e5]) {
      const z = roundWireImpedanceRatio(x);
      // next term is O(1/x)
      expect(Math.abs(z.re - (x / (2 * Math.SQRT2) + 0.25))).toBeLessThan(1 / x);
      expect(Math.abs(z.im - x / (2 * Math.SQRT2))).toBeLessThan(1 / x);
    }
  });
  test('small x: Rac/Rdc - 1 ~ x^4 / 192 (low-frequency expansion of the same formula)', () => {
    for (const x of [0.05, 0.1, 0.2]) expect(relErr(roundWireImpedanceRatio(x).re - 1, x ** 4 / 192)).toBeLessThan(x ** 4);
  });
  test('series and asymptotic expansions agree where they meet (|z| = switch point) to 1e-12', () => {
    for (const s of [0.9, 1, 1.1].map((f) => (f * ASYMPTOTIC_SWITCH) / Math.SQRT2)) {
      const a = seriesRatio(cx(s, -s));
      const b = asymptoticRatio(cx(s, -s));
      expect(Math.hypot(a.re - b.re, a.im - b.im) / Math.hypot(b.re, b.im)).toBeLessThan(1e-12);
    }
  });
});
