/**
 * Gauss-Legendre quadrature on [-1, 1]: the n nodes are the zeros of the Legendre polynomial P_n and
 * the weights are w_i = 2 / ((1 - x_i^2) P_n'(x_i)^2) (Abramowitz & Stegun 25.4.29; Golub & Welsch 1969
 * give the same rule by eigenvalues). Exact for polynomials of degree 2n - 1; for a function analytic
 * inside the Bernstein ellipse of parameter rho the error falls like rho^(-2n) (Trefethen, "Is Gauss
 * quadrature better than Clenshaw-Curtis?", SIAM Review 50, 2008).
 */
export interface GaussRule {
  /** nodes on [-1, 1], ascending */
  readonly nodes: Float64Array;
  /** weights, summing to 2 */
  readonly weights: Float64Array;
}

/** Newton steps stop when the update is below this (a few ulps of 1). */
const NEWTON_TOLERANCE = 1e-15;
/** Newton converges in 3-5 steps from Tricomi's initial guess; this is a safety cap. */
const NEWTON_MAX_STEPS = 100;
/** Largest order we build (the solver uses at most a few hundred). */
export const GAUSS_MAX_ORDER = 1024;

const cache = new Map<number, GaussRule>();
const scratch = new Float64Array(1);

/** Newton step P_n(x) / P_n'(x) by the three-term recurrence; writes P_n'(x) into out[0]. */
function legendre(n: number, x: number, out: Float64Array): number {
  let p0 = 1;
  let p1 = x;
  for (let k = 2; k <= n; k++) {
    const p2 = ((2 * k - 1) * x * p1 - (k - 1) * p0) / k;
    p0 = p1;
    p1 = p2;
  }
  // P_n'(x) = n (x P_n - P_{n-1}) / (x^2 - 1)
  out[0] = (n * (x * p1 - p0)) / (x * x - 1);
  return p1 / out[0];
}

/**
 * The n-point Gauss-Legendre rule, computed once by Newton's method on the three-term recurrence
 * (n+1) P_{n+1} = (2n+1) x P_n - n P_{n-1}, from the initial guess x = cos(pi (i - 1/4) / (n + 1/2))
 * (Tricomi; used in Numerical Recipes' gauleg), and cached.
 */
export function gaussLegendre(n: number): GaussRule {
  if (!Number.isInteger(n) || n < 1 || n > GAUSS_MAX_ORDER) {
    throw new RangeError(`Gauss-Legendre order must be an integer in 1..${GAUSS_MAX_ORDER}, got ${n}`);
  }
  const hit = cache.get(n);
  if (hit) return hit;
  const nodes = new Float64Array(n);
  const weights = new Float64Array(n);
  const half = Math.floor((n + 1) / 2);
  for (let i = 0; i < half; i++) {
    let x = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5));
    for (let step = 0; step < NEWTON_MAX_STEPS; step++) {
      const dx = legendre(n, x, scratch);
      x -= dx;
      if (Math.abs(dx) < NEWTON_TOLERANCE) break;
    }
    legendre(n, x, scratch); // P_n' at the converged node, for the weight
    const dp = scratch[0];
    const w = 2 / ((1 - x * x) * dp * dp);
    nodes[i] = -x;
    nodes[n - 1 - i] = x;
    weights[i] = w;
    weights[n - 1 - i] = w;
  }
  if (n % 2 === 1) nodes[(n - 1) / 2] = 0;
  const rule = { nodes, weights };
  cache.set(n, rule);
  return rule;
}
