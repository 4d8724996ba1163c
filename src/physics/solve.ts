/**
 * solve(request): coil paths, clearance, Neumann M, self-inductances, resistances, link (PRODUCT.md).
 */
import { checkClearance } from './clearance';
import { coilPath, samplePath } from './geometry/coil-path';
import type { CoilPath } from './geometry/path';
import { IDENTITY_POSE, poseFromPlacement } from './geometry/pose';
import { qualityFactor, seriesSeriesOptimum, solveLink, tuningCapacitance, type LinkParameters, type LinkResult } from './link-circuit';
import { DEFAULT_TOLERANCE, mutualInductance } from './neumann';
import { acResistance } from './resistance';
import { coilSelfInductance } from './self-inductance';
import type { CoilResult, CoilSpec, Placement, SolveRequest, SolveResponse } from './types';
import { SolveInputError, validateSolveRequest } from './validation';

/** Version of the numerical model; stored with every predicted point. */
export const SOLVER_VERSION = '1.0.0';

/** Both coils' paths in world coordinates for a request (the paths every integral uses). */
export function requestPaths(request: Pick<SolveRequest, 'transmitter' | 'receiver' | 'placement'>): { tx: CoilPath; rx: CoilPath } {
  return {
    tx: coilPath(request.transmitter, IDENTITY_POSE),
    rx: coilPath(request.receiver, poseFromPlacement(request.placement)),
  };
}

/**
 * Sampled wire-axis points of a coil in world coordinates [m], xyz interleaved, for the 3D bench: the
 * transmitter when `placement` is null, else the receiver at that placement. Same curve as the solver's.
 */
export function coilPathPoints(coil: CoilSpec, placement: Placement | null, pointsPerTurn = 64): Float64Array {
  const pose = placement ? poseFromPlacement(placement) : IDENTITY_POSE;
  return samplePath(coilPath(coil, pose), pointsPerTurn);
}

function coilResult(spec: CoilSpec, path: CoilPath, frequencyHz: number, capacitance: number | undefined) {
  const self = coilSelfInductance(spec);
  const r = acResistance(spec, path.length, frequencyHz);
  const measured = spec.resistance !== undefined;
  const ac = measured ? spec.resistance! : r.ac;
  const result: CoilResult = {
    selfInductance: self.value,
    dcResistance: r.dc,
    acResistance: ac,
    wireLength: path.length,
    qualityFactor: qualityFactor(self.value, ac, frequencyHz),
    capacitance: capacitance ?? tuningCapacitance(self.value, frequencyHz),
    tuned: capacitance === undefined,
    resistanceSource: measured ? 'measured' : 'model',
    skinDepth: r.skinDepth,
    selfInductanceMethod: self.method,
  };
  return { result, evaluations: self.evaluations };
}

/** Everything of a solve that the frequency response and the field need besides the response itself. */
export interface SolveDetail {
  response: SolveResponse;
  link: LinkParameters;
  linkResult: LinkResult;
  paths: { tx: CoilPath; rx: CoilPath };
}

/** solve() with its intermediate link parameters and paths. Throws SolveInputError for invalid input. */
export function solveDetailed(request: SolveRequest): SolveDetail {
  const issues = validateSolveRequest(request);
  if (issues.length > 0) throw new SolveInputError(issues);
  const tolerance = request.tolerance ?? DEFAULT_TOLERANCE;
  const paths = requestPaths(request);
  const threshold = paths.tx.wireRadius + paths.rx.wireRadius;
  const clearance = checkClearance(paths.tx, paths.rx, threshold);
  if (clearance.touching) {
    throw new SolveInputError([{
      path: ['placement'],
      message: `the receiver touches or intersects the transmitter: the wire axes come within ${clearance.closestSampled.toPrecision(3)} m, `
        + `less than the sum of the wire radii (${threshold.toPrecision(3)} m)`,
    }]);
  }
  const c = request.circuit;
  const m = mutualInductance(paths.tx, paths.rx, tolerance);
  const tx = coilResult(request.transmitter, paths.tx, c.frequency, c.txCapacitance);
  const rx = coilResult(request.receiver, paths.rx, c.frequency, c.rxCapacitance);
  const L1 = tx.result.selfInductance;
  const L2 = rx.result.selfInductance;
  const link: LinkParameters = {
    frequencyHz: c.frequency, topology: c.topology, L1, L2, M: m.value,
    R1: tx.result.acResistance, R2: rx.result.acResistance, C1: tx.result.capacitance, C2: rx.result.capacitance,
    sourceVoltage: c.sourceVoltage, sourceResistance: c.sourceResistance, loadResistance: c.loadResistance,
  };
  const lr = solveLink(link);
  const coupling = m.value / Math.sqrt(L1 * L2);
  const figureOfMerit = coupling * coupling * tx.result.qualityFactor * rx.result.qualityFactor;
  const optimum = seriesSeriesOptimum(figureOfMerit, link.R2);
  const response: SolveResponse = {
    mutualInductance: m.value,
    coupling,
    transmitter: tx.result,
    receiver: rx.result,
    transfer: {
      efficiency: lr.efficiency, loadPower: lr.loadPower, inputPower: lr.inputPower,
      txCurrent: lr.txCurrent, rxCurrent: lr.rxCurrent,
      txCapacitorVoltage: lr.txCapacitorVoltage, rxCapacitorVoltage: lr.rxCapacitorVoltage,
      figureOfMerit, optimalLoad: optimum.optimalLoad, maxEfficiency: optimum.maxEfficiency,
      sourcePower: lr.sourcePower, sourceCurrent: lr.sourceCurrent, loadVoltage: lr.loadVoltage,
    },
    accuracy: {
      // self-inductances are closed-form sums (no quadrature error), so M's estimate is the solver's
      estimatedRelativeError: m.estimatedRelativeError,
      integrandEvaluations: m.integrandEvaluations + tx.evaluations + rx.evaluations,
      mutualInductance: {
        estimatedRelativeError: m.estimatedRelativeError,
        estimatedAbsoluteError: m.estimatedAbsoluteError,
        integrandEvaluations: m.integrandEvaluations,
      },
    },
    solverVersion: SOLVER_VERSION,
  };
  return { response, link, linkResult: lr, paths };
}

/** Solve a request (PRODUCT.md). Throws SolveInputError (422 at the API) for invalid input. */
export function solve(request: SolveRequest): SolveResponse {
  return solveDetailed(request).response;
}

