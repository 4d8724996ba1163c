/**
 * Solver requests built from the bench's state. Everything the bench shows in cm or degrees is already
 * SI (m) in BenchPlacement; the request is exactly what POST /api/solve would receive.
 */
import type { CircuitSpec, CoilSpec, SolveRequest } from '@/physics';
import type { BenchPlacement } from './bench-types';

/** Tolerances of the two passes: fast while the receiver moves, refined once it rests. */
export const FAST_TOLERANCE = 1e-4;
export const REFINED_TOLERANCE = 1e-6;

/** The k-against-tilt chart: 0 to 90 degrees in 5-degree steps (19 points). */
export const SWEEP_TILTS_DEG: readonly number[] = Array.from({ length: 19 }, (_, i) => i * 5);

export interface BenchState {
  transmitter: CoilSpec;
  receiver: CoilSpec;
  placement: BenchPlacement;
  circuit: CircuitSpec;
}

/** Only the fields the solver reads, in a fixed order, so two equal states give equal keys. */
function cleanCircuit(c: CircuitSpec): CircuitSpec {
  const out: CircuitSpec = {
    frequency: c.frequency, topology: c.topology, sourceVoltage: c.sourceVoltage,
    sourceResistance: c.sourceResistance, loadResistance: c.loadResistance,
  };
  if (c.txCapacitance !== undefined && c.txCapacitance !== null) out.txCapacitance = c.txCapacitance;
  if (c.rxCapacitance !== undefined && c.rxCapacitance !== null) out.rxCapacitance = c.rxCapacitance;
  return out;
}

/** A coil spec without null or undefined fields (an API may send `resistance: null`; the solver wants it absent). */
export function cleanCoil(spec: CoilSpec): CoilSpec {
  return Object.fromEntries(Object.entries(spec).filter(([, v]) => v !== null && v !== undefined)) as unknown as CoilSpec;
}

export function buildSolveRequest(state: BenchState, tolerance: number): SolveRequest {
  return {
    transmitter: cleanCoil(state.transmitter),
    receiver: cleanCoil(state.receiver),
    placement: {
      distance: state.placement.distance,
      lateralOffset: state.placement.lateralOffset,
      tiltDeg: state.placement.tiltDeg,
    },
    circuit: cleanCircuit(state.circuit),
    tolerance,
  };
}

/** Identity of a request apart from its tolerance: results of the fast and refined pass share it. */
export function requestKey(request: SolveRequest): string {
  const { tolerance: _tolerance, ...rest } = request;
  return JSON.stringify(rest);
}

/** The same request at another tilt (for the sweep). */
export function withTilt(request: SolveRequest, tiltDeg: number): SolveRequest {
  return { ...request, placement: { ...request.placement, tiltDeg } };
}

/** Identity of a tilt sweep: coupling depends on the coils, distance and offset only (not tilt, not the circuit). */
export function sweepKey(request: SolveRequest): string {
  const p = request.placement as { distance: number; lateralOffset?: number };
  return JSON.stringify([request.transmitter, request.receiver, p.distance, p.lateralOffset ?? 0]);
}

/** Identity of a field map: the whole request (currents depend on everything), grid, operator point, population. */
export function fieldKey(request: SolveRequest, grid: unknown, operatorPoint: unknown, population: string): string {
  return JSON.stringify([requestKey(request), grid, operatorPoint, population]);
}
