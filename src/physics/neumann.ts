/**
 * Mutual inductance of two coil paths by Neumann's double line integral
 *   M = mu0 / (4 pi) oint oint (dl1 . dl2) / |r1 - r2|
 * (F. E. Neumann, Abh. Berlin 1845; Maxwell, Treatise 1873, art. 524), with composite Gauss-Legendre on
 * one panel per turn (periodic trapezoid for a whole loop), refined adaptively (quadrature/adaptive-pairs).
 */
import { MU0_OVER_4PI } from './constants';
import type { CoilPath } from './geometry/path';
import { integratePairs, type AdaptiveResult, type Leaf } from './quadrature/adaptive-pairs';
import { neumannPairSum } from './quadrature/neumann-kernels';
import { Panel } from './quadrature/panel';

/** Default requested relative tolerance (PRODUCT.md). */
export const DEFAULT_TOLERANCE = 1e-6;
/** Budget of integrand evaluations (node pairs) for one integral: about 1-2 s on one core. */
export const MAX_EVALUATIONS = 1e9;

export interface InductanceEstimate {
  /** inductance [H] */
  value: number;
  /** [H] */
  estimatedAbsoluteError: number;
  estimatedRelativeError: number;
  integrandEvaluations: number;
  converged: boolean;
}

/** One panel per (started) turn of the path. */
export function basePanels(path: CoilPath): Panel[] {
  const n = path.panelCount;
  if (n === 1) return [new Panel(path, 0, path.tEnd)];
  const panels: Panel[] = [];
  for (let i = 0; i < n; i++) panels.push(new Panel(path, (path.tEnd * i) / n, (path.tEnd * (i + 1)) / n));
  return panels;
}

/** Scale an adaptive result of the bare double integral by mu0 / (4 pi). */
export function toInductance(r: AdaptiveResult): InductanceEstimate {
  return {
    value: MU0_OVER_4PI * r.value,
    estimatedAbsoluteError: MU0_OVER_4PI * r.estimatedAbsoluteError,
    estimatedRelativeError: r.estimatedRelativeError,
    integrandEvaluations: r.evaluations,
    converged: r.converged,
  };
}

/**
 * Mutual inductance [H] of two filamentary paths (Neumann's formula) to a requested relative tolerance.
 * The paths must not touch (the integrand is singular where they meet): validate clearance first.
 */
export function mutualInductance(
  a: CoilPath, b: CoilPath, tolerance = DEFAULT_TOLERANCE, maxEvaluations = MAX_EVALUATIONS,
): InductanceEstimate {
  const pairs: [Panel, Panel, number][] = [];
  const panelsB = basePanels(b);
  for (const p of basePanels(a)) for (const q of panelsB) pairs.push([p, q, 1]);
  const sum = (leaf: Leaf, level: number, stats: { evaluations: number }) => {
    const na = leaf.a.order(level);
    const nb = leaf.b.order(level);
    stats.evaluations += na * nb;
    return neumannPairSum(leaf.a.nodes(level), na, leaf.b.nodes(level), nb);
  };
  return toInductance(integratePairs(pairs, sum, tolerance, maxEvaluations));
}
