/**
 * Complete elliptic integrals of the first and second kind, K(m) and E(m), parameter m = k^2, by the
 * arithmetic-geometric mean (Abramowitz & Stegun 17.6.1-17.6.4; King, "On the direct numerical calculation
 * of elliptic functions and integrals", 1924). Callers pass the complementary parameter m1 = 1 - m as well,
 * computed without cancellation, because near m = 1 (close filaments) 1 - m is what carries the precision.
 */

/** AGM stops when |a - b| falls below this relative amount (quadratic convergence: 5-6 steps). */
const AGM_TOLERANCE = 1e-16;
/** Safety cap on AGM steps. */
const AGM_MAX_STEPS = 40;

export interface EllipticPair {
  K: number;
  E: number;
}

/**
 * K(m) and E(m) from the AGM of 1 and sqrt(m1): K = pi / (2 AGM), E = K (1 - sum 2^(n-1) c_n^2), c_0^2 = m.
 * @param m parameter k^2 in [0, 1) @param m1 complementary parameter 1 - m, in (0, 1]
 */
export function ellipticKE(m: number, m1 = 1 - m): EllipticPair {
  let a = 1;
  let b = Math.sqrt(m1);
  let sum = 0.5 * m; // 2^(-1) c_0^2
  let power = 0.5;
  for (let i = 0; i < AGM_MAX_STEPS; i++) {
    const c = 0.5 * (a - b);
    power *= 2;
    sum += power * c * c;
    const an = 0.5 * (a + b);
    b = Math.sqrt(a * b);
    a = an;
    if (Math.abs(c) < AGM_TOLERANCE * a) break;
  }
  const K = Math.PI / (2 * a);
  return { K, E: K * (1 - sum) };
}
