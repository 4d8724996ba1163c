/**
 * The effective parameters a fit can estimate, as changes to what the solver is given. Pure.
 * Pose errors move every planned pose by the same amount (a crooked fixture, a wrong zero); the extra
 * resistance adds a series loss to the receiver coil in the link network only, since a resistance does
 * not change M or k.
 */
import type { LinkParameters } from '../../physics/link-circuit';
import { tuningCapacitance } from '../../physics/link-circuit';
import type { CircuitSpec } from '../../physics/types';
import type { PlanPose } from '../plans/points';
import type { PointPrediction } from '../plans/prediction';
import type { FitModel } from './types';

export type PoseFitModel = Exclude<FitModel, 'extra_rx_resistance'>;

export const isPoseModel = (model: FitModel): model is PoseFitModel => model !== 'extra_rx_resistance';

/** The pose with the model's offset applied. */
export function offsetPose(model: PoseFitModel, pose: PlanPose, offset: number): PlanPose {
  switch (model) {
    case 'tilt_offset':
      return { ...pose, tiltDeg: pose.tiltDeg + offset };
    case 'lateral_offset':
      return { ...pose, lateralOffset: pose.lateralOffset + offset };
    case 'distance_offset':
      return { ...pose, distance: pose.distance + offset };
  }
}

export interface SearchRange {
  start: number;
  step: number;
  lower: number;
  upper: number;
}

/** Where the search for the parameter starts and how far it may go, from the poses measured. */
export function searchRange(model: FitModel, poses: readonly PlanPose[], predictions: readonly PointPrediction[]): SearchRange {
  switch (model) {
    case 'tilt_offset':
      return { start: 0, step: 0.5, lower: -30, upper: 30 };
    case 'lateral_offset':
      return { start: 0, step: 1e-3, lower: -0.1, upper: 0.1 };
    case 'distance_offset': {
      // never so far back that a pose would put the coils through each other
      const nearest = Math.min(...poses.map((p) => p.distance));
      return { start: 0, step: Math.min(1e-3, nearest / 100), lower: -0.5 * nearest, upper: 0.1 };
    }
    case 'extra_rx_resistance': {
      const r2 = Math.min(...predictions.map((p) => p.rxResistance));
      return { start: 0, step: Math.max(1e-3, 0.05 * r2), lower: -0.9 * r2, upper: 100 };
    }
  }
}

/**
 * The link network of a predicted point, as the solver built it: capacitors tuned to the point's
 * frequency unless the setup fixes them (src/physics/solve.ts does the same).
 */
export function predictedLink(circuit: CircuitSpec, pose: PlanPose, predicted: PointPrediction): LinkParameters {
  const frequencyHz = pose.frequencyHz ?? circuit.frequency;
  return {
    frequencyHz,
    topology: circuit.topology,
    L1: predicted.txSelfInductance,
    L2: predicted.rxSelfInductance,
    M: predicted.mutualInductance,
    R1: predicted.txResistance,
    R2: predicted.rxResistance,
    C1: circuit.txCapacitance ?? tuningCapacitance(predicted.txSelfInductance, frequencyHz),
    C2: circuit.rxCapacitance ?? tuningCapacitance(predicted.rxSelfInductance, frequencyHz),
    sourceVoltage: circuit.sourceVoltage,
    sourceResistance: circuit.sourceResistance,
    loadResistance: pose.loadResistance ?? circuit.loadResistance,
  };
}
