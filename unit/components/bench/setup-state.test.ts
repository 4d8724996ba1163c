import type { Setup } from '@/components/bench/bench-types';
import { DEFAULT_OPERATOR_POINT, defaultEdit, editFromSetup, FALLBACK_FREQUENCY_HZ, parseSetupParam, setupInputFrom } from '@/components/bench/setup-state';

const setup: Setup = {
  id: 7,
  studyId: 1,
  name: 'Probe 10 cm deep, upright',
  transmitterCoilId: 1,
  receiverCoilId: 2,
  placement: { distance: 0.1, lateralOffset: 0.01, tiltDeg: 15 },
  circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50, txCapacitance: 40e-12 },
  operatorPoint: [0.4, 0, 0.3],
  view: { position: [0.35, -0.45, 0.3], target: [0, 0, 0.05] },
  notes: 'deepest',
  createdAt: '2026-12-01T00:00:00.000Z',
  updatedAt: '2026-12-01T00:00:00.000Z',
};

describe('setups and the bench state', () => {
  test('opening a setup and saving it again gives back the same body', () => {
    const body = setupInputFrom(editFromSetup(setup), setup.name, setup.notes, setup.view);
    expect(body).toEqual({
      name: setup.name,
      transmitterCoilId: 1,
      receiverCoilId: 2,
      placement: setup.placement,
      circuit: setup.circuit,
      operatorPoint: setup.operatorPoint,
      view: setup.view,
      notes: setup.notes,
    });
  });

  test('a setup without an operator point gets the default one', () => {
    expect(editFromSetup({ ...setup, operatorPoint: null }).operatorPoint).toEqual(DEFAULT_OPERATOR_POINT);
  });

  test('defaults: the first two coils and the study frequency', () => {
    const coils = [{ id: 4 }, { id: 9 }] as unknown as Parameters<typeof defaultEdit>[0];
    const e = defaultEdit(coils, 85e3);
    expect([e.transmitterCoilId, e.receiverCoilId]).toEqual([4, 9]);
    expect(e.circuit.frequency).toBe(85e3);
    expect(defaultEdit(coils.slice(0, 1), null)).toMatchObject({ transmitterCoilId: 4, receiverCoilId: 4, circuit: { frequency: FALLBACK_FREQUENCY_HZ } });
    expect(defaultEdit([], null).transmitterCoilId).toBeNull();
  });

  test('nothing to save without coils', () => {
    expect(setupInputFrom({ ...editFromSetup(setup), receiverCoilId: null }, 'x', '', null)).toBeNull();
  });

  test('?setup= takes a positive integer only', () => {
    expect(parseSetupParam('12')).toBe(12);
    for (const bad of [null, undefined, '', '0', '-3', '1.5', '12abc', '99999999999']) expect(parseSetupParam(bad)).toBeNull();
  });
});
