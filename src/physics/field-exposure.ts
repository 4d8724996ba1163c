/**
 * Field at chosen points (the operator's position) for a solved request, with the exposure assessment.
 */
import { assessExposure, type ExposureAssessment, type Population } from './exposure-limits';
import { fluxDensityRms } from './field';
import { solveDetailed } from './solve';
import type { SolveRequest } from './types';

export interface FieldPointResult {
  /** [m] */
  point: [number, number, number];
  /** rms flux density [T] */
  fluxDensityRms: number;
  exposure: ExposureAssessment;
}

/** B rms [T] at points (xyz [m]) from both coils' currents (Biot-Savart), against the reference levels. */
export function fieldAtPoints(
  request: SolveRequest, points: [number, number, number][], population: Population = 'general',
): FieldPointResult[] {
  const { paths, linkResult } = solveDetailed(request);
  const flat = points.flat();
  const b = fluxDensityRms(flat, [paths.tx, paths.rx], [linkResult.txCurrentPhasor, linkResult.rxCurrentPhasor],
    request.tolerance ?? 1e-6);
  return points.map((point, i) => ({
    point, fluxDensityRms: b[i], exposure: assessExposure(b[i], request.circuit.frequency, population),
  }));
}
