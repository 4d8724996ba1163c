/**
 * Test oracles for solenoids.
 * Nagaoka's coefficient (H. Nagaoka, J. Coll. Sci. Tokyo 27, 1909; tabulated in Rosa & Grover, Bull. Bureau
 * of Standards 8(1), 1912): with k^2 = d^2 / (d^2 + l^2), d = 2r, k' = l / sqrt(d^2 + l^2),
 *   K_N = 4 / (3 pi k') [ (k'^2 / k^2) (K(k^2) - E(k^2)) + E(k^2) - k ],
 * and the current-sheet inductance L_s = mu0 pi r^2 N^2 / l K_N (Lorenz).
 * Rosa's round-wire correction (E. B. Rosa, Bull. Bureau of Standards 2, 1906; Grover 1946 p. 149):
 *   L = L_s - mu0 a N (A + B),  A = 5/4 - ln(2p/d_w) (own turn: round wire vs tape of width p),
 *   B = (2/N) sum_{k=1}^{N-1} (N - k) ln(k p / g_k) (other turns: filaments vs tapes), with g_k Maxwell's
 *   GMD of two collinear strips of width p whose centres are k p apart.
 * H. A. Wheeler, Proc. IRE 16(10), 1928 (memory): L[uH] = a^2 N^2 / (9a + 10l), inches, ~1% for l > 0.8a.
 */
import ellipe from '@stdlib/math-base-special-ellipe';
import ellipk from '@stdlib/math-base-special-ellipk';
import { MU0 } from './maxwell';

/** Nagaoka's coefficient for diameter / length = ratio. */
export function nagaokaCoefficient(diameterOverLength: number): number {
  const d = diameterOverLength;
  const m = (d * d) / (d * d + 1);
  const k = Math.sqrt(m);
  const kp = 1 / Math.sqrt(d * d + 1);
  return (4 / (3 * Math.PI * kp)) * (((kp * kp) / m) * (ellipk(m) - ellipe(m)) + ellipe(m) - k);
}

/** Current-sheet inductance [H] (Lorenz; Nagaoka's coefficient). */
export function currentSheetInductance(radius: number, turns: number, length: number): number {
  return ((MU0 * Math.PI * radius * radius * turns * turns) / length) * nagaokaCoefficient((2 * radius) / length);
}

/** ln of the GMD of two collinear strips of width 1 with centres k apart (Maxwell, Treatise art. 692). */
function lnStripGmd(k: number): number {
  const f = (x: number) => (x === 0 ? 0 : x * x * Math.log(x));
  return (f(k + 1) + f(k - 1) - 2 * f(k)) / 2 - 1.5;
}

/** Rosa's A and B corrections for pitch p and wire diameter dw [m], N turns. */
export function rosaCorrections(turns: number, pitch: number, wireDiameter: number): { A: number; B: number } {
  const A = 1.25 - Math.log((2 * pitch) / wireDiameter);
  let sum = 0;
  for (let k = 1; k < turns; k++) sum += (turns - k) * (Math.log(k) - lnStripGmd(k));
  return { A, B: (2 / turns) * sum };
}

/** Round-wire helix by Nagaoka + Rosa [H]. */
export function nagaokaRosaInductance(radius: number, turns: number, length: number, wireDiameter: number): number {
  const { A, B } = rosaCorrections(turns, length / turns, wireDiameter);
  return currentSheetInductance(radius, turns, length) - MU0 * radius * turns * (A + B);
}

const INCH = 0.0254;

/** Wheeler's single-layer formula [H]. */
export function wheelerSolenoid(radius: number, turns: number, length: number): number {
  const a = radius / INCH;
  const l = length / INCH;
  return ((a * a * turns * turns) / (9 * a + 10 * l)) * 1e-6;
}

/** Wheeler's flat-spiral formula [H]: a mean radius, c radial depth. */
export function wheelerSpiral(meanRadius: number, turns: number, depth: number): number {
  const a = meanRadius / INCH;
  const c = depth / INCH;
  return ((a * a * turns * turns) / (8 * a + 11 * c)) * 1e-6;
}
