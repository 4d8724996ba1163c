/**
 * Rigid placement of a coil: world = R local + center (PRODUCT.md, "Geometry conventions").
 */
import type { Placement } from '../types';

export interface Pose {
  /** rotation matrix, row-major 3 x 3 */
  readonly rotation: Float64Array;
  /** centre [m] */
  readonly center: Float64Array;
}

/** Below this |sin| the requested normal is treated as parallel to +z or -z. */
const PARALLEL_EPSILON = 1e-15;

/** The transmitter's pose: centre at the origin, axis +z. */
export const IDENTITY_POSE: Pose = {
  rotation: Float64Array.of(1, 0, 0, 0, 1, 0, 0, 0, 1),
  center: Float64Array.of(0, 0, 0),
};

/** Rotation by angle [rad] about the y axis: +z turns toward +x for a positive angle. */
export function rotationAboutY(angleRad: number): Float64Array {
  const c = Math.cos(angleRad);
  const s = Math.sin(angleRad);
  return Float64Array.of(c, 0, s, 0, 1, 0, -s, 0, c);
}

/**
 * Shortest rotation turning +z onto the unit vector n (Rodrigues' formula about the axis z x n);
 * 180 degrees about y when n is -z (PRODUCT.md).
 */
export function rotationFromZ(normal: ArrayLike<number>): Float64Array {
  const len = Math.hypot(normal[0], normal[1], normal[2]);
  const nx = normal[0] / len;
  const ny = normal[1] / len;
  const nz = normal[2] / len;
  // axis k = z x n = (-ny, nx, 0), sin = |k|, cos = nz
  const s = Math.hypot(nx, ny);
  if (s < PARALLEL_EPSILON) return nz > 0 ? IDENTITY_POSE.rotation.slice() : rotationAboutY(Math.PI);
  const kx = -ny / s;
  const ky = nx / s;
  const c = nz;
  const v = 1 - c;
  // R = I cos + (1 - cos) k k^T + sin [k]x, with kz = 0
  return Float64Array.of(
    c + v * kx * kx, v * kx * ky, s * ky,
    v * kx * ky, c + v * ky * ky, -s * kx,
    -s * ky, s * kx, c,
  );
}

/** The receiver's pose from a placement: tilt/offset/distance form or explicit centre and normal. */
export function poseFromPlacement(placement: Placement): Pose {
  if ('normal' in placement) {
    return { rotation: rotationFromZ(placement.normal), center: Float64Array.from(placement.center) };
  }
  const tilt = ((placement.tiltDeg ?? 0) * Math.PI) / 180;
  return {
    rotation: rotationAboutY(tilt),
    center: Float64Array.of(placement.lateralOffset ?? 0, 0, placement.distance),
  };
}

/** Apply a pose to a local point p and a local vector d, writing world values into out[o..o+5]. */
export function applyPose(
  pose: Pose, px: number, py: number, pz: number, dx: number, dy: number, dz: number,
  out: Float64Array, o: number,
): void {
  const r = pose.rotation;
  const c = pose.center;
  out[o] = r[0] * px + r[1] * py + r[2] * pz + c[0];
  out[o + 1] = r[3] * px + r[4] * py + r[5] * pz + c[1];
  out[o + 2] = r[6] * px + r[7] * py + r[8] * pz + c[2];
  out[o + 3] = r[0] * dx + r[1] * dy + r[2] * dz;
  out[o + 4] = r[3] * dx + r[4] * dy + r[5] * dz;
  out[o + 5] = r[6] * dx + r[7] * dy + r[8] * dz;
}
