import 'server-only';
import { coilProperties, SOLVER_VERSION } from '../../physics';
import type { CoilSpec } from '../../physics/types';

/** Model values of one coil at the study's operating frequency (src/physics/coil-properties.ts). */
export interface CoilPrediction {
  frequencyHz: number;
  /** [H] */
  selfInductance: number;
  /** [ohm] */
  dcResistance: number;
  /** [ohm] */
  acResistance: number;
}

/**
 * Predictions are pure functions of (spec, frequency, solver version), so they are remembered: a
 * typical coil takes microseconds, but the turn sum of a spiral grows with turns squared (seconds at
 * 2,000 turns), and the library lists every coil on every read. Oldest entries go first.
 */
const MAX_REMEMBERED = 1000;
const remembered = new Map<string, CoilPrediction | null>();

/** Predicted L, Rdc, Rac; null without a frequency, or if the model cannot evaluate the stored coil. */
export function predictCoil(spec: CoilSpec, frequencyHz: number | null): CoilPrediction | null {
  if (frequencyHz === null) return null;
  const key = `${SOLVER_VERSION}|${frequencyHz}|${JSON.stringify(spec)}`;
  if (remembered.has(key)) return remembered.get(key)!;
  const p = coilProperties(spec, frequencyHz);
  const finite = [p.selfInductance, p.dcResistance, p.acResistance].every(Number.isFinite);
  const prediction = finite ? { frequencyHz, selfInductance: p.selfInductance, dcResistance: p.dcResistance, acResistance: p.acResistance } : null;
  if (remembered.size >= MAX_REMEMBERED) remembered.delete(remembered.keys().next().value!);
  remembered.set(key, prediction);
  return prediction;
}
