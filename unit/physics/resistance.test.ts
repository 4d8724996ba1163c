/**
 * Resistance model (src/physics/resistance.ts).
 */
import { acResistance, dcResistance, resistivityAt } from '../../src/physics/resistance';
import { roundWireImpedanceRatio, skinDepth } from '../../src/physics/skin-effect';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
const EXACT = 1e-12;

describe('resistivity (IACS 1913 / IEC 60028 copper; IEC 60889 aluminium, memory)', () => {
  test('copper 1/58 ohm mm^2/m at 20 C', () => expect(relErr(resistivityAt('copper', 20), 1 / 58 * 1e-6)).toBeLessThan(1e-4));
  test('aluminium 2.8264e-8 ohm m at 20 C', () => expect(relErr(resistivityAt('aluminium', 20), 2.8264e-8)).toBeLessThan(EXACT));
  test('linear temperature law with alpha = 0.00393 (copper), 0.00403 (aluminium)', () => {
    expect(relErr(resistivityAt('copper', 70), 1.7241e-8 * (1 + 0.00393 * 50))).toBeLessThan(EXACT);
    expect(relErr(resistivityAt('aluminium', -10), 2.8264e-8 * (1 - 0.00403 * 30))).toBeLessThan(EXACT);
  });
});

describe('DC and AC resistance', () => {
  test('1 m of 1 mm copper at 20 C: rho l / (pi r^2) = 21.95 mohm', () => {
    expect(relErr(dcResistance({ wireDiameter: 1e-3 }, 1), 1.7241e-8 / (Math.PI * 0.25e-6))).toBeLessThan(EXACT);
  });
  test('AWG 18 (ASTM B258: d = 0.005 in 92^((36-18)/39) = 1.0237 mm) is about 20.9 ohm/km (standard wire tables)', () => {
    const d = 0.005 * 0.0254 * 92 ** ((36 - 18) / 39);
    expect(Math.abs(dcResistance({ wireDiameter: d }, 1000) - 20.95)).toBeLessThan(0.1);
  });
  test('AC = DC x the exact round-wire factor at the skin depth', () => {
    const r = acResistance({ wireDiameter: 2e-3 }, 3, 1e6);
    const x = (Math.SQRT2 * 1e-3) / skinDepth(1.7241e-8, 1e6);
    expect(relErr(r.ac, r.dc * roundWireImpedanceRatio(x).re)).toBeLessThan(EXACT);
    expect(r.ac).toBeGreaterThan(r.dc);
  });
  test('litz: the same copper section in fine strands loses less to skin effect (no source needed)', () => {
    const solid = acResistance({ wireDiameter: 1e-3, strandDiameter: 1e-3 }, 2, 1e6);
    const strands = 100;
    const ds = 1e-3 / Math.sqrt(strands);
    const litz = acResistance({ wireDiameter: 1.3e-3, strands, strandDiameter: ds }, 2, 1e6);
    expect(relErr(litz.dc, solid.dc)).toBeLessThan(EXACT);
    expect(litz.ac / litz.dc).toBeLessThan(solid.ac / solid.dc);
  });
});
