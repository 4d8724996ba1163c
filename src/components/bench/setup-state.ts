/**
 * The bench's editable state and a saved setup, both ways. Opening a setup restores exactly its coils,
 * placement, circuit, operator point and camera view; saving writes them back (SI throughout).
 */
import type { CircuitSpec } from '@/physics';
import type { BenchPlacement, CameraView, Coil, Setup, SetupInput, Vec3 } from './bench-types';

/** A placement to start from when no setup is open [m, m, deg]. */
export const DEFAULT_PLACEMENT: BenchPlacement = { distance: 0.1, lateralOffset: 0, tiltDeg: 0 };
/** Where a person at the bench might stand, beside the pad at hand height [m]. */
export const DEFAULT_OPERATOR_POINT: Vec3 = [0.3, 0, 0.1];
/** Frequency used when the study has none set [Hz]. */
export const FALLBACK_FREQUENCY_HZ = 100e3;

export function defaultCircuit(studyFrequencyHz: number | null): CircuitSpec {
  return {
    frequency: studyFrequencyHz ?? FALLBACK_FREQUENCY_HZ,
    topology: 'SS',
    sourceVoltage: 10,
    sourceResistance: 0.5,
    loadResistance: 10,
  };
}

export interface BenchEdit {
  transmitterCoilId: number | null;
  receiverCoilId: number | null;
  placement: BenchPlacement;
  circuit: CircuitSpec;
  operatorPoint: Vec3;
}

/** The first two coils of the study (or the only one twice), for a bench with no setup open. */
export function defaultEdit(coils: readonly Coil[], studyFrequencyHz: number | null): BenchEdit {
  return {
    transmitterCoilId: coils[0]?.id ?? null,
    receiverCoilId: coils[1]?.id ?? coils[0]?.id ?? null,
    placement: DEFAULT_PLACEMENT,
    circuit: defaultCircuit(studyFrequencyHz),
    operatorPoint: DEFAULT_OPERATOR_POINT,
  };
}

export function editFromSetup(setup: Setup): BenchEdit {
  return {
    transmitterCoilId: setup.transmitterCoilId,
    receiverCoilId: setup.receiverCoilId,
    placement: {
      distance: setup.placement.distance,
      lateralOffset: setup.placement.lateralOffset ?? 0,
      tiltDeg: setup.placement.tiltDeg ?? 0,
    },
    circuit: { ...setup.circuit },
    operatorPoint: setup.operatorPoint ?? DEFAULT_OPERATOR_POINT,
  };
}

/** Body of POST/PATCH /setups for the current bench. */
export function setupInputFrom(edit: BenchEdit, name: string, notes: string, view: CameraView | null): SetupInput | null {
  if (edit.transmitterCoilId === null || edit.receiverCoilId === null) return null;
  return {
    name: name.trim(),
    transmitterCoilId: edit.transmitterCoilId,
    receiverCoilId: edit.receiverCoilId,
    placement: { ...edit.placement },
    circuit: { ...edit.circuit },
    operatorPoint: edit.operatorPoint,
    view,
    notes,
  };
}

/** The setup id in a `?setup=` value, or null when absent or not a positive integer. */
export function parseSetupParam(value: string | null | undefined): number | null {
  if (!value || !/^[1-9][0-9]{0,9}$/.test(value)) return null;
  return Number(value);
}
