/**
 * Flat Archimedean spiral: r(t) = ri + b t with b = (ro - ri) / (2 pi N), position (r cos t, r sin t, 0),
 * t in [0, 2 pi N], counter-clockwise from +x (PRODUCT.md), then placed by a pose. Leads are not modelled.
 */
import type { CoilPath } from './path';
import { applyPose, type Pose } from './pose';

/**
 * Arc length of an Archimedean spiral [m]: integral of sqrt(b^2 + r^2) dt
 * = [r sqrt(r^2 + b^2) + b^2 asinh(r / b)] / (2 b) between ri and ro (Archimedes' spiral, standard integral).
 */
export function spiralLength(innerRadius: number, outerRadius: number, turns: number): number {
  const b = (outerRadius - innerRadius) / (2 * Math.PI * turns);
  if (b === 0) return 2 * Math.PI * turns * innerRadius;
  const f = (r: number) => r * Math.hypot(r, b) + b * b * Math.asinh(r / b);
  return (f(outerRadius) - f(innerRadius)) / (2 * b);
}

/** @param innerRadius [m] @param outerRadius [m] @param turns [-] @param wireRadius [m] */
export function spiralPath(
  innerRadius: number, outerRadius: number, turns: number, wireRadius: number, pose: Pose,
): CoilPath {
  const tEnd = 2 * Math.PI * turns;
  const b = (outerRadius - innerRadius) / tEnd; // dr/dt [m/rad]
  // curvature (r^2 + 2 b^2) / (r^2 + b^2)^(3/2) decreases with r: largest at the inner end
  const ri2 = innerRadius * innerRadius;
  const kappaMax = (ri2 + 2 * b * b) / Math.pow(ri2 + b * b, 1.5);
  return {
    tEnd,
    closed: false,
    panelCount: Math.max(1, Math.ceil(turns - 1e-9)),
    wireRadius,
    length: spiralLength(innerRadius, outerRadius, turns),
    minSpeed: Math.hypot(b, innerRadius),
    minCurvatureRadius: 1 / kappaMax,
    evaluate(t, out, o) {
      const c = Math.cos(t);
      const s = Math.sin(t);
      const r = innerRadius + b * t;
      applyPose(pose, r * c, r * s, 0, b * c - r * s, b * s + r * c, 0, out, o);
    },
    // speed sqrt(b^2 + r^2) grows with t
    maxSpeed: (_t0, t1) => Math.hypot(b, innerRadius + b * t1),
  };
}
