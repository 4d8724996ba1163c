/**
 * Test oracle for circular filaments in any relative position: the single-integral method of S. Babic,
 * F. Sirois, C. Akyel, C. Girardi, IEEE Trans. Magn. 46(9):3591-3600, 2010, which integrates the primary's
 * closed-form vector potential around the secondary, M = oint A_phi(rho, z) phi_hat . dl / I, with
 *   A_phi = (mu0 I / (pi k)) sqrt(a / rho) [ (1 - k^2/2) K(k^2) - E(k^2) ],  k^2 = 4 a rho / ((a + rho)^2 + z^2)
 * (Smythe, Static and Dynamic Electricity, 1950, 7.10; Jackson, Classical Electrodynamics, eq. 5.37).
 * Written here in vector form instead of transcribing the paper's p1..p4 coefficients; this also removes the
 * paper's special case for normals along y. The removable 0/0 on the primary's axis (rho -> 0) uses the
 * limit A_phi / rho -> mu0 a^2 / (4 (a^2 + z^2)^(3/2)). The periodic trapezoid rule converges geometrically.
 * Independent of the solver: @stdlib elliptic integrals, no Neumann double integral.
 */
import ellipe from '@stdlib/math-base-special-ellipe';
import ellipk from '@stdlib/math-base-special-ellipk';
import { MU0 } from './maxwell';

/** Below this rho / a the on-axis limit of A_phi / rho is used. */
const AXIS_EPSILON = 1e-9;

/** A_phi / rho per unit current [H/m^2] of a circle of radius a in z = 0 at (rho, z). */
function aPhiOverRho(a: number, rho: number, z: number): number {
  if (rho < AXIS_EPSILON * a) return (MU0 * a * a) / (4 * (a * a + z * z) ** 1.5);
  const m = (4 * a * rho) / ((a + rho) ** 2 + z * z);
  const k = Math.sqrt(m);
  return ((MU0 / (Math.PI * k)) * Math.sqrt(a / rho) * ((1 - m / 2) * ellipk(m) - ellipe(m))) / rho;
}

/**
 * M [H] between a primary circle (radius a, centre origin, axis z) and a secondary circle (radius b,
 * centre c, unit-normal direction n), with `nodes` trapezoid nodes.
 */
export function babicMutual(a: number, b: number, c: [number, number, number], normal: [number, number, number], nodes = 4096): number {
  const len = Math.hypot(...normal);
  const n = normal.map((v) => v / len);
  // an orthonormal pair u, v in the secondary's plane (any pair: M does not depend on the start angle)
  const helper = Math.abs(n[2]) < 0.9 ? [0, 0, 1] : [1, 0, 0];
  const u = [n[1] * helper[2] - n[2] * helper[1], n[2] * helper[0] - n[0] * helper[2], n[0] * helper[1] - n[1] * helper[0]];
  const ul = Math.hypot(u[0], u[1], u[2]);
  for (let i = 0; i < 3; i++) u[i] /= ul;
  const v = [n[1] * u[2] - n[2] * u[1], n[2] * u[0] - n[0] * u[2], n[0] * u[1] - n[1] * u[0]];
  let sum = 0;
  for (let i = 0; i < nodes; i++) {
    const t = (2 * Math.PI * i) / nodes;
    const ct = Math.cos(t);
    const st = Math.sin(t);
    const x = c[0] + b * (u[0] * ct + v[0] * st);
    const y = c[1] + b * (u[1] * ct + v[1] * st);
    const z = c[2] + b * (u[2] * ct + v[2] * st);
    const dx = b * (-u[0] * st + v[0] * ct);
    const dy = b * (-u[1] * st + v[1] * ct);
    // A = (A_phi / rho) (-y, x, 0)
    sum += aPhiOverRho(a, Math.hypot(x, y), z) * (-y * dx + x * dy);
  }
  return (sum * 2 * Math.PI) / nodes;
}
