/**
 * Coil paths and poses (src/physics/geometry/*): PRODUCT.md geometry conventions (no source needed).
 */
import { coilPath, samplePath } from '../../../src/physics/geometry/coil-path';
import { helixLength } from '../../../src/physics/geometry/helix';
import { IDENTITY_POSE, poseFromPlacement, rotationFromZ } from '../../../src/physics/geometry/pose';
import { spiralLength } from '../../../src/physics/geometry/spiral';

const at = (spec: Parameters<typeof coilPath>[0], t: number, pose = IDENTITY_POSE) => {
  const out = new Float64Array(6);
  coilPath(spec, pose).evaluate(t, out, 0);
  return Array.from(out);
};

describe('PRODUCT.md conventions', () => {
  test('loop starts on +x and runs counter-clockwise seen from +z', () => {
    const p = at({ kind: 'loop', radius: 0.1, wireDiameter: 1e-3 }, 0);
    expect(p[0]).toBeCloseTo(0.1, 15);
    expect(p[4]).toBeGreaterThan(0); // dy/dt > 0 at +x
  });
  test('helix runs from z = -l/2 to +l/2, right-handed, starting on +x', () => {
    const spec = { kind: 'helix' as const, radius: 0.05, turns: 3, length: 0.03, wireDiameter: 1e-3 };
    expect(at(spec, 0).slice(0, 3).map((v) => +v.toFixed(12))).toEqual([0.05, 0, -0.015]);
    const end = at(spec, 2 * Math.PI * 3);
    expect(end[2]).toBeCloseTo(0.015, 14);
    expect(end[5]).toBeGreaterThan(0); // advancing along +z while turning counter-clockwise: right-handed
  });
  test('spiral radius grows linearly from inner to outer radius', () => {
    const spec = { kind: 'spiral' as const, innerRadius: 0.02, outerRadius: 0.06, turns: 4, wireDiameter: 1e-3 };
    expect(Math.hypot(...at(spec, 0).slice(0, 2))).toBeCloseTo(0.02, 15);
    expect(Math.hypot(...at(spec, 2 * Math.PI * 2).slice(0, 2))).toBeCloseTo(0.04, 15);
    expect(Math.hypot(...at(spec, 2 * Math.PI * 4).slice(0, 2))).toBeCloseTo(0.06, 15);
  });
  test('positive tilt turns the receiver axis toward +x; centre at (lateralOffset, 0, distance)', () => {
    const pose = poseFromPlacement({ distance: 0.1, lateralOffset: 0.02, tiltDeg: 30 });
    expect([pose.rotation[2], pose.rotation[5], pose.rotation[8]].map((v) => +v.toFixed(12))).toEqual([0.5, 0, +Math.cos(Math.PI / 6).toFixed(12)]);
    expect(Array.from(pose.center)).toEqual([0.02, 0, 0.1]);
  });
  test('explicit normal: shortest rotation of +z onto it; 180 degrees about y for -z', () => {
    const r = rotationFromZ([1, 2, 2]);
    expect([r[2], r[5], r[8]].map((v) => +v.toFixed(12))).toEqual([1 / 3, 2 / 3, 2 / 3].map((v) => +v.toFixed(12)));
    const flip = rotationFromZ([0, 0, -1]);
    expect(Array.from(flip).map((v) => +v.toFixed(12) + 0)).toEqual([-1, 0, 0, 0, 1, 0, 0, 0, -1]);
    // orthonormal: R R^T = I
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
      const dot = r[3 * i] * r[3 * j] + r[3 * i + 1] * r[3 * j + 1] + r[3 * i + 2] * r[3 * j + 2];
      expect(dot).toBeCloseTo(i === j ? 1 : 0, 14);
    }
  });
});

describe('arc lengths', () => {
  test('helix: sqrt((2 pi a N)^2 + l^2); spiral: closed form vs a fine polyline', () => {
    expect(helixLength(0.05, 20, 0.04)).toBeCloseTo(Math.hypot(2 * Math.PI * 0.05 * 20, 0.04), 14);
    const spec = { kind: 'spiral' as const, innerRadius: 0.01, outerRadius: 0.07, turns: 5, wireDiameter: 1e-3 };
    const pts = samplePath(coilPath(spec, IDENTITY_POSE), 20000);
    let polyline = 0;
    for (let i = 3; i < pts.length; i += 3) polyline += Math.hypot(pts[i] - pts[i - 3], pts[i + 1] - pts[i - 2], pts[i + 2] - pts[i - 1]);
    // polyline error ~ L (h kappa)^2 / 24 with h ~ 2 pi r / 20000: below 1e-8 relative
    expect(Math.abs(polyline / spiralLength(0.01, 0.07, 5) - 1)).toBeLessThan(1e-8);
  });
});
