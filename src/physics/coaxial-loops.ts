/**
 * Mutual inductance of two coaxial circular filaments in closed form (Maxwell, Treatise on Electricity and
 * Magnetism, 1873, art. 701; Grover, Inductance Calculations, 1946):
 *   k^2 = 4ab / ((a+b)^2 + d^2),  M = mu0 sqrt(ab) [ (2/k - k) K(k^2) - (2/k) E(k^2) ].
 * Used for the turn-by-turn self-inductance sums; the coupling of two coils always goes through Neumann.
 */
import { MU0 } from './constants';
import { ellipticKE } from './elliptic';

/**
 * @param a radius of one circle [m] @param b radius of the other [m] @param d axial separation [m]
 * @returns mutual inductance [H]
 */
export function coaxialLoopsMutual(a: number, b: number, d: number): number {
  const sum2 = (a + b) * (a + b) + d * d;
  const m = (4 * a * b) / sum2;
  const m1 = ((a - b) * (a - b) + d * d) / sum2; // 1 - m without cancellation
  const k = Math.sqrt(m);
  const { K, E } = ellipticKE(m, m1);
  return MU0 * Math.sqrt(a * b) * ((2 / k - k) * K - (2 / k) * E);
}
