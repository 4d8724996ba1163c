/**
 * Tensor-product sums of Neumann's integrand over two sampled panels (the hot loops of the solver):
 * sum_i sum_j (w_i t_i . w_j t_j) / D_ij. They allocate nothing. Each also records the smallest D^2 met,
 * in kernelState[0], so the driver can tell a resolved near-singular pair from an unresolved one.
 */
import { NODE_STRIDE } from './panel';

/** [0]: smallest squared kernel distance D^2 [m^2] of the last pair sum. */
export const kernelState = new Float64Array(1);

/** Plain Neumann kernel D = |r_i - r_j| (F. E. Neumann 1845; Maxwell's Treatise art. 524). */
export function neumannPairSum(a: Float64Array, na: number, b: Float64Array, nb: number): number {
  let sum = 0;
  let min2 = Infinity;
  const endA = na * NODE_STRIDE;
  const endB = nb * NODE_STRIDE;
  for (let i = 0; i < endA; i += NODE_STRIDE) {
    const xi = a[i], yi = a[i + 1], zi = a[i + 2];
    const ui = a[i + 3], vi = a[i + 4], wi = a[i + 5];
    let s = 0;
    for (let j = 0; j < endB; j += NODE_STRIDE) {
      const dx = xi - b[j], dy = yi - b[j + 1], dz = zi - b[j + 2];
      const r2 = dx * dx + dy * dy + dz * dz;
      if (r2 < min2) min2 = r2;
      s += (ui * b[j + 3] + vi * b[j + 4] + wi * b[j + 5]) / Math.sqrt(r2);
    }
    sum += s;
  }
  kernelState[0] = min2;
  return sum;
}

/** exp(-36) ~ 2e-16: beyond this blend argument the wire's own-section term is dropped. */
export const BLEND_CUTOFF_SQUARED = 36;

/**
 * Neumann kernel of one wire with itself, D = sqrt(|r_i - r_j|^2 + g^2 phi), phi = exp(-(ds / l)^2),
 * ds = |t_i - t_j| (v_i + v_j) / 2 the distance along the wire. Near the diagonal the filament sees its
 * copy at the geometric mean distance g (Maxwell art. 692; Rosa, Bull. Bureau of Standards 4, 1908);
 * other turns (ds >> l) see the plain 1/|r_i - r_j| kernel.
 * @param g2 squared geometric mean distance [m^2] @param invBlend2 1 / l^2 [1/m^2]
 * @param period parameter period of a closed path [rad] (|t_i - t_j| is taken modulo it), 0 if open
 */
export function gmdPairSum(
  a: Float64Array, na: number, b: Float64Array, nb: number, g2: number, invBlend2: number, period: number,
): number {
  const halfPeriod = 0.5 * period;
  let sum = 0;
  let min2 = Infinity;
  const endA = na * NODE_STRIDE;
  const endB = nb * NODE_STRIDE;
  for (let i = 0; i < endA; i += NODE_STRIDE) {
    const xi = a[i], yi = a[i + 1], zi = a[i + 2];
    const ui = a[i + 3], vi = a[i + 4], wi = a[i + 5];
    const ti = a[i + 6], si = a[i + 7];
    let s = 0;
    for (let j = 0; j < endB; j += NODE_STRIDE) {
      const dx = xi - b[j], dy = yi - b[j + 1], dz = zi - b[j + 2];
      let dt = Math.abs(ti - b[j + 6]);
      if (period > 0 && dt > halfPeriod) dt = period - dt;
      const ds = dt * 0.5 * (si + b[j + 7]);
      const arg = ds * ds * invBlend2;
      const reg = arg < BLEND_CUTOFF_SQUARED ? g2 * Math.exp(-arg) : 0;
      const d2 = dx * dx + dy * dy + dz * dz + reg;
      if (d2 < min2) min2 = d2;
      s += (ui * b[j + 3] + vi * b[j + 4] + wi * b[j + 5]) / Math.sqrt(d2);
    }
    sum += s;
  }
  kernelState[0] = min2;
  return sum;
}
