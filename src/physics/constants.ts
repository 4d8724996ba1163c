/**
 * Physical constants used by the coupling solver, SI units.
 */

/**
 * Vacuum permeability mu0 [H/m]. The conventional value 4 pi 1e-7 (exact in the SI before 2019);
 * CODATA 2018 gives 1.25663706212e-6, a relative difference of 5.5e-10, below every tolerance we report.
 */
export const MU0 = 4 * Math.PI * 1e-7;

/** mu0 / (4 pi) [H/m], the prefactor of Neumann's and Biot-Savart's integrals. */
export const MU0_OVER_4PI = 1e-7;

/**
 * Geometric mean distance of a circular cross-section to itself, as a fraction of its radius:
 * e^(-1/4) (Maxwell, Treatise on Electricity and Magnetism, 1873, art. 692).
 */
export const ROUND_WIRE_GMD_FACTOR = Math.exp(-0.25);

/** Zero of the Celsius scale [K]. */
export const ABSOLUTE_ZERO_C = -273.15;
