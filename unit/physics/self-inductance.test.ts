/**
 * Self-inductance (src/physics/self-inductance.ts) against the loop formula, Nagaoka's table, Rosa's
 * round-wire correction and Wheeler's formulas; the turn sum against the GMD integral on the exact path.
 */
import { coaxialLoopsMutual } from '../../src/physics/coaxial-loops';
import { helixPath } from '../../src/physics/geometry/helix';
import { loopPath } from '../../src/physics/geometry/loop';
import { IDENTITY_POSE } from '../../src/physics/geometry/pose';
import { spiralPath } from '../../src/physics/geometry/spiral';
import { gmdSelfInductance } from '../../src/physics/gmd-self-inductance';
import { helixSelfInductance, loopSelfInductance, spiralSelfInductance } from '../../src/physics/self-inductance';
import { maxwellCoaxial } from './oracles/maxwell';
import { currentSheetInductance, nagaokaCoefficient, nagaokaRosaInductance, rosaCorrections, wheelerSolenoid, wheelerSpiral } from './oracles/nagaoka';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);
/** REFERENCES.md prints the loop values to 7 significant digits. */
const PRINTED_7_DIGITS = 1e-7;

describe('circular loop of round wire (Rosa & Grover 1912)', () => {
  test('a = 0.1, r = 0.001: 620.1016 nH with Y = 1/4, 588.6857 nH with Y = 0 (REFERENCES.md COMP)', () => {
    expect(relErr(loopSelfInductance(0.1, 0.001) * 1e9, 620.1016)).toBeLessThan(PRINTED_7_DIGITS);
    expect(relErr(loopSelfInductance(0.1, 0.001, 0) * 1e9, 588.6857)).toBeLessThan(PRINTED_7_DIGITS);
  });
  test('equals coaxial loops at the GMD r e^(-1/4), 620.111 nH, to O((r/a)^2) (REFERENCES.md; Maxwell art. 692)', () => {
    const g = 0.001 * Math.exp(-0.25);
    expect(relErr(maxwellCoaxial(0.1, 0.1, g) * 1e9, 620.111)).toBeLessThan(1e-6); // printed to 6 digits
    expect(relErr(coaxialLoopsMutual(0.1, 0.1, g), loopSelfInductance(0.1, 0.001))).toBeLessThan(1e-4);
  });
  test('GMD Neumann integral on the exact loop path agrees with the loop formula to its O((g/l)^2) model error', () => {
    const r = gmdSelfInductance(loopPath(0.1, 0.001, IDENTITY_POSE), 1e-5);
    expect(relErr(r.value, maxwellCoaxial(0.1, 0.1, 0.001 * Math.exp(-0.25)))).toBeLessThan(1e-4);
  });
});

describe("Nagaoka's coefficient (Nagaoka 1909; Rosa & Grover 1912 table, 4 digits, memory)", () => {
  test.each([[0.1, 0.9588], [0.2, 0.9201], [0.5, 0.8181], [1, 0.6884], [2, 0.5255], [5, 0.3198], [10, 0.2033]])(
    '2r/l = %p -> %p (oracle formula reproduces the table)', (ratio, table) => {
      expect(Math.abs(nagaokaCoefficient(ratio) - table)).toBeLessThanOrEqual(0.5e-4 + 1e-12);
    });
  test("Rosa's B correction: B(2) = 0.1137 and B -> 0.3365 for many turns (Grover 1946 table, memory)", () => {
    expect(Math.abs(rosaCorrections(2, 1, 1).B - 0.1137)).toBeLessThan(1e-4);
    expect(Math.abs(rosaCorrections(5000, 1, 1).B - 0.3365)).toBeLessThan(2e-3);
  });
});

describe('helix: turn sum vs Nagaoka current sheet with Rosa round-wire correction (REFERENCES.md: about 2%)', () => {
  /** REFERENCES.md: "within about 2% of the Nagaoka current-sheet value with a round-wire correction". */
  const ROSA_REL_TOL = 0.02;
  test.each([
    [0.05, 20, 0.04, 0.001],
    [0.02, 20, 0.02, 0.001], // close wound
    [0.05, 10, 0.1, 0.002],
    [0.1, 50, 0.1, 0.0015],
    [0.01, 200, 0.3, 0.001],
  ])('a=%p N=%p l=%p d=%p', (a, n, l, d) => {
    const ours = helixSelfInductance(a, n, l, d / 2).value;
    expect(relErr(ours, nagaokaRosaInductance(a, n, l, d))).toBeLessThan(ROSA_REL_TOL);
  });
  test("Wheeler 1928 (memory) within its 1% of the current sheet, l > 0.8 a (sheet = ours + Rosa's correction)", () => {
    const WHEELER_REL_TOL = 0.01;
    for (const [a, n, l, d] of [[0.02, 20, 0.02, 0.001], [0.03, 30, 0.06, 0.002], [0.05, 40, 0.2, 0.005]]) {
      const { A, B } = rosaCorrections(n, l / n, d);
      const sheetFromOurs = helixSelfInductance(a, n, l, d / 2).value + 4e-7 * Math.PI * a * n * (A + B);
      expect(relErr(wheelerSolenoid(a, n, l), currentSheetInductance(a, n, l))).toBeLessThan(WHEELER_REL_TOL);
      expect(relErr(wheelerSolenoid(a, n, l), sheetFromOurs)).toBeLessThan(WHEELER_REL_TOL);
    }
  });
  test('turn sum agrees with the GMD Neumann integral on the exact helical path (pitch effect only)', () => {
    const ours = helixSelfInductance(0.05, 3, 0.006, 5e-4).value;
    const path = gmdSelfInductance(helixPath(0.05, 3, 0.006, 5e-4, IDENTITY_POSE), 1e-4);
    expect(path.converged).toBe(true);
    // neglected: the helical lead, of relative order (pitch / 2 pi a)^2 ~ 4e-5, and the blend's ~1e-5
    expect(relErr(ours, path.value)).toBeLessThan(1e-3);
  });
});

describe('flat spiral', () => {
  test('turn sum agrees with the GMD Neumann integral on the exact spiral path', () => {
    const ours = spiralSelfInductance(0.02, 0.05, 3, 5e-4).value;
    const path = gmdSelfInductance(spiralPath(0.02, 0.05, 3, 5e-4, IDENTITY_POSE), 1e-4);
    expect(relErr(ours, path.value)).toBeLessThan(5e-3);
  });
  test("Wheeler's flat-spiral formula (1928, memory) within 5% (our tolerance: round wire vs its sheet)", () => {
    const ours = spiralSelfInductance(0.02, 0.08, 20, 5e-4).value;
    expect(relErr(ours, wheelerSpiral(0.05, 20, 0.06))).toBeLessThan(0.05);
  });
  test('more turns in the same annulus give more inductance (no source needed)', () => {
    const values = [2, 4, 8].map((n) => spiralSelfInductance(0.02, 0.06, n, 5e-4).value);
    expect(values[1]).toBeGreaterThan(values[0]);
    expect(values[2]).toBeGreaterThan(values[1]);
  });
});
