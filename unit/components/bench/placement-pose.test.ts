import { coilPathPoints, type CoilSpec } from '@/physics';
import { poseFromPlacement as physicsPose } from '@/physics/geometry/pose';
import {
  angleAroundCentre, foldDegrees, movePlacement, placementFromPose, poseFromPlacement, receiverMatrix, samePlacement, snap, turnPlacement,
} from '@/components/bench/placement-pose';

/** Pure rounding of doubles: positions agree to this (metres). */
const POSITION_TOLERANCE = 1e-12;

describe('receiver pose from a placement (PRODUCT.md geometry conventions)', () => {
  test.each([
    { distance: 0.1, lateralOffset: 0, tiltDeg: 0 },
    { distance: 0.05, lateralOffset: 0.02, tiltDeg: 30 },
    { distance: -0.2, lateralOffset: -0.01, tiltDeg: -75 },
    { distance: 0.12, lateralOffset: 0.3, tiltDeg: 180 },
  ])('matches the solver pose for %o', (p) => {
    const ours = poseFromPlacement(p);
    const theirs = physicsPose(p);
    expect(ours.position).toEqual(Array.from(theirs.center));
    // the receiver's axis is R applied to +z: the third column of the row-major matrix
    const r = theirs.rotation;
    expect(ours.axis[0]).toBeCloseTo(r[2], 12);
    expect(ours.axis[1]).toBeCloseTo(r[5], 12);
    expect(ours.axis[2]).toBeCloseTo(r[8], 12);
  });

  test('positive tilt turns +z toward +x', () => {
    const { axis } = poseFromPlacement({ distance: 0.1, lateralOffset: 0, tiltDeg: 90 });
    expect(axis[0]).toBeCloseTo(1, 12);
    expect(axis[2]).toBeCloseTo(0, 12);
  });

  test('placement -> pose -> placement is the identity', () => {
    const p = { distance: 0.137, lateralOffset: -0.021, tiltDeg: 42.5 };
    const { position, axis } = poseFromPlacement(p);
    const back = placementFromPose(position, axis);
    expect(back.distance).toBe(p.distance);
    expect(back.lateralOffset).toBe(p.lateralOffset);
    expect(back.tiltDeg).toBeCloseTo(p.tiltDeg, 10);
  });

  test('poses the placement form cannot express are refused', () => {
    expect(() => placementFromPose([0, 0.01, 0.1], [0, 0, 1])).toThrow(/y = 0/);
    expect(() => placementFromPose([0, 0, 0.1], [0, 1, 0])).toThrow(/x-z plane/);
  });
});

describe('the scene transform of the receiver (receiverMatrix) draws the solver path', () => {
  // The bench builds the receiver's tube once in its own frame and only moves its group: the world
  // points must be the solver's receiver path at that placement.
  const helix: CoilSpec = { kind: 'helix', radius: 0.012, turns: 5, length: 0.02, wireDiameter: 0.0005 };
  test.each([
    { distance: 0.1, lateralOffset: 0.03, tiltDeg: 35 },
    { distance: 0.04, lateralOffset: -0.05, tiltDeg: -120 },
  ])('at %o', (p) => {
    const local = coilPathPoints(helix, null, 16);
    const world = coilPathPoints(helix, p, 16);
    const m = receiverMatrix(p);
    // column-major, as three.js Matrix4.fromArray reads it: world = M [x y z 1]^T
    for (let i = 0; i < local.length; i += 3) {
      const [x, y, z] = [local[i], local[i + 1], local[i + 2]];
      for (let row = 0; row < 3; row++) {
        const w = m[row] * x + m[4 + row] * y + m[8 + row] * z + m[12 + row];
        expect(Math.abs(w - world[i + row])).toBeLessThan(POSITION_TOLERANCE);
      }
    }
  });
});

describe('dragging', () => {
  const start = { distance: 0.1, lateralOffset: 0, tiltDeg: 10 };

  test('moving adds the drag in x and z, snapped to 0.1 mm, tilt unchanged', () => {
    expect(movePlacement(start, 0.012345, -0.03004)).toEqual({ distance: 0.07, lateralOffset: 0.0123, tiltDeg: 10 });
  });

  test('turning adds the change of angle around the centre, folded into (-180, 180]', () => {
    expect(turnPlacement(start, 0, 20.04)).toEqual({ ...start, tiltDeg: 30 });
    expect(turnPlacement({ ...start, tiltDeg: 170 }, 170, -170)).toEqual({ ...start, tiltDeg: -170 });
  });

  test('the angle around the centre is measured like the tilt (0 along +z, positive toward +x)', () => {
    expect(angleAroundCentre([0.1, 0, 0.2], [0.1, 0, 0.3])).toBeCloseTo(0, 12);
    expect(angleAroundCentre([0.1, 0, 0.2], [0.2, 0, 0.2])).toBeCloseTo(90, 12);
    expect(angleAroundCentre([0, 0, 0], [-1, 0, 0])).toBeCloseTo(-90, 12);
  });

  test('snap leaves no binary tails and fold keeps 180 but not -180', () => {
    expect(snap(0.1 + 0.2, 1e-4)).toBe(0.3);
    expect(snap(-0.00005001, 1e-4)).toBe(-0.0001);
    expect(foldDegrees(180)).toBe(180);
    expect(foldDegrees(-180)).toBe(180);
    expect(foldDegrees(370)).toBe(10);
    expect(samePlacement(start, { ...start })).toBe(true);
    expect(samePlacement(start, { ...start, tiltDeg: 11 })).toBe(false);
  });
});
