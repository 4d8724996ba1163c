import { setupCreateSchema, setupUpdateSchema } from '../../../src/lib/validations/setup';

type Result = { success: boolean; error?: { issues: { path: PropertyKey[] }[] } };
const pathsOf = (result: Result) => (result.success ? [] : (result.error?.issues ?? []).map((issue) => issue.path.join('.')));

const setup = {
  name: 'Probe 10 cm deep',
  transmitterCoilId: 1,
  receiverCoilId: 2,
  placement: { distance: 0.1 },
  circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 },
};

describe('setupCreateSchema', () => {
  test('fills offset, tilt, operator point, view and notes; null capacitors mean "tuned"', () => {
    const parsed = setupCreateSchema.parse({ ...setup, circuit: { ...setup.circuit, txCapacitance: null } });
    expect(parsed.placement).toEqual({ distance: 0.1, lateralOffset: 0, tiltDeg: 0 });
    expect(parsed).toMatchObject({ operatorPoint: null, view: null, notes: '' });
    expect(parsed.circuit.txCapacitance).toBeUndefined();
  });

  test('keeps a view and an operator point', () => {
    const view = { position: [0.3, -0.4, 0.3], target: [0, 0, 0.05] };
    expect(setupCreateSchema.parse({ ...setup, view, operatorPoint: [0.4, 0, 0.3] })).toMatchObject({ view, operatorPoint: [0.4, 0, 0.3] });
  });

  test.each([
    [{ ...setup, name: ' ' }, ['name']],
    [{ ...setup, transmitterCoilId: 0 }, ['transmitterCoilId']],
    [{ ...setup, receiverCoilId: '2' }, ['receiverCoilId']],
    [{ ...setup, placement: { distance: Number.NaN } }, ['placement.distance']],
    [{ ...setup, placement: { distance: 0.1, tiltDeg: 200 } }, ['placement.tiltDeg']],
    [{ ...setup, placement: { distance: 1000 } }, ['placement.distance']],
    [{ ...setup, circuit: { ...setup.circuit, topology: 'XY' } }, ['circuit.topology']],
    [{ ...setup, circuit: { ...setup.circuit, frequency: 0 } }, ['circuit.frequency']],
    [{ ...setup, circuit: { ...setup.circuit, loadResistance: 0 } }, ['circuit.loadResistance']],
    [{ ...setup, circuit: { ...setup.circuit, rxCapacitance: -1e-9 } }, ['circuit.rxCapacitance']],
    [{ ...setup, operatorPoint: [0, 0] }, ['operatorPoint']],
    [{ ...setup, view: { position: [0, 0, 1], target: [0, Number.POSITIVE_INFINITY, 0] } }, ['view.target.1']],
  ])('refuses %j naming the field', (input, paths) => {
    expect(pathsOf(setupCreateSchema.safeParse(input))).toEqual(paths);
  });
});

describe('setupUpdateSchema', () => {
  test('any subset, not nothing', () => {
    expect(setupUpdateSchema.parse({ view: null })).toEqual({ view: null });
    expect(pathsOf(setupUpdateSchema.safeParse({}))).toEqual(['']);
  });
});
