/**
 * Low-frequency self-inductance of a coil of round wire (uniform current over the section).
 * - Loop: L = mu0 a (ln(8a/r) - 2 + Y), Y = 1/4 (Kirchhoff 1864; E. B. Rosa and F. W. Grover, Bull. Bureau
 *   of Standards 8(1), 1912, formula 152).
 * - Helix and spiral: the summation method of Maxwell's geometric mean distances (Treatise, 1873,
 *   art. 691-693) as used by E. B. Rosa ("The self and mutual inductances of linear conductors", Bull.
 *   Bureau of Standards 4, 1908) and F. W. Grover (Inductance Calculations, 1946, ch. 16): each turn is a
 *   circle of round wire (its self-inductance from the loop formula), and each pair of turns couples as
 *   two coaxial filaments at their centre distance (the GMD of two round sections is the distance of their
 *   centres), by Maxwell's elliptic formula. L = sum_i L_i + 2 sum_{i<j} M_ij.
 *   Why this method: it is exact for the turns-as-circles model in closed form (microseconds, no
 *   quadrature error), it covers loose and close winding and flat spirals alike, and Rosa's 1906 correction
 *   to Nagaoka's current sheet is this same sum written as sheet + corrections. It neglects the pitch of
 *   the lead (the one axial "turn" of a helix), a relative effect of order (pitch / (2 pi a))^2.
 *   gmd-self-inductance.ts integrates the exact path instead and the tests compare the two.
 */
import { MU0 } from './constants';
import { coaxialLoopsMutual } from './coaxial-loops';
import type { CoilSpec } from './types';

/** Internal-inductance term Y for uniform current in a round wire (low frequency). */
export const UNIFORM_CURRENT_Y = 0.25;

/** Turn counts within this of an integer are treated as whole (floating-point input like 19.999999999). */
const WHOLE_TURN_EPSILON = 1e-9;

export interface SelfInductanceResult {
  /** [H] */
  value: number;
  method: string;
  /** closed-form evaluations used */
  evaluations: number;
}

/**
 * Self-inductance of a circular loop of round wire [H] (Rosa & Grover 1912, formula 152):
 * L = mu0 a (ln(8a/r) - 2 + Y). @param radius a [m] @param wireRadius r [m] @param y 1/4 for uniform current
 */
export function loopSelfInductance(radius: number, wireRadius: number, y = UNIFORM_CURRENT_Y): number {
  return MU0 * radius * (Math.log((8 * radius) / wireRadius) - 2 + y);
}

/** Whole turns and the fraction of a last partial turn (0 when none). */
function splitTurns(turns: number): { whole: number; fraction: number } {
  const rounded = Math.round(turns);
  if (Math.abs(turns - rounded) < WHOLE_TURN_EPSILON) return { whole: rounded, fraction: 0 };
  return { whole: Math.floor(turns), fraction: turns - Math.floor(turns) };
}

/**
 * Helix as coaxial turns [H]: equal circles of radius a at pitch p = l / N, so the mutual of turns i, j
 * depends on |i - j| only and the double sum is sum_k 2 (N - k) M(k p). A partial last turn of fraction f
 * enters with its current-turn product f (a common approximation).
 */
export function helixSelfInductance(radius: number, turns: number, length: number, wireRadius: number): SelfInductanceResult {
  const { whole, fraction } = splitTurns(turns);
  const pitch = length / turns;
  const own = loopSelfInductance(radius, wireRadius);
  let value = whole * own + fraction * fraction * own;
  for (let k = 1; k < whole; k++) value += 2 * (whole - k) * coaxialLoopsMutual(radius, radius, k * pitch);
  if (fraction > 0) {
    // partial turn centred half its extent above the last whole turn's start
    for (let i = 0; i < whole; i++) {
      const dz = (whole - i) * pitch + (fraction - 1) * pitch * 0.5;
      value += 2 * fraction * coaxialLoopsMutual(radius, radius, dz);
    }
  }
  return { value, method: 'Rosa 1908 / Grover 1946 GMD turn sum (Maxwell coaxial-circle mutuals)', evaluations: 2 * whole };
}

/**
 * Flat spiral as concentric coplanar turns [H], turn i at its mean radius ri + b 2 pi (i + f_i / 2),
 * b = (ro - ri) / (2 pi N); pairs by Maxwell's formula at d = 0.
 */
export function spiralSelfInductance(
  innerRadius: number, outerRadius: number, turns: number, wireRadius: number,
): SelfInductanceResult {
  const { whole, fraction } = splitTurns(turns);
  const count = whole + (fraction > 0 ? 1 : 0);
  const radialPitch = (outerRadius - innerRadius) / turns; // per turn [m]
  const radii = new Float64Array(count);
  const weights = new Float64Array(count);
  for (let i = 0; i < count; i++) {
    weights[i] = i < whole ? 1 : fraction;
    radii[i] = innerRadius + radialPitch * (i + weights[i] / 2);
  }
  let value = 0;
  for (let i = 0; i < count; i++) {
    value += weights[i] * weights[i] * loopSelfInductance(radii[i], wireRadius);
    for (let j = i + 1; j < count; j++) value += 2 * weights[i] * weights[j] * coaxialLoopsMutual(radii[i], radii[j], 0);
  }
  return {
    value, method: 'Rosa 1908 / Grover 1946 GMD turn sum (Maxwell coplanar-circle mutuals)',
    evaluations: (count * (count + 1)) / 2,
  };
}

/** Self-inductance [H] of a coil spec by the method for its kind (see the file comment). */
export function coilSelfInductance(spec: CoilSpec): SelfInductanceResult {
  const r = spec.wireDiameter / 2;
  switch (spec.kind) {
    case 'loop':
      return { value: loopSelfInductance(spec.radius, r), method: 'round-wire loop formula (Rosa & Grover 1912)', evaluations: 1 };
    case 'helix':
      return helixSelfInductance(spec.radius, spec.turns, spec.length, r);
    case 'spiral':
      return spiralSelfInductance(spec.innerRadius, spec.outerRadius, spec.turns, r);
  }
}
