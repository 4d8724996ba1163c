/**
 * Link response over a band with the components fixed at their values for the operating point
 * (capacitors as tuned or given, M and L from the solve); coil resistance follows the skin effect with
 * frequency unless measured. Shows the frequency splitting of over-coupled resonators
 * (lossless identical resonators split to f0 / sqrt(1 +- k)).
 */
import { solveDetailed } from './solve';
import { solveLink, type LinkParameters } from './link-circuit';
import { acResistance } from './resistance';
import type { SolveRequest } from './types';

export interface FrequencyResponse {
  frequencyHz: Float64Array;
  efficiency: Float64Array;
  loadPower: Float64Array;
  inputPower: Float64Array;
  txCurrent: Float64Array;
  rxCurrent: Float64Array;
}

/**
 * Sweep a solved link over frequencies [Hz]; `resistanceAt(f)` gives [R1, R2] [ohm] at f (default: fixed).
 */
export function linkFrequencyResponse(
  link: LinkParameters, frequenciesHz: ArrayLike<number>,
  resistanceAt: (frequencyHz: number) => [number, number] = () => [link.R1, link.R2],
): FrequencyResponse {
  const n = frequenciesHz.length;
  const out: FrequencyResponse = {
    frequencyHz: Float64Array.from(frequenciesHz), efficiency: new Float64Array(n), loadPower: new Float64Array(n),
    inputPower: new Float64Array(n), txCurrent: new Float64Array(n), rxCurrent: new Float64Array(n),
  };
  for (let i = 0; i < n; i++) {
    const f = frequenciesHz[i];
    const [R1, R2] = resistanceAt(f);
    const r = solveLink({ ...link, frequencyHz: f, R1, R2 });
    out.efficiency[i] = r.efficiency;
    out.loadPower[i] = r.loadPower;
    out.inputPower[i] = r.inputPower;
    out.txCurrent[i] = r.txCurrent;
    out.rxCurrent[i] = r.rxCurrent;
  }
  return out;
}

/** Solve the request once, then sweep `points` frequencies evenly from startHz to stopHz. */
export function frequencyResponse(
  request: SolveRequest, band: { startHz: number; stopHz: number; points: number },
): FrequencyResponse {
  const { link, paths } = solveDetailed(request);
  const n = Math.max(2, Math.floor(band.points));
  const f = Float64Array.from({ length: n }, (_, i) => band.startHz + ((band.stopHz - band.startHz) * i) / (n - 1));
  const resistance = (spec: SolveRequest['transmitter'], length: number, fHz: number) =>
    spec.resistance ?? acResistance(spec, length, fHz).ac;
  return linkFrequencyResponse(link, f, (fHz) => [
    resistance(request.transmitter, paths.tx.length, fHz),
    resistance(request.receiver, paths.rx.length, fHz),
  ]);
}
