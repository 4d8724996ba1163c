/**
 * Winding resistance: DC from length, section, resistivity and temperature; AC by the isolated round-wire
 * skin effect, per strand for stranded and litz conductors. Proximity effect between turns and strands is
 * not modelled (it raises Rac of close-wound coils; a measured `resistance` overrides the model).
 */
import { skinDepth, skinEffectFactor } from './skin-effect';
import type { Material } from './types';

export interface MaterialProperties {
  /** resistivity at 20 C [ohm m] */
  resistivity20: number;
  /** temperature coefficient of resistance at 20 C [1/K] */
  alpha20: number;
  source: string;
}

/** Conductor data (REFERENCES.md, "Resistance"). */
export const MATERIALS: Record<Material, MaterialProperties> = {
  // annealed copper standard: 1/58 ohm mm^2/m at 20 C, 0.00393 /C
  copper: { resistivity20: 1.7241e-8, alpha20: 0.00393, source: 'IACS 1913 (IEC 60028)' },
  // hard-drawn aluminium for conductors (value recalled, not re-read: "memory" in REFERENCES.md)
  aluminium: { resistivity20: 2.8264e-8, alpha20: 0.00403, source: 'IEC 60889 (memory)' },
};

/** Reference temperature of the resistivity data [deg C]. */
export const REFERENCE_TEMPERATURE_C = 20;

/** rho(T) = rho20 (1 + alpha20 (T - 20)) [ohm m] (linear model of IEC 60028 / IEC 60889). */
export function resistivityAt(material: Material, temperatureC: number): number {
  const m = MATERIALS[material];
  return m.resistivity20 * (1 + m.alpha20 * (temperatureC - REFERENCE_TEMPERATURE_C));
}

export interface ConductorSpec {
  /** overall diameter [m] */
  wireDiameter: number;
  material?: Material;
  temperatureC?: number;
  strands?: number;
  /** [m] */
  strandDiameter?: number;
}

/** Number of parallel strands and the diameter of each [m] (a solid wire is one strand). */
export function strandGeometry(c: ConductorSpec): { count: number; diameter: number } {
  if (c.strands !== undefined && c.strands > 1 && c.strandDiameter !== undefined) {
    return { count: c.strands, diameter: c.strandDiameter };
  }
  return { count: 1, diameter: c.strandDiameter ?? c.wireDiameter };
}

/** DC resistance R = rho(T) l / A [ohm], A the copper section of all strands. @param wireLength [m] */
export function dcResistance(c: ConductorSpec, wireLength: number): number {
  const rho = resistivityAt(c.material ?? 'copper', c.temperatureC ?? REFERENCE_TEMPERATURE_C);
  const { count, diameter } = strandGeometry(c);
  return (rho * wireLength) / (count * Math.PI * diameter * diameter * 0.25);
}

export interface AcResistance {
  /** [ohm] */
  dc: number;
  /** [ohm] */
  ac: number;
  /** skin depth at the frequency [m] */
  skinDepth: number;
}

/**
 * AC resistance [ohm] at frequencyHz: Rdc times the exact round-wire factor Re[(qa/2) J0(qa)/J1(qa)]
 * (skin-effect.ts) evaluated for one strand (Terman 1943; litz with ideal transposition).
 */
export function acResistance(c: ConductorSpec, wireLength: number, frequencyHz: number): AcResistance {
  const rho = resistivityAt(c.material ?? 'copper', c.temperatureC ?? REFERENCE_TEMPERATURE_C);
  const dc = dcResistance(c, wireLength);
  const delta = skinDepth(rho, frequencyHz);
  const { diameter } = strandGeometry(c);
  return { dc, ac: dc * skinEffectFactor(diameter / 2, delta), skinDepth: delta };
}
