/**
 * solveRequestSchema (src/lib/validations/solve.ts): the PRODUCT.md request is accepted, and every refusal
 * names its field path (PRODUCT.md, "POST /api/solve": 422 with every problem's field path and message).
 */
import { validateSolveRequest } from '../../../src/physics';
import type { SolveRequest } from '../../../src/physics/types';
import { MAX_FIELD_POINTS, solveRequestSchema } from '../../../src/lib/validations/solve';

/** The request example of PRODUCT.md, verbatim. */
const example = () => ({
  transmitter: { kind: 'helix', radius: 0.05, turns: 20, length: 0.04, wireDiameter: 0.001 },
  receiver: { kind: 'loop', radius: 0.04, wireDiameter: 0.001 },
  placement: { distance: 0.1, lateralOffset: 0.02, tiltDeg: 30 },
  circuit: { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 },
  tolerance: 1e-6,
} as Record<string, unknown>);

/** The example with nested values replaced ("circuit.frequency": 5); undefined deletes the key. */
function withValues(changes: Record<string, unknown>) {
  const request = structuredClone(example());
  for (const [path, value] of Object.entries(changes)) {
    const keys = path.split('.');
    let at = request as Record<string, unknown>;
    for (const k of keys.slice(0, -1)) at = at[k] as Record<string, unknown>;
    if (value === undefined) delete at[keys[keys.length - 1]];
    else at[keys[keys.length - 1]] = value;
  }
  return request;
}
const withValue = (path: string, value: unknown) => withValues({ [path]: value });

function issues(input: unknown): { path: string; message: string }[] {
  const result = solveRequestSchema.safeParse(input);
  return result.success ? [] : result.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
}
const pathsOf = (input: unknown) => issues(input).map((i) => i.path).sort();

describe('solveRequestSchema accepts', () => {
  test('the PRODUCT.md example, unchanged', () => {
    expect(solveRequestSchema.parse(example())).toEqual(example());
  });
  test('a missing tolerance as 1e-6 (PRODUCT.md default)', () => {
    expect(solveRequestSchema.parse(withValue('tolerance', undefined)).tolerance).toBe(1e-6);
  });
  test('a pose placement, a spiral, stranded wire, field points and a band', () => {
    const parsed = solveRequestSchema.parse({
      ...example(),
      receiver: { kind: 'spiral', innerRadius: 0.01, outerRadius: 0.04, turns: 10, wireDiameter: 0.001, strands: 50, strandDiameter: 0.0001, material: 'aluminium' },
      placement: { center: [0, 0, 0.1], normal: [0, 0, -1] },
      fieldPoints: [[0.3, 0, 0]],
      band: { startHz: 80e3, stopHz: 120e3 },
    });
    expect(parsed.placement).toEqual({ center: [0, 0, 0.1], normal: [0, 0, -1] });
    expect(parsed.band).toEqual({ startHz: 80e3, stopHz: 120e3, points: 101 });
  });
  test('unknown keys are dropped, so solve() sees only its own', () => {
    const parsed = solveRequestSchema.parse({ ...example(), comment: 'x', placement: { distance: 0.1, colour: 'red' } });
    expect(parsed).not.toHaveProperty('comment');
    expect(parsed.placement).toEqual({ distance: 0.1 });
  });
});

describe('solveRequestSchema refuses, naming the field', () => {
  test.each([
    ['a negative radius (PRODUCT.md)', withValue('transmitter.radius', -0.05), ['transmitter.radius']],
    ['a zero wire diameter', withValue('receiver.wireDiameter', 0), ['receiver.wireDiameter']],
    ['"NaN" for a number (JSON cannot carry NaN)', withValue('receiver.radius', 'NaN'), ['receiver.radius']],
    ['null for a number', withValue('circuit.frequency', null), ['circuit.frequency']],
    ['a number written as text', withValue('placement.distance', '0.1'), ['placement.distance']],
    ['a missing field (PRODUCT.md)', withValue('transmitter.turns', undefined), ['transmitter.turns']],
    ['a missing coil', withValue('receiver', undefined), ['receiver']],
    ['an unknown coil kind', withValue('transmitter.kind', 'solenoid'), ['transmitter.kind']],
    ['a tolerance below 1e-9 (PRODUCT.md range 1e-9..1e-2)', withValue('tolerance', 1e-12), ['tolerance']],
    ['a tolerance above 1e-2', withValue('tolerance', 0.1), ['tolerance']],
    ['a tolerance as text', withValue('tolerance', '1e-6'), ['tolerance']],
    ['more than 2,000 turns', withValues({ 'transmitter.turns': 2001, 'transmitter.length': 3 }), ['transmitter.turns']],
    ['wire thicker than the pitch: 20 turns in 1 cm of 1 mm wire', withValue('transmitter.length', 0.01), ['transmitter.length']],
    ['wire thicker than the loop', withValue('receiver.wireDiameter', 0.1), ['receiver.wireDiameter']],
    ['an unknown material', withValue('receiver.material', 'gold'), ['receiver.material']],
    ['a temperature below absolute zero', withValue('receiver.temperatureC', -300), ['receiver.temperatureC']],
    ['strands without a strand diameter', withValue('receiver.strands', 20), ['receiver.strandDiameter']],
    ['a fractional strand count', withValue('receiver.strands', 2.5), ['receiver.strands']],
    ['an unknown topology', withValue('circuit.topology', 'XY'), ['circuit.topology']],
    ['a zero load', withValue('circuit.loadResistance', 0), ['circuit.loadResistance']],
    ['a negative source voltage', withValue('circuit.sourceVoltage', -1), ['circuit.sourceVoltage']],
    ['a frequency above 300 MHz', withValue('circuit.frequency', 1e9), ['circuit.frequency']],
    ['a placement without a distance', withValue('placement.distance', undefined), ['placement.distance']],
    ['a tilt of 720 degrees', withValue('placement.tiltDeg', 720), ['placement.tiltDeg']],
    ['a distance of 1 km', withValue('placement.distance', 1000), ['placement.distance']],
  ])('%s', (_name, input, expected) => {
    expect(pathsOf(input)).toEqual(expected);
  });

  test('the messages say what arrived instead of a number', () => {
    expect(issues(withValue('receiver.radius', 'NaN'))[0].message).toContain('"NaN"');
    expect(issues(withValue('circuit.frequency', null))[0].message).toContain('null');
    expect(issues(withValues({ 'transmitter.turns': 2001, 'transmitter.length': 3 }))[0].message).toMatch(/too large/);
    expect(issues(withValue('tolerance', 1e-12))[0].message).toMatch(/1e-9 to 1e-2.*too costly/);
  });

  test('every problem of a request at once, each at its own path', () => {
    const request = withValue('transmitter.radius', -1);
    (request.receiver as Record<string, unknown>).radius = 'NaN';
    (request.circuit as Record<string, unknown>).topology = 'XY';
    request.tolerance = 1;
    expect(pathsOf(request)).toEqual(['circuit.topology', 'receiver.radius', 'tolerance', 'transmitter.radius']);
  });

  test('an empty body names all four parts; a non-object body is refused as a whole', () => {
    expect(pathsOf({})).toEqual(['circuit', 'placement', 'receiver', 'transmitter']);
    expect(pathsOf([])).toEqual(['']);
    expect(pathsOf('solve')).toEqual(['']);
  });

  test.each([
    ['both a distance and a pose', { distance: 0.1, center: [0, 0, 0.1], normal: [0, 0, 1] }, ['placement']],
    ['a centre without a normal', { center: [0, 0, 0.1] }, ['placement.normal']],
    ['a zero normal', { center: [0, 0, 0.1], normal: [0, 0, 0] }, ['placement.normal']],
    ['a centre with two coordinates', { center: [0, 0.1], normal: [0, 0, 1] }, ['placement.center']],
    ['a centre coordinate "NaN"', { center: [0, 0, 'NaN'], normal: [0, 0, 1] }, ['placement.center.2']],
  ])('pose: %s', (_name, placement, expected) => {
    expect(pathsOf({ ...example(), placement })).toEqual(expected);
  });

  test.each([
    ['a spiral whose outer radius is not above its inner', { kind: 'spiral', innerRadius: 0.04, outerRadius: 0.03, turns: 5, wireDiameter: 0.001 }, ['receiver.outerRadius']],
    ['a spiral wound tighter than its wire', { kind: 'spiral', innerRadius: 0.01, outerRadius: 0.02, turns: 20, wireDiameter: 0.001 }, ['receiver.turns']],
    ['a strand thicker than its wire', { kind: 'loop', radius: 0.04, wireDiameter: 0.001, strands: 7, strandDiameter: 0.002 }, ['receiver.strandDiameter']],
  ])('coil: %s', (_name, receiver, expected) => {
    expect(pathsOf({ ...example(), receiver })).toEqual(expected);
  });

  test.each([
    [`more than ${MAX_FIELD_POINTS} field points`, { fieldPoints: Array.from({ length: MAX_FIELD_POINTS + 1 }, () => [0, 0, 0.3]) }, ['fieldPoints']],
    ['a field point with two coordinates', { fieldPoints: [[0, 0, 0.3], [0, 0.3]] }, ['fieldPoints.1']],
    ['a field point coordinate null', { fieldPoints: [[0, null, 0.3]] }, ['fieldPoints.0.1']],
    ['more than 401 frequencies', { band: { startHz: 1e5, stopHz: 2e5, points: 402 } }, ['band.points']],
    ['a band that stops below its start', { band: { startHz: 2e5, stopHz: 1e5, points: 11 } }, ['band.stopHz']],
  ])('extras: %s', (_name, extra, expected) => {
    expect(pathsOf({ ...example(), ...extra })).toEqual(expected);
  });
});

describe('agreement with the solver’s own checks (src/physics/validation.ts)', () => {
  // Whatever the schema lets through, the solver's physical validation accepts too, so no accepted
  // request fails later for a reason the form could have shown at its field.
  test.each([
    ['the example', example()],
    ['the thinnest wire the pitch allows (length / turns = wire diameter)', withValue('transmitter.length', 0.02)],
    ['2,000 turns', withValues({ 'transmitter.turns': 2000, 'transmitter.length': 2.2 })],
    ['a tolerance of exactly 1e-9', withValue('tolerance', 1e-9)],
    ['zero source resistance', withValue('circuit.sourceResistance', 0)],
  ])('%s', (_name, input) => {
    expect(validateSolveRequest(solveRequestSchema.parse(input) as SolveRequest)).toEqual([]);
  });
});
