import { validateSolveRequest } from '../../../src/physics';
import type { CoilSpec, SolveRequest } from '../../../src/physics/types';
import { coilCreateSchema, coilSpecSchema, coilUpdateSchema, wireLabelMismatch } from '../../../src/lib/validations/coil';

type Result = { success: boolean; error?: { issues: { path: PropertyKey[]; message: string }[] } };
const pathsOf = (result: Result) => (result.success ? [] : (result.error?.issues ?? []).map((issue) => issue.path.join('.')));
const messagesOf = (result: Result) => (result.success ? [] : (result.error?.issues ?? []).map((issue) => issue.message));

const AWG18 = 0.005 * 0.0254 * 92 ** ((36 - 18) / 39); // ASTM B258
const loop = { kind: 'loop', radius: 0.05, wireDiameter: 0.001 };
const helix = { kind: 'helix', radius: 0.012, turns: 12, length: 0.03, wireDiameter: 0.0006 };
const spiral = { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.14, turns: 8, wireDiameter: 0.0013 };

describe('coilSpecSchema accepts sound coils of every kind', () => {
  test.each([loop, helix, spiral, { ...helix, turns: 12.5 }, { ...helix, turns: 1, length: 0 }])('%j', (spec) => {
    expect(coilSpecSchema.safeParse(spec).success).toBe(true);
  });

  test('litz that fits, aluminium, a hot winding', () => {
    const litz = { ...spiral, wireDiameter: 0.0015, strands: 105, strandDiameter: 0.0001, material: 'aluminium', temperatureC: 120 };
    expect(coilSpecSchema.safeParse(litz).success).toBe(true);
  });

  test('whatever it accepts, the solver accepts too (src/physics/validation.ts)', () => {
    const accepted = [loop, helix, spiral, { ...spiral, strands: 7, strandDiameter: 0.0004 }] as CoilSpec[];
    for (const spec of accepted) {
      const request: SolveRequest = {
        transmitter: coilSpecSchema.parse(spec),
        receiver: loop as CoilSpec,
        placement: { distance: 1 },
        circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 1, sourceResistance: 0, loadResistance: 1 },
      };
      expect(validateSolveRequest(request)).toEqual([]);
    }
  });
});

describe('coilSpecSchema refuses impossible coils, naming the field', () => {
  test.each([
    ['zero turns', { ...helix, turns: 0 }, ['turns']],
    ['negative turns', { ...spiral, turns: -3 }, ['turns']],
    ['more than 2000 turns', { ...helix, turns: 2001, length: 3 }, ['turns']],
    ['inner radius above outer', { ...spiral, innerRadius: 0.2 }, ['innerRadius']],
    ['inner radius equal to outer', { ...spiral, innerRadius: 0.14 }, ['innerRadius']],
    ['NaN radius', { ...loop, radius: Number.NaN }, ['radius']],
    ['infinite length', { ...helix, length: Number.POSITIVE_INFINITY }, ['length']],
    ['radius as text', { ...loop, radius: '5 cm' }, ['radius']],
    ['negative radius', { ...loop, radius: -0.05 }, ['radius']],
    ['missing wire', { kind: 'loop', radius: 0.05 }, ['wireDiameter']],
    ['wire thicker than the radius', { ...loop, radius: 0.0008 }, ['wireDiameter']],
    ['helix pitch below the wire', { ...helix, length: 0.005 }, ['length']],
    ['spiral radial pitch below the wire', { ...spiral, turns: 100 }, ['turns']],
    ['spiral inner radius inside the wire', { ...spiral, innerRadius: 0.0005 }, ['innerRadius']],
    ['unknown kind', { ...loop, kind: 'cone' }, ['kind']],
    ['unknown material', { ...loop, material: 'silver' }, ['material']],
    ['too cold', { ...loop, temperatureC: -60 }, ['temperatureC']],
    ['too hot', { ...loop, temperatureC: 251 }, ['temperatureC']],
    ['fractional strands', { ...loop, strands: 2.5, strandDiameter: 0.0001 }, ['strands']],
    ['strands without their diameter', { ...loop, strands: 20 }, ['strandDiameter']],
    ['a strand thicker than the wire', { ...loop, strandDiameter: 0.002 }, ['strandDiameter']],
    ['a bundle that does not fit', { ...loop, strands: 105, strandDiameter: 0.0001 }, ['strands']],
    ['two strands of more than half the wire', { ...loop, strands: 2, strandDiameter: 0.0006 }, ['strands']],
    ['a measured resistance inside the spec', { ...loop, resistance: 0.3 }, ['']],
  ])('%s', (_what, spec, paths) => {
    expect(pathsOf(coilSpecSchema.safeParse(spec))).toEqual(paths);
  });

  test('messages say what to change, with the sizes involved', () => {
    expect(messagesOf(coilSpecSchema.safeParse({ ...spiral, innerRadius: 0.2 }))).toEqual([
      'The inner radius (200 mm) must be smaller than the outer radius (140 mm).',
    ]);
    expect(messagesOf(coilSpecSchema.safeParse({ ...helix, turns: 0 }))).toEqual(['The number of turns must be greater than zero.']);
    expect(messagesOf(coilSpecSchema.safeParse({ ...loop, resistance: 0.3 }))).toEqual(['A coil spec has no field resistance.']);
  });
});

describe('coilCreateSchema', () => {
  test('fills the optional parts and trims', () => {
    expect(coilCreateSchema.parse({ name: '  Probe  ', spec: loop })).toEqual({
      name: 'Probe', spec: loop, wireLabel: null, notes: '',
      measured: { inductance: null, resistance: null, qualityFactor: null, frequencyHz: null },
    });
  });

  test('paths are full: spec fields under spec, measured under measured', () => {
    const result = coilCreateSchema.safeParse({ name: '', spec: { ...spiral, turns: 0 }, measured: { inductance: -1, frequencyHz: 6.78e6 } });
    expect(pathsOf(result)).toEqual(['name', 'spec.turns', 'measured.inductance']);
  });

  test('measured values need the frequency they were measured at', () => {
    expect(pathsOf(coilCreateSchema.safeParse({ name: 'P', spec: loop, measured: { qualityFactor: 300 } }))).toEqual(['measured.frequencyHz']);
  });

  test('a gauge label must agree with the diameter (ASTM B258)', () => {
    expect(coilCreateSchema.safeParse({ name: 'P', spec: { ...loop, wireDiameter: AWG18 }, wireLabel: 'AWG 18' }).success).toBe(true);
    expect(pathsOf(coilCreateSchema.safeParse({ name: 'P', spec: loop, wireLabel: 'AWG 18' }))).toEqual(['wireLabel']);
    expect(wireLabelMismatch('AWG 18', 0.001)).toBe('AWG 18 is 1.024 mm, but the wire diameter is 1 mm.');
    expect(wireLabelMismatch('1 mm enamelled', 0.001)).toBeNull();
  });
});

describe('coilUpdateSchema', () => {
  test('takes any subset but not nothing', () => {
    expect(coilUpdateSchema.parse({ name: 'New name' })).toEqual({ name: 'New name' });
    expect(pathsOf(coilUpdateSchema.safeParse({}))).toEqual(['']);
    expect(pathsOf(coilUpdateSchema.safeParse({ spec: { ...helix, turns: 0 } }))).toEqual(['spec.turns']);
  });
});
