/**
 * Circular loop: r(t) = (a cos t, a sin t, 0), t in [0, 2 pi], counter-clockwise seen from +z
 * (PRODUCT.md), then placed by a pose.
 */
import type { CoilPath } from './path';
import { applyPose, type Pose } from './pose';

/** @param radius loop radius [m] @param wireRadius [m] */
export function loopPath(radius: number, wireRadius: number, pose: Pose): CoilPath {
  return {
    tEnd: 2 * Math.PI,
    closed: true,
    panelCount: 1,
    wireRadius,
    length: 2 * Math.PI * radius,
    minSpeed: radius,
    minCurvatureRadius: radius,
    evaluate(t, out, o) {
      const c = Math.cos(t);
      const s = Math.sin(t);
      applyPose(pose, radius * c, radius * s, 0, -radius * s, radius * c, 0, out, o);
    },
    maxSpeed: () => radius,
  };
}
