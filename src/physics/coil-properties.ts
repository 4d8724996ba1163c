/**
 * One coil on its own: predicted self-inductance and winding resistance at a frequency, for the coil
 * library (no second coil, no Neumann integral). The very functions solve() applies to each coil:
 * self-inductance.ts for L, resistance.ts over the length of the path the solver integrates for Rdc/Rac.
 */
import { coilPath } from './geometry/coil-path';
import { IDENTITY_POSE } from './geometry/pose';
import { qualityFactor } from './link-circuit';
import { acResistance } from './resistance';
import { coilSelfInductance } from './self-inductance';
import type { CoilSpec } from './types';

export interface CoilProperties {
  /** low-frequency self-inductance [H] */
  selfInductance: number;
  /** [ohm] */
  dcResistance: number;
  /** model AC resistance at the frequency (skin effect per strand; a measured `resistance` is ignored) [ohm] */
  acResistance: number;
  /** length of the wire axis [m] */
  wireLength: number;
  /** skin depth in the conductor at the frequency [m] */
  skinDepth: number;
  /** Q = omega L / Rac [-] */
  qualityFactor: number;
  /** how the self-inductance was computed */
  selfInductanceMethod: string;
}

/**
 * Predicted L, Rdc and Rac of a coil at frequencyHz [Hz], identical to solve()'s per-coil values for
 * the same spec (selfInductance, dcResistance, model acResistance, wireLength, skinDepth).
 * Expects a spec that validateSolveRequest accepts and a positive, finite frequency.
 */
export function coilProperties(spec: CoilSpec, frequencyHz: number): CoilProperties {
  const path = coilPath(spec, IDENTITY_POSE);
  const self = coilSelfInductance(spec);
  const r = acResistance(spec, path.length, frequencyHz);
  return {
    selfInductance: self.value,
    dcResistance: r.dc,
    acResistance: r.ac,
    wireLength: path.length,
    skinDepth: r.skinDepth,
    qualityFactor: qualityFactor(self.value, r.ac, frequencyHz),
    selfInductanceMethod: self.method,
  };
}
