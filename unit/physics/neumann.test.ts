/**
 * Mutual inductance by Neumann's integral (src/physics/neumann.ts) against published closed forms and an
 * independent single-integral oracle.
 */
import { loopPath } from '../../src/physics/geometry/loop';
import { helixPath } from '../../src/physics/geometry/helix';
import { IDENTITY_POSE, poseFromPlacement } from '../../src/physics/geometry/pose';
import { mutualInductance } from '../../src/physics/neumann';
import type { Placement } from '../../src/physics/types';
import { babicMutual } from './oracles/babic-2010';
import { maxwellCoaxial, MU0 } from './oracles/maxwell';

/** Relative tolerance of the coaxial checks. */
const COAXIAL_REL_TOL = 1e-9;
/** Relative tolerance of the tilted/offset checks. */
const OFFSET_REL_TOL = 1e-7;
/** REFERENCES.md COMP values are printed to ~13 digits. */
const COMP_REL_TOL = 1e-9;
const WIRE = 1e-4;

const loop = (radius: number) => loopPath(radius, WIRE, IDENTITY_POSE);
const placed = (radius: number, placement: Placement) => loopPath(radius, WIRE, poseFromPlacement(placement));
const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

describe('coaxial circles: Maxwell, Treatise (1873) art. 701, via @stdlib elliptic integrals', () => {
  const cases: [number, number, number][] = [];
  for (const [a, b] of [[0.1, 0.1], [0.2, 0.1], [0.05, 0.15], [0.01, 0.3]]) {
    for (const d of [0.002, 0.01, 0.05, 0.1, 0.3, 1, 2]) cases.push([a, b, d]);
  }
  test.each(cases)('a=%p b=%p d=%p to 1e-9 relative', (a, b, d) => {
    const m = mutualInductance(loop(a), placed(b, { distance: d }), 1e-10);
    expect(relErr(m.value, maxwellCoaxial(a, b, d))).toBeLessThan(COAXIAL_REL_TOL);
  });

  test.each([
    [0.1, 0.1, 0.1, 49.40784630798268],
    [0.2, 0.1, 0.1, 69.87324633639456],
    [0.05, 0.15, 0, 34.37310823323893],
    [0.1, 0.1, 1.0, 0.1916495325405899],
  ])('REFERENCES.md COMP row a=%p b=%p d=%p -> %p nH', (a, b, d, nH) => {
    const m = mutualInductance(loop(a), placed(b, { distance: d }), 1e-10);
    expect(relErr(m.value * 1e9, nH)).toBeLessThan(COMP_REL_TOL);
  });

  test('close circles approach Maxwell (1865) mu0 a (ln(8a/d) - 2), error O((d/a)^2 ln)', () => {
    const a = 0.1;
    for (const d of [1e-3, 3e-3]) {
      const m = mutualInductance(loop(a), placed(a, { distance: d }), 1e-8).value;
      const limit = MU0 * a * (Math.log((8 * a) / d) - 2);
      // next term of the expansion is of order (d/a)^2 ln(a/d) relative; 10x margin
      expect(relErr(m, limit)).toBeLessThan(10 * (d / a) ** 2 * Math.log(a / d));
    }
  });

  test('far circles approach the dipole limit mu0 pi a^2 b^2 / (2 d^3) (REFERENCES.md)', () => {
    const a = 0.05, b = 0.03;
    const dev = [2, 4, 8].map((d) => {
      const m = mutualInductance(loop(a), placed(b, { distance: d }), 1e-9).value;
      return relErr(m, (MU0 * Math.PI * a * a * b * b) / (2 * d ** 3));
    });
    // deviation is O((a^2 + b^2) / d^2): below 2 (a^2+b^2)/d^2 and falling about 4x per doubling
    expect(dev[0]).toBeLessThan((2 * (a * a + b * b)) / 4);
    expect(dev[1] / dev[2]).toBeGreaterThan(3.5);
    expect(dev[1] / dev[2]).toBeLessThan(4.5);
  });
});

describe('tilted and offset circles: Babic et al., IEEE Trans. Magn. 46(9), 2010 single integral (oracle)', () => {
  test.each([
    [0.2, 0.1, [0.05, 0, 0.1], [0, 0, 1], 68.349884703843],
    [0.2, 0.1, [0, 0, 0.1], [1, 0, 1], 50.159685370739],
    [0.2, 0.1, [0.05, 0.02, 0.1], [0.3, 0.4, 1], 69.194060652723],
    [0.1, 0.1, [0.25, 0, 0], [0, 0, 1], -10.4117450885],
  ] as [number, number, [number, number, number], [number, number, number], number][])(
    'REFERENCES.md row a=%p b=%p centre %p normal %p -> %p nH', (a, b, center, normal, nH) => {
      const oracle = babicMutual(a, b, center, normal);
      expect(relErr(oracle * 1e9, nH)).toBeLessThan(COMP_REL_TOL); // the oracle reproduces the COMP value
      const m = mutualInductance(loop(a), placed(b, { center, normal }), 1e-9).value;
      expect(relErr(m, oracle)).toBeLessThan(OFFSET_REL_TOL);
    });

  const poses: [string, Placement][] = [
    ['tilt 30, offset 2 cm, 10 cm', { distance: 0.1, lateralOffset: 0.02, tiltDeg: 30 }],
    ['tilt 60, offset 5 cm, 5 cm', { distance: 0.05, lateralOffset: 0.05, tiltDeg: 60 }],
    ['tilt -45, 3 cm', { distance: 0.03, tiltDeg: -45 }],
    ['normal along y (Babic special case)', { center: [0.01, 0.02, 0.08], normal: [0, 1, 0] }],
    ['normal -z (turned over)', { center: [0.03, -0.01, 0.06], normal: [0, 0, -1] }],
    ['skew', { center: [-0.04, 0.07, 0.02], normal: [0.7, -0.2, 0.4] }],
  ];
  test.each(poses)('%s to 1e-7 relative', (_name, placement) => {
    const { rotation, center } = poseFromPlacement(placement);
    const normal: [number, number, number] = [rotation[2], rotation[5], rotation[8]];
    const oracle = babicMutual(0.1, 0.04, [center[0], center[1], center[2]], normal);
    const m = mutualInductance(loop(0.1), placed(0.04, placement), 1e-9);
    expect(relErr(m.value, oracle)).toBeLessThan(OFFSET_REL_TOL);
  });
});

describe('symmetry facts (no source needed)', () => {
  test('M = 0 for a centred receiver whose axis is perpendicular to the transmitter axis', () => {
    const m = mutualInductance(loop(0.1), placed(0.05, { distance: 0.05, tiltDeg: 90 }), 1e-8);
    expect(Math.abs(m.value)).toBeLessThan(1e-9 * MU0 * 0.1);
  });
  test('M(a, b) = M(b, a)', () => {
    const ab = mutualInductance(loop(0.1), placed(0.04, { distance: 0.07 }), 1e-10).value;
    const ba = mutualInductance(loop(0.04), placed(0.1, { distance: 0.07 }), 1e-10).value;
    expect(relErr(ab, ba)).toBeLessThan(1e-12 * 1e3);
  });
  test('M flips sign when the receiver turns over', () => {
    const up = mutualInductance(loop(0.1), placed(0.05, { center: [0.02, 0, 0.05], normal: [0, 0, 1] }), 1e-10).value;
    const down = mutualInductance(loop(0.1), placed(0.05, { center: [0.02, 0, 0.05], normal: [0, 0, -1] }), 1e-10).value;
    expect(up).toBeGreaterThan(0);
    expect(relErr(-down, up)).toBeLessThan(1e-9);
  });
  test('scaling M(l a, l b, l d) = l M(a, b, d)', () => {
    const base = mutualInductance(helixPath(0.05, 5, 0.02, WIRE, IDENTITY_POSE), placed(0.03, { distance: 0.06, tiltDeg: 20 }), 1e-10).value;
    const l = 3.7;
    const big = mutualInductance(helixPath(l * 0.05, 5, l * 0.02, WIRE, IDENTITY_POSE),
      loopPath(l * 0.03, WIRE, poseFromPlacement({ distance: l * 0.06, tiltDeg: 20 })), 1e-10).value;
    expect(relErr(big, l * base)).toBeLessThan(1e-9);
  });
});

describe('convergence: the error estimate bounds the true error (oracle cases)', () => {
  const cases: [string, () => ReturnType<typeof loop>, number][] = [
    ['coaxial 10 cm', () => placed(0.1, { distance: 0.1 }), maxwellCoaxial(0.1, 0.1, 0.1)],
    ['coaxial 1 mm (near-singular)', () => placed(0.1, { distance: 0.001 }), maxwellCoaxial(0.1, 0.1, 0.001)],
    ['coplanar side by side', () => placed(0.1, { center: [0.25, 0, 0], normal: [0, 0, 1] }), babicMutual(0.1, 0.1, [0.25, 0, 0], [0, 0, 1])],
  ];
  test.each(cases)('%s', (_name, receiver, exact) => {
    let previous = Infinity;
    for (const tol of [1e-3, 1e-5, 1e-7, 1e-9]) {
      const m = mutualInductance(loop(0.1), receiver(), tol);
      const trueError = relErr(m.value, exact);
      expect(m.converged).toBe(true);
      expect(m.estimatedRelativeError).toBeLessThanOrEqual(tol);
      // 1e-13: floor of the oracles' own rounding
      expect(trueError).toBeLessThanOrEqual(m.estimatedRelativeError + 1e-13);
      expect(m.integrandEvaluations).toBeGreaterThanOrEqual(previous === Infinity ? 0 : 1);
      previous = trueError;
    }
  });
  test('tighter tolerance uses more evaluations and gets closer (two helices, 12 cm)', () => {
    const tx = () => helixPath(0.05, 20, 0.04, 5e-4, IDENTITY_POSE);
    const rx = () => helixPath(0.05, 20, 0.04, 5e-4, poseFromPlacement({ distance: 0.12 }));
    const ref = mutualInductance(tx(), rx(), 1e-12).value;
    const loose = mutualInductance(tx(), rx(), 1e-4);
    const tight = mutualInductance(tx(), rx(), 1e-6);
    expect(tight.integrandEvaluations).toBeGreaterThan(loose.integrandEvaluations);
    expect(relErr(loose.value, ref)).toBeLessThanOrEqual(loose.estimatedRelativeError);
    expect(relErr(tight.value, ref)).toBeLessThanOrEqual(tight.estimatedRelativeError);
    expect(relErr(tight.value, ref)).toBeLessThan(relErr(loose.value, ref));
  });
});
