/**
 * Skin effect in an isolated straight round wire.
 */
import { MU0 } from './constants';
import { halfZJ0OverJ1 } from './bessel-complex';
import { cx, type Complex } from './complex';

/**
 * Skin depth delta = sqrt(rho / (pi f mu0 mu_r)) [m] (D. K. Cheng, Field and Wave Electromagnetics, 1989, eq. 8-53).
 * @param resistivity rho [ohm m] @param frequencyHz f [Hz] @param relativePermeability mu_r (1 for Cu, Al)
 */
export function skinDepth(resistivity: number, frequencyHz: number, relativePermeability = 1): number {
  return Math.sqrt(resistivity / (Math.PI * frequencyHz * MU0 * relativePermeability));
}

/**
 * Internal impedance of a round wire over its DC resistance, exact for an isolated straight wire:
 * Z / Rdc = (qa/2) J0(qa) / J1(qa), q = (1 - j) / delta, written with Terman's x = sqrt(2) a / delta as
 * qa = (1 - j) x / sqrt(2) (S. A. Schelkunoff, Bell Syst. Tech. J. 13, 1934; F. E. Terman, Radio Engineers'
 * Handbook, 1943). Re is Rac/Rdc; large x: Re -> x / (2 sqrt 2) + 1/4.
 * @param x sqrt(2) wireRadius / skinDepth [-]
 */
export function roundWireImpedanceRatio(x: number): Complex {
  if (x === 0) return cx(1, 0);
  const s = x / Math.SQRT2;
  return halfZJ0OverJ1(cx(s, -s));
}

/**
 * Rac / Rdc of an isolated round wire [-] (real part of roundWireImpedanceRatio).
 * @param wireRadius a [m] @param skinDepthM delta [m]
 */
export function skinEffectFactor(wireRadius: number, skinDepthM: number): number {
  return roundWireImpedanceRatio((Math.SQRT2 * wireRadius) / skinDepthM).re;
}
