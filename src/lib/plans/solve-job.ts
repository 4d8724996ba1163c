/**
 * One plan point as a solve job, and the solve's answer as the point's predicted values. Pure (types
 * only from the solver pool), so the server's runner, the seed and the benchmark build identical jobs.
 */
import type { CircuitSpec, CoilSpec } from '../../physics/types';
import type { SolveJob, SolveJobResult } from '../solver-pool/job';
import type { PlanPose } from './points';
import type { PointPrediction } from './prediction';

/** The solver's tolerance for plan predictions (the benchmark's accurate setting). */
export const PLAN_TOLERANCE = 1e-6;

export interface PlanSetupGeometry {
  transmitter: CoilSpec;
  receiver: CoilSpec;
  circuit: CircuitSpec;
  /** where an operator stands [m], or null */
  operatorPoint: [number, number, number] | null;
}

export function pointSolveJob(setup: PlanSetupGeometry, pose: PlanPose): SolveJob {
  const circuit: CircuitSpec = {
    ...setup.circuit,
    frequency: pose.frequencyHz ?? setup.circuit.frequency,
    loadResistance: pose.loadResistance ?? setup.circuit.loadResistance,
  };
  return {
    transmitter: setup.transmitter,
    receiver: setup.receiver,
    placement: { distance: pose.distance, lateralOffset: pose.lateralOffset, tiltDeg: pose.tiltDeg },
    circuit,
    tolerance: PLAN_TOLERANCE,
    ...(setup.operatorPoint ? { fieldPoints: [setup.operatorPoint] } : {}),
  };
}

export function pointPrediction(result: SolveJobResult): PointPrediction {
  return {
    mutualInductance: result.mutualInductance,
    coupling: result.coupling,
    txSelfInductance: result.transmitter.selfInductance,
    rxSelfInductance: result.receiver.selfInductance,
    txResistance: result.transmitter.acResistance,
    rxResistance: result.receiver.acResistance,
    efficiency: result.transfer.efficiency,
    loadPower: result.transfer.loadPower,
    fieldRatio: result.field?.[0]?.limiting?.ratio ?? null,
  };
}

/** Points that differ only in repeat or reference share one solve: the key of a pose. */
export function poseKey(pose: PlanPose): string {
  return JSON.stringify([pose.distance, pose.lateralOffset, pose.tiltDeg, pose.frequencyHz ?? null, pose.loadResistance ?? null]);
}
