/**
 * One coil's predicted L, Rdc, Rac (src/physics/coil-properties.ts): the same numbers solve() gives for
 * that coil, and the published loop and resistance values.
 */
import { coilProperties, solve } from '../../src/physics';
import type { CoilSpec } from '../../src/physics/types';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
/** REFERENCES.md prints the loop value to 7 significant digits. */
const PRINTED_7_DIGITS = 1e-7;
const EXACT = 1e-12;
/** Copper, IACS 1913 (IEC 60028): 1/58 ohm mm^2/m at 20 C (REFERENCES.md). */
const COPPER_RHO = 1.7241e-8;

describe('coilProperties', () => {
  test('loop a = 0.1 m, r = 1 mm: L = 620.1016 nH (Rosa & Grover 1912, formula 152; REFERENCES.md COMP)', () => {
    const p = coilProperties({ kind: 'loop', radius: 0.1, wireDiameter: 0.002 }, 1e3);
    expect(relErr(p.selfInductance * 1e9, 620.1016)).toBeLessThan(PRINTED_7_DIGITS);
  });

  test('Rdc = rho l / A over the path length (IACS copper); the wire of a loop is 2 pi a long', () => {
    const p = coilProperties({ kind: 'loop', radius: 0.1, wireDiameter: 0.002 }, 1e3);
    expect(relErr(p.wireLength, 2 * Math.PI * 0.1)).toBeLessThan(EXACT);
    expect(relErr(p.dcResistance, (COPPER_RHO * 2 * Math.PI * 0.1) / (Math.PI * 1e-6))).toBeLessThan(1e-9);
  });

  test('skin depth of copper at 6.78 MHz is 25.4 um (REFERENCES.md), and Rac > Rdc there', () => {
    const p = coilProperties({ kind: 'helix', radius: 0.012, turns: 12, length: 0.03, wireDiameter: 0.00064 }, 6.78e6);
    expect(Math.abs(p.skinDepth * 1e6 - 25.4)).toBeLessThan(0.05); // printed to 3 digits
    expect(p.acResistance).toBeGreaterThan(5 * p.dcResistance);
    expect(relErr(p.qualityFactor, (2 * Math.PI * 6.78e6 * p.selfInductance) / p.acResistance)).toBeLessThan(EXACT);
  });

  test('at low frequency Rac tends to Rdc (no skin effect)', () => {
    const p = coilProperties({ kind: 'loop', radius: 0.05, wireDiameter: 0.0005 }, 1);
    expect(relErr(p.acResistance, p.dcResistance)).toBeLessThan(1e-9);
  });

  test.each<CoilSpec>([
    { kind: 'loop', radius: 0.015, wireDiameter: 0.001 },
    { kind: 'helix', radius: 0.012, turns: 12.5, length: 0.03, wireDiameter: 0.00064 },
    { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.14, turns: 8, wireDiameter: 0.0013, strands: 7, strandDiameter: 0.0004, material: 'aluminium', temperatureC: 60 },
  ])('equals solve()\'s transmitter values for %j (same functions, same path)', (spec) => {
    const frequency = 6.78e6;
    const p = coilProperties(spec, frequency);
    const r = solve({
      transmitter: spec,
      receiver: { kind: 'loop', radius: 0.01, wireDiameter: 0.001 },
      placement: { distance: 0.5 },
      circuit: { frequency, topology: 'SS', sourceVoltage: 1, sourceResistance: 0, loadResistance: 1 },
      tolerance: 1e-3,
    }).transmitter;
    expect(p.selfInductance).toBe(r.selfInductance);
    expect(p.dcResistance).toBe(r.dcResistance);
    expect(p.acResistance).toBe(r.acResistance);
    expect(p.wireLength).toBe(r.wireLength);
  });
});
