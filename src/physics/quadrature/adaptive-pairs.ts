/**
 * Adaptive tensor-product quadrature of a double line integral over pairs of panels. Each leaf (panel
 * pair) is evaluated at two consecutive orders; the difference is its error estimate (conservative:
 * with geometric convergence it bounds the error of the coarser value, and the finer one is kept).
 * Leaves with the largest estimates are refined first: by the next order, or, at the top order, by
 * bisecting the longer panel (near-singular close coils). Refinement stops when the summed estimate is
 * below tol * max(|I|, ZERO_FLOOR * sum |leaf|). This is the global-adaptive strategy of QUADPACK's QAG
 * (Piessens et al., 1983) applied to panel pairs.
 */
import { kernelState } from './neumann-kernels';
import { Panel } from './panel';

/** A pair of panels and its current estimate. `weight` counts mirror pairs of a symmetric integrand. */
export interface Leaf {
  a: Panel;
  b: Panel;
  weight: number;
  level: number;
  value: number;
  error: number;
}

/** Sum over one leaf at a level; must add its node-pair count to `stats.evaluations`. */
export type LeafSum = (leaf: Leaf, level: number, stats: { evaluations: number }) => number;

/**
 * When the integral nearly cancels (a receiver at a null of coupling), relative accuracy is measured
 * against this fraction of the uncancelled magnitude sum |leaf| instead of |I|.
 */
export const ZERO_FLOOR = 1e-3;
/** Refine leaves until the leaves left alone carry at most this share of the error target. */
const UNREFINED_SHARE = 0.5;
/**
 * A pair's estimate is trusted only when its node spacing is at most this fraction of the smallest
 * kernel distance met; then the rules resolve the nearest approach and converge fast enough that the
 * difference of two orders bounds the error (checked on close coaxial loops against Maxwell).
 */
const RESOLUTION_FRACTION = 0.5;
/** Panels are not bisected below this fraction of the path's parameter range. */
const MIN_PANEL_FRACTION = 2 ** -40;

export interface AdaptiveResult {
  value: number;
  estimatedAbsoluteError: number;
  /** estimate / max(|value|, ZERO_FLOOR * sum |leaf|) */
  estimatedRelativeError: number;
  evaluations: number;
  leaves: number;
  converged: boolean;
}

/** Starting level index: coarser rules for looser tolerances. */
export function startLevel(tolerance: number): number {
  return Math.min(5, Math.max(1, Math.round(-Math.log10(tolerance) / 1.5)));
}

/**
 * A pair is resolved when its node spacing is small against the smallest kernel distance met: two coarse rules
 * that both straddle a narrow peak can agree by accident (close coils), so an unresolved pair's estimate
 * is its whole magnitude, which forces refinement.
 */
function evaluate(leaf: Leaf, level: number, sum: LeafSum, stats: { evaluations: number }): void {
  const coarse = level === leaf.level + 1 ? leaf.value : leaf.weight * sum(leaf, level - 1, stats);
  leaf.value = leaf.weight * sum(leaf, level, stats);
  const spacing = Math.max(leaf.a.arcLength() / leaf.a.order(level), leaf.b.arcLength() / leaf.b.order(level));
  const resolved = spacing <= RESOLUTION_FRACTION * Math.sqrt(kernelState[0]);
  leaf.error = resolved ? Math.abs(leaf.value - coarse) : Math.max(Math.abs(leaf.value - coarse), Math.abs(leaf.value), Math.abs(coarse));
  leaf.level = level;
}

function splitLeaf(leaf: Leaf, first: number, sum: LeafSum, stats: { evaluations: number }): Leaf[] {
  const make = (a: Panel, b: Panel, weight: number): Leaf => {
    const child: Leaf = { a, b, weight, level: first - 1, value: 0, error: 0 };
    evaluate(child, first, sum, stats);
    return child;
  };
  if (leaf.a === leaf.b) {
    const [p, q] = leaf.a.split();
    return [make(p, p, leaf.weight), make(q, q, leaf.weight), make(p, q, 2 * leaf.weight)];
  }
  if (leaf.a.arcLength() >= leaf.b.arcLength()) {
    const [p, q] = leaf.a.split();
    return [make(p, leaf.b, leaf.weight), make(q, leaf.b, leaf.weight)];
  }
  const [p, q] = leaf.b.split();
  return [make(leaf.a, p, leaf.weight), make(leaf.a, q, leaf.weight)];
}

function canSplit(leaf: Leaf): boolean {
  const big = leaf.a.t1 - leaf.a.t0 >= leaf.b.t1 - leaf.b.t0 ? leaf.a : leaf.b;
  return big.t1 - big.t0 > big.path.tEnd * MIN_PANEL_FRACTION;
}

/**
 * Integrate over the initial panel pairs to a relative tolerance.
 * @param pairs initial [a, b, weight] triples @param maxEvaluations budget of node pairs
 */
export function integratePairs(
  pairs: [Panel, Panel, number][], sum: LeafSum, tolerance: number, maxEvaluations: number,
): AdaptiveResult {
  const stats = { evaluations: 0 };
  const first = startLevel(tolerance);
  let budget = maxEvaluations;
  let leaves: Leaf[] = pairs.map(([a, b, weight]) => {
    const leaf: Leaf = { a, b, weight, level: first - 1, value: 0, error: 0 };
    evaluate(leaf, first, sum, stats);
    return leaf;
  });
  for (;;) {
    let value = 0;
    let magnitude = 0;
    let error = 0;
    for (const leaf of leaves) {
      value += leaf.value;
      magnitude += Math.abs(leaf.value);
      error += leaf.error;
    }
    const scale = Math.max(Math.abs(value), ZERO_FLOOR * magnitude);
    const target = tolerance * scale;
    const converged = error <= target || scale === 0;
    if (converged || stats.evaluations > budget) {
      return {
        value, estimatedAbsoluteError: error, estimatedRelativeError: scale > 0 ? error / scale : 0,
        evaluations: stats.evaluations, leaves: leaves.length, converged,
      };
    }
    leaves.sort((p, q) => q.error - p.error);
    let rest = error;
    const next: Leaf[] = [];
    let refined = 0;
    let i = 0;
    for (; i < leaves.length && rest > UNREFINED_SHARE * target; i++) {
      const leaf = leaves[i];
      rest -= leaf.error;
      const top = Math.min(leaf.a.maxLevel, leaf.b.maxLevel);
      if (leaf.level < top) {
        evaluate(leaf, leaf.level + 1, sum, stats);
        next.push(leaf);
        refined++;
      } else if (canSplit(leaf)) {
        for (const child of splitLeaf(leaf, first, sum, stats)) next.push(child);
        refined++;
      } else {
        next.push(leaf); // panel at the resolution floor: keeps its estimate, reported unconverged
      }
    }
    for (; i < leaves.length; i++) next.push(leaves[i]);
    leaves = next;
    if (refined === 0) budget = -1; // nothing left to refine: report as is
  }
}
