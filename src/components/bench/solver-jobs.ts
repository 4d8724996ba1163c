/**
 * What the bench's Web Worker computes, as plain functions (the worker file only wires messages to
 * runJob). Answers are structured-clone safe: no functions, no class instances.
 */
import { assessExposure, fieldAtPoints, solve, SolveInputError, type Population, type SolveRequest, type SolveResponse } from '@/physics';
import type { Vec3 } from './bench-types';
import { fieldKey, requestKey, sweepKey, withTilt } from './build-request';
import { fieldGridPoints, type FieldGrid } from './field-grid';

export type SolverJob =
  | { kind: 'solve'; request: SolveRequest }
  | { kind: 'sweep'; request: SolveRequest; tiltsDeg: readonly number[] }
  | { kind: 'field'; request: SolveRequest; grid: FieldGrid; operatorPoint: Vec3 | null; population: Population };

/** One reference level as applied to a point: the row's published data, its limit and the ratio. */
export interface ExposureLevel {
  id: string;
  source: string;
  version: string;
  population: Population;
  basis: string;
  formula: string;
  /** the row's numbers were recalled, not re-read from the publication */
  memory: boolean;
  /** reference level [T rms] at the frequency */
  limitTesla: number;
  /** field / reference level */
  ratio: number;
}

export interface OperatorExposure {
  point: Vec3;
  /** [T rms] */
  fluxDensityRms: number;
  /** most restrictive applicable level, or null when no row of the table covers the frequency */
  limiting: ExposureLevel | null;
  applicable: ExposureLevel[];
}

export interface SolveAnswer { kind: 'solve'; key: string; tolerance: number; response: SolveResponse }
export interface SweepAnswer { kind: 'sweep'; key: string; points: { tiltDeg: number; coupling: number | null }[] }
export interface FieldAnswer { kind: 'field'; key: string; grid: FieldGrid; values: Float64Array; operator: OperatorExposure | null }
export type SolverAnswer = SolveAnswer | SweepAnswer | FieldAnswer;

export interface JobFailure {
  message: string;
  issues: { path: string; message: string }[];
}

export type WorkerRequest = { id: number; job: SolverJob };
export type JobKind = SolverJob['kind'];
/** Replies carry the job's kind as well as its id: one worker serves several queues, each numbering its own jobs. */
export type WorkerReply =
  | { id: number; kind: JobKind; ok: true; answer: SolverAnswer }
  | { id: number; kind: JobKind; ok: false; failure: JobFailure };

function plainExposure(point: Vec3, b: number, frequencyHz: number, population: Population): OperatorExposure {
  const a = assessExposure(b, frequencyHz, population);
  const level = (x: (typeof a.applicable)[number]): ExposureLevel => ({
    id: x.row.id, source: x.row.source, version: x.row.version, population: x.row.population, basis: x.row.basis,
    formula: x.row.formula, memory: x.row.memory, limitTesla: x.limitTesla, ratio: x.ratio,
  });
  return { point, fluxDensityRms: b, limiting: a.limiting ? level(a.limiting) : null, applicable: a.applicable.map(level) };
}

/** Run one job. Throws SolveInputError for a request the solver refuses (touching coils, bad numbers). */
export function runJob(job: SolverJob): SolverAnswer {
  switch (job.kind) {
    case 'solve':
      return { kind: 'solve', key: requestKey(job.request), tolerance: job.request.tolerance ?? 1e-6, response: solve(job.request) };
    case 'sweep':
      return {
        kind: 'sweep',
        key: sweepKey(job.request),
        points: job.tiltsDeg.map((tiltDeg) => {
          try {
            return { tiltDeg, coupling: solve(withTilt(job.request, tiltDeg)).coupling };
          } catch (error) {
            // a tilt at which the receiver would touch the transmitter is a gap in the curve
            if (error instanceof SolveInputError) return { tiltDeg, coupling: null };
            throw error;
          }
        }),
      };
    case 'field': {
      const points = fieldGridPoints(job.grid);
      if (job.operatorPoint) points.push(job.operatorPoint);
      const result = fieldAtPoints(job.request, points, job.population);
      const n = job.grid.n * job.grid.n;
      const values = Float64Array.from(result.slice(0, n), (r) => r.fluxDensityRms);
      const operator = job.operatorPoint
        ? plainExposure(job.operatorPoint, result[n].fluxDensityRms, job.request.circuit.frequency, job.population)
        : null;
      return { kind: 'field', key: fieldKey(job.request, job.grid, job.operatorPoint, job.population), grid: job.grid, values, operator };
    }
  }
}

/** A worker's whole message handling: never throws, always answers with the job's id. */
export function answer(message: WorkerRequest): WorkerReply {
  const { id, job: { kind } } = message;
  try {
    return { id, kind, ok: true, answer: runJob(message.job) };
  } catch (error) {
    if (error instanceof SolveInputError) {
      return {
        id,
        kind,
        ok: false,
        failure: { message: error.issues.map((i) => i.message).join('; '), issues: error.issues.map((i) => ({ path: i.path.join('.'), message: i.message })) },
      };
    }
    return { id, kind, ok: false, failure: { message: 'The solver stopped on an unexpected error.', issues: [] } };
  }
}
