/**
 * Test oracle: Maxwell's closed form for coaxial circular filaments (Treatise, 1873, art. 701), evaluated
 * with @stdlib's complete elliptic integrals (which take the parameter m = k^2), independently of the
 * solver's own AGM code.
 */
import ellipe from '@stdlib/math-base-special-ellipe';
import ellipk from '@stdlib/math-base-special-ellipk';

export const MU0 = 4e-7 * Math.PI;

/** M [H] of coaxial circles of radii a, b [m] at axial separation d [m]. */
export function maxwellCoaxial(a: number, b: number, d: number): number {
  const m = (4 * a * b) / ((a + b) ** 2 + d * d);
  const k = Math.sqrt(m);
  return MU0 * Math.sqrt(a * b) * ((2 / k - k) * ellipk(m) - (2 / k) * ellipe(m));
}
