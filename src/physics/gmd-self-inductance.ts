/**
 * Reference method (used by the tests to check the turn-sum in self-inductance.ts; too slow for live use,
 * since the integrand is nearly singular along whole lines of the parameter square):
 * Maxwell's geometric-mean-distance method (Treatise, 1873, art. 691-692) in the form
 *   of Rosa (Bull. Bureau of Standards 4, 1908) and Grover (Inductance Calculations, 1946): the wire's
 *   own section contributes as a filament paired with a copy at the GMD g = r e^(-1/4), and distinct
 *   parts of the winding (other turns) couple as filaments. One Neumann integral of the path with itself
 *   does both, with kernel 1 / sqrt(R^2 + g^2 phi) and phi = exp(-(ds/l)^2) switching smoothly from the
 *   own-section term (ds << l) to the plain filament term (ds ~ one turn). Chosen over Nagaoka's sheet
 *   formula because it follows the exact path (pitch, lead, ends). The smooth switch adds a modelling error
 *   of order (g/l)^2 ln(l/g), about 1e-5 for r/a = 1/100.
 */
import { ROUND_WIRE_GMD_FACTOR } from './constants';
import type { CoilPath } from './geometry/path';
import { basePanels, DEFAULT_TOLERANCE, MAX_EVALUATIONS, toInductance, type InductanceEstimate } from './neumann';
import { integratePairs, type Leaf } from './quadrature/adaptive-pairs';
import { BLEND_CUTOFF_SQUARED, gmdPairSum, neumannPairSum } from './quadrature/neumann-kernels';
import type { Panel } from './quadrature/panel';

/** Blend length l as a multiple of the path's smallest radius of curvature: one turn is 2 pi l away. */
export const BLEND_LENGTH_PER_CURVATURE_RADIUS = 1;

/**
 * Self-inductance [H] of any coil path of round wire by Maxwell's GMD method as one Neumann integral
 * (see the file comment). Symmetric: panel pairs (p, q) with p < q are counted twice.
 */
export function gmdSelfInductance(
  path: CoilPath, tolerance = DEFAULT_TOLERANCE, maxEvaluations = MAX_EVALUATIONS,
): InductanceEstimate {
  const g = path.wireRadius * ROUND_WIRE_GMD_FACTOR;
  const blend = BLEND_LENGTH_PER_CURVATURE_RADIUS * path.minCurvatureRadius;
  const g2 = g * g;
  const invBlend2 = 1 / (blend * blend);
  const period = path.closed ? path.tEnd : 0;
  const panels = basePanels(path);
  const pairs: [Panel, Panel, number][] = [];
  for (let i = 0; i < panels.length; i++) {
    for (let j = i; j < panels.length; j++) pairs.push([panels[i], panels[j], i === j ? 1 : 2]);
  }
  const sum = (leaf: Leaf, level: number, stats: { evaluations: number }) => {
    const { a, b } = leaf;
    const na = a.order(level);
    const nb = b.order(level);
    stats.evaluations += na * nb;
    const gap = Math.max(0, b.t0 - a.t1, a.t0 - b.t1) * path.minSpeed;
    if (gap * gap * invBlend2 > BLEND_CUTOFF_SQUARED) {
      return neumannPairSum(a.nodes(level), na, b.nodes(level), nb);
    }
    return gmdPairSum(a.nodes(level), na, b.nodes(level), nb, g2, invBlend2, period);
  };
  return toInductance(integratePairs(pairs, sum, tolerance, maxEvaluations));
}
