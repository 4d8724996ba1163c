/**
 * Right-handed cylindrical helix of `turns` turns: r(t) = (a cos t, a sin t, -l/2 + l t / (2 pi N)),
 * t in [0, 2 pi N], starting on +x (PRODUCT.md), then placed by a pose.
 */
import type { CoilPath } from './path';
import { applyPose, type Pose } from './pose';

/** Arc length of a helix [m]: sqrt((2 pi a N)^2 + l^2) (the unrolled helix is a straight line). */
export function helixLength(radius: number, turns: number, length: number): number {
  return Math.hypot(2 * Math.PI * radius * turns, length);
}

/** @param radius [m] @param turns [-] @param length axial length [m] @param wireRadius [m] */
export function helixPath(
  radius: number, turns: number, length: number, wireRadius: number, pose: Pose,
): CoilPath {
  const tEnd = 2 * Math.PI * turns;
  const rise = length / tEnd; // dz/dt [m/rad]
  const speed = Math.hypot(radius, rise);
  return {
    tEnd,
    closed: false,
    panelCount: Math.max(1, Math.ceil(turns - 1e-9)),
    wireRadius,
    length: helixLength(radius, turns, length),
    minSpeed: speed,
    // curvature of a helix a / (a^2 + c^2)
    minCurvatureRadius: (radius * radius + rise * rise) / radius,
    evaluate(t, out, o) {
      const c = Math.cos(t);
      const s = Math.sin(t);
      applyPose(pose, radius * c, radius * s, -length / 2 + rise * t, -radius * s, radius * c, rise, out, o);
    },
    maxSpeed: () => speed,
  };
}
