/**
 * Do two wire axes come closer than a threshold (the sum of the wire radii)? Branch and bound over
 * parameter panels with axis-aligned bounding boxes: a panel's box holds its K + 1 sample points, padded by
 * the largest sagitta kappa h^2 / 8 of an arc of length h and curvature at most kappa between neighbouring
 * samples (every point of the curve is within that of a chord, and chords lie inside the sample box).
 * Pairs of panels whose boxes are at least the threshold apart are dropped; the others are bisected.
 */
import type { CoilPath } from './geometry/path';

/** Sample intervals per panel for its bounding box. */
const BOX_INTERVALS = 8;
/** Counted as touching when two sampled points are within (1 + this) times the threshold. */
export const CLEARANCE_SLACK = 1e-3;
/** Stop bisecting when both panels are shorter than this fraction of the threshold. */
const SMALLEST_PANEL_FRACTION = 1e-3;
/** Safety cap on examined panel pairs. */
const MAX_PAIRS = 200_000;

export interface ClearanceResult {
  /** the axes come within the threshold (within CLEARANCE_SLACK) */
  touching: boolean;
  /** smallest distance between sampled points [m] (an upper bound of the true minimum) */
  closestSampled: number;
}

const scratch = new Float64Array(6);

/** Box [xmin, ymin, zmin, xmax, ymax, zmax] of a panel, padded; also tracks the smallest sample distance. */
function panelBox(path: CoilPath, t0: number, t1: number, box: Float64Array): void {
  box.set([Infinity, Infinity, Infinity, -Infinity, -Infinity, -Infinity]);
  for (let i = 0; i <= BOX_INTERVALS; i++) {
    path.evaluate(t0 + ((t1 - t0) * i) / BOX_INTERVALS, scratch, 0);
    for (let k = 0; k < 3; k++) {
      box[k] = Math.min(box[k], scratch[k]);
      box[k + 3] = Math.max(box[k + 3], scratch[k]);
    }
  }
  const h = (path.maxSpeed(t0, t1) * (t1 - t0)) / BOX_INTERVALS;
  const pad = (h * h) / (8 * path.minCurvatureRadius);
  for (let k = 0; k < 3; k++) {
    box[k] -= pad;
    box[k + 3] += pad;
  }
}

function boxDistance(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let k = 0; k < 3; k++) {
    const gap = Math.max(0, b[k] - a[k + 3], a[k] - b[k + 3]);
    s += gap * gap;
  }
  return Math.sqrt(s);
}

/** Check whether the axes of two paths come within `threshold` [m]. */
export function checkClearance(a: CoilPath, b: CoilPath, threshold: number): ClearanceResult {
  const boxA = new Float64Array(6);
  const boxB = new Float64Array(6);
  const pa = new Float64Array(6);
  const pb = new Float64Array(6);
  const stack: number[] = [];
  // whole-turn boxes once; only pairs of turns whose boxes come within the threshold are searched
  const turnBoxes = (p: CoilPath) => Array.from({ length: p.panelCount }, (_, i) => {
    const box = new Float64Array(6);
    panelBox(p, (p.tEnd * i) / p.panelCount, (p.tEnd * (i + 1)) / p.panelCount, box);
    return box;
  });
  const turnsA = turnBoxes(a);
  const turnsB = turnBoxes(b);
  for (let i = 0; i < a.panelCount; i++) {
    for (let j = 0; j < b.panelCount; j++) {
      if (boxDistance(turnsA[i], turnsB[j]) >= threshold) continue;
      stack.push((a.tEnd * i) / a.panelCount, (a.tEnd * (i + 1)) / a.panelCount,
        (b.tEnd * j) / b.panelCount, (b.tEnd * (j + 1)) / b.panelCount);
    }
  }
  let closest = Infinity;
  let examined = 0;
  while (stack.length > 0 && examined++ < MAX_PAIRS) {
    const b1 = stack.pop()!, b0 = stack.pop()!, a1 = stack.pop()!, a0 = stack.pop()!;
    a.evaluate(0.5 * (a0 + a1), pa, 0);
    b.evaluate(0.5 * (b0 + b1), pb, 0);
    closest = Math.min(closest, Math.hypot(pa[0] - pb[0], pa[1] - pb[1], pa[2] - pb[2]));
    if (closest < threshold * (1 + CLEARANCE_SLACK)) return { touching: true, closestSampled: closest };
    panelBox(a, a0, a1, boxA);
    panelBox(b, b0, b1, boxB);
    if (boxDistance(boxA, boxB) >= threshold) continue;
    const lenA = a.maxSpeed(a0, a1) * (a1 - a0);
    const lenB = b.maxSpeed(b0, b1) * (b1 - b0);
    if (Math.max(lenA, lenB) < SMALLEST_PANEL_FRACTION * threshold) continue;
    if (lenA >= lenB) {
      const am = 0.5 * (a0 + a1);
      stack.push(a0, am, b0, b1, am, a1, b0, b1);
    } else {
      const bm = 0.5 * (b0 + b1);
      stack.push(a0, a1, b0, bm, a0, a1, bm, b1);
    }
  }
  return { touching: false, closestSampled: closest };
}
