/**
 * One solve job as the worker threads run it: the physics solve of PRODUCT.md ("POST /api/solve"), plus
 * the B field at chosen points and the frequency response when asked. Pure: imports only src/physics, so
 * it runs in a worker thread, in jest and in the benchmark alike. Results are plain JSON-able objects.
 */
import {
  assessExposure, DEFAULT_TOLERANCE, linkFrequencyResponse, solveDetailed, SolveInputError,
  type ExposureAssessment, type SolveRequest, type SolveResponse,
} from '../../physics';
import { fluxDensityRms } from '../../physics/field';
import { acResistance } from '../../physics/resistance';
import { fieldPointIssues } from './field-points';

export type Point3 = [number, number, number];

/** A frequency band [Hz] sampled at `points` evenly spaced frequencies, both ends included. */
export interface FrequencyBand {
  startHz: number;
  stopHz: number;
  points: number;
}

/** A solve request with the optional extras of the API; solve() ignores the extra keys. */
export interface SolveJob extends SolveRequest {
  /** points [m] where the rms flux density of both coils' currents is wanted */
  fieldPoints?: Point3[];
  band?: FrequencyBand;
}

/** One reference level applied to a field value, without the table row's formula function. */
export interface ExposureLevel {
  id: string;
  source: string;
  version: string;
  population: string;
  basis: string;
  formula: string;
  /** the level was recalled from memory, not re-read from its source (exposure-limits.ts) */
  memory: boolean;
  /** reference level [T rms] at the operating frequency */
  limitTesla: number;
  /** field over the level [-] */
  ratio: number;
}

export interface FieldPoint {
  point: Point3;
  /** rms flux density [T] */
  fluxDensityRms: number;
  /** most restrictive applicable level, or null when no default row covers the frequency */
  limiting: ExposureLevel | null;
  applicable: ExposureLevel[];
}

export interface FrequencyResponseResult {
  frequencyHz: number[];
  efficiency: number[];
  loadPower: number[];
  inputPower: number[];
  txCurrent: number[];
  rxCurrent: number[];
}

export type SolveJobResult = SolveResponse & { field?: FieldPoint[]; frequencyResponse?: FrequencyResponseResult };

/** What a worker posts back: the result, or an error that crosses the thread boundary as plain data. */
export type SolveJobOutcome =
  | { ok: true; result: SolveJobResult }
  | { ok: false; error: { kind: 'input'; issues: SolveInputError['issues'] } | { kind: 'internal'; message: string } };

function level(entry: ExposureAssessment['applicable'][number]): ExposureLevel {
  const { row } = entry;
  return {
    id: row.id, source: row.source, version: row.version, population: row.population, basis: row.basis,
    formula: row.formula, memory: row.memory, limitTesla: entry.limitTesla, ratio: entry.ratio,
  };
}

/**
 * Solve once and derive the field and the band from that one solve. Same numbers as fieldAtPoints and
 * frequencyResponse of src/physics (unit/lib/solver-pool checks it), which would each solve again.
 */
export function runSolveJob(job: SolveJob): SolveJobResult {
  const request: SolveRequest = job;
  const detail = solveDetailed(request);
  const result: SolveJobResult = { ...detail.response };
  if (job.fieldPoints && job.fieldPoints.length > 0) {
    const { paths, linkResult } = detail;
    const inWire = fieldPointIssues(job.fieldPoints, paths);
    if (inWire.length > 0) throw new SolveInputError(inWire);
    const b = fluxDensityRms(job.fieldPoints.flat(), [paths.tx, paths.rx],
      [linkResult.txCurrentPhasor, linkResult.rxCurrentPhasor], request.tolerance ?? DEFAULT_TOLERANCE);
    result.field = job.fieldPoints.map((point, i) => {
      const exposure = assessExposure(b[i], request.circuit.frequency, 'general');
      return {
        point, fluxDensityRms: b[i],
        limiting: exposure.limiting ? level(exposure.limiting) : null, applicable: exposure.applicable.map(level),
      };
    });
  }
  if (job.band) {
    const { startHz, stopHz, points } = job.band;
    const n = Math.max(2, Math.floor(points));
    const f = Float64Array.from({ length: n }, (_, i) => startHz + ((stopHz - startHz) * i) / (n - 1));
    // coil resistance follows the skin effect over the band unless measured (as frequencyResponse does)
    const r = (spec: SolveRequest['transmitter'], length: number, hz: number) => spec.resistance ?? acResistance(spec, length, hz).ac;
    const fr = linkFrequencyResponse(detail.link, f, (hz) => [
      r(request.transmitter, detail.paths.tx.length, hz), r(request.receiver, detail.paths.rx.length, hz),
    ]);
    result.frequencyResponse = {
      frequencyHz: Array.from(fr.frequencyHz), efficiency: Array.from(fr.efficiency), loadPower: Array.from(fr.loadPower),
      inputPower: Array.from(fr.inputPower), txCurrent: Array.from(fr.txCurrent), rxCurrent: Array.from(fr.rxCurrent),
    };
  }
  return result;
}

/** runSolveJob with its errors turned into data a worker can post (an Error's class does not survive). */
export function settleSolveJob(job: SolveJob): SolveJobOutcome {
  try {
    return { ok: true, result: runSolveJob(job) };
  } catch (error) {
    if (error instanceof SolveInputError) return { ok: false, error: { kind: 'input', issues: error.issues } };
    return { ok: false, error: { kind: 'internal', message: error instanceof Error ? error.message : String(error) } };
  }
}
