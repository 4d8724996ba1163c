import type { CoilSpec } from '@/physics';
import { buildSolveRequest, cleanCoil, FAST_TOLERANCE, fieldKey, REFINED_TOLERANCE, requestKey, SWEEP_TILTS_DEG, sweepKey, withTilt } from '@/components/bench/build-request';

const state = {
  transmitter: { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.14, turns: 8, wireDiameter: 0.0013 } as CoilSpec,
  receiver: { kind: 'loop', radius: 0.015, wireDiameter: 0.001 } as CoilSpec,
  placement: { distance: 0.1, lateralOffset: 0.02, tiltDeg: 30 },
  circuit: { frequency: 6.78e6, topology: 'SS' as const, sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 },
};

describe('solver requests from the bench', () => {
  test('the request is SI, as POST /api/solve takes it (PRODUCT.md)', () => {
    expect(buildSolveRequest(state, REFINED_TOLERANCE)).toEqual({
      transmitter: state.transmitter,
      receiver: state.receiver,
      placement: { distance: 0.1, lateralOffset: 0.02, tiltDeg: 30 },
      circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 },
      tolerance: 1e-6,
    });
  });

  test('null fields from the API are dropped, fixed capacitors are kept', () => {
    const withNulls = { ...state.receiver, resistance: null, material: null } as unknown as CoilSpec;
    expect(cleanCoil(withNulls)).toEqual(state.receiver);
    const r = buildSolveRequest({ ...state, circuit: { ...state.circuit, txCapacitance: 47e-12, rxCapacitance: null as unknown as undefined } }, FAST_TOLERANCE);
    expect(r.circuit.txCapacitance).toBe(47e-12);
    expect('rxCapacitance' in r.circuit).toBe(false);
  });

  test('the fast and refined passes of one state share a key; another state does not', () => {
    const fast = buildSolveRequest(state, FAST_TOLERANCE);
    const refined = buildSolveRequest(state, REFINED_TOLERANCE);
    expect(requestKey(fast)).toBe(requestKey(refined));
    expect(requestKey(withTilt(fast, 31))).not.toBe(requestKey(fast));
  });

  test('the sweep key ignores tilt and the circuit (k is geometric), not distance or offset', () => {
    const r = buildSolveRequest(state, FAST_TOLERANCE);
    expect(sweepKey(withTilt(r, 80))).toBe(sweepKey(r));
    expect(sweepKey({ ...r, circuit: { ...r.circuit, loadResistance: 5 } })).toBe(sweepKey(r));
    expect(sweepKey({ ...r, placement: { ...r.placement, distance: 0.2 } })).not.toBe(sweepKey(r));
    expect(sweepKey({ ...r, placement: { ...r.placement, lateralOffset: 0 } })).not.toBe(sweepKey(r));
  });

  test('the field key changes with the operator point and the population', () => {
    const r = buildSolveRequest(state, FAST_TOLERANCE);
    const grid = { xMin: -0.2, xMax: 0.2, zMin: -0.1, zMax: 0.3, n: 41 };
    expect(fieldKey(r, grid, [0.3, 0, 0.1], 'general')).not.toBe(fieldKey(r, grid, [0.3, 0, 0.2], 'general'));
    expect(fieldKey(r, grid, [0.3, 0, 0.1], 'general')).not.toBe(fieldKey(r, grid, [0.3, 0, 0.1], 'occupational'));
  });

  test('the tilt sweep is 0 to 90 degrees in 19 points', () => {
    expect(SWEEP_TILTS_DEG).toHaveLength(19);
    expect(SWEEP_TILTS_DEG[0]).toBe(0);
    expect(SWEEP_TILTS_DEG[18]).toBe(90);
  });
});
