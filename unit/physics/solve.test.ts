/**
 * solve() (src/physics/solve.ts, index.ts): the PRODUCT.md response and input errors.
 */
import { coilPathPoints, fieldAtPoints, frequencyResponse, solve, SolveInputError, SOLVER_VERSION } from '../../src/physics';
import { coilPath } from '../../src/physics/geometry/coil-path';
import { poseFromPlacement } from '../../src/physics/geometry/pose';
import type { SolveRequest } from '../../src/physics/types';
import { maxwellCoaxial } from './oracles/maxwell';

const relErr = (x: number, ref: number) => Math.abs(x - ref) / Math.abs(ref);

const example = (): SolveRequest => ({
  transmitter: { kind: 'helix', radius: 0.05, turns: 20, length: 0.04, wireDiameter: 0.001 },
  receiver: { kind: 'loop', radius: 0.04, wireDiameter: 0.001 },
  placement: { distance: 0.1, lateralOffset: 0.02, tiltDeg: 30 },
  circuit: { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 },
  tolerance: 1e-6,
});

const issuesOf = (request: unknown) => {
  try {
    solve(request as SolveRequest);
  } catch (e) {
    if (e instanceof SolveInputError) return e.issues;
    throw e;
  }
  return [];
};

describe('response (PRODUCT.md "POST /api/solve")', () => {
  test('has every documented field as a finite number and the solver version', () => {
    const r = solve(example());
    const coilKeys = ['selfInductance', 'dcResistance', 'acResistance', 'wireLength', 'qualityFactor', 'capacitance'];
    for (const side of [r.transmitter, r.receiver]) for (const k of coilKeys) expect(Number.isFinite((side as never)[k])).toBe(true);
    const transferKeys = ['efficiency', 'loadPower', 'inputPower', 'txCurrent', 'rxCurrent', 'txCapacitorVoltage', 'rxCapacitorVoltage', 'figureOfMerit', 'optimalLoad', 'maxEfficiency'];
    for (const k of transferKeys) expect(Number.isFinite((r.transfer as never)[k])).toBe(true);
    expect(r.accuracy.estimatedRelativeError).toBeLessThanOrEqual(1e-6);
    expect(r.accuracy.integrandEvaluations).toBeGreaterThan(0);
    expect(r.solverVersion).toBe(SOLVER_VERSION);
    expect(r.transmitter.tuned).toBe(true);
  });
  test('coupling = M / sqrt(L1 L2); figure of merit k^2 Q1 Q2; tuned C = 1/(w^2 L)', () => {
    const r = solve(example());
    expect(relErr(r.coupling, r.mutualInductance / Math.sqrt(r.transmitter.selfInductance * r.receiver.selfInductance))).toBeLessThan(1e-14);
    expect(relErr(r.transfer.figureOfMerit, r.coupling ** 2 * r.transmitter.qualityFactor * r.receiver.qualityFactor)).toBeLessThan(1e-14);
    const w = 2 * Math.PI * 1e5;
    expect(relErr(r.receiver.capacitance, 1 / (w * w * r.receiver.selfInductance))).toBeLessThan(1e-14);
  });
  test('coaxial loops: M matches Maxwell (art. 701) through the whole solve', () => {
    const r = solve({ ...example(), transmitter: { kind: 'loop', radius: 0.1, wireDiameter: 1e-3 }, receiver: { kind: 'loop', radius: 0.1, wireDiameter: 1e-3 }, placement: { distance: 0.1 }, tolerance: 1e-9 });
    expect(relErr(r.mutualInductance, maxwellCoaxial(0.1, 0.1, 0.1))).toBeLessThan(1e-9);
  });
  test('given capacitors are used and reported as not tuned; measured resistance overrides the model', () => {
    const req = example();
    req.circuit.txCapacitance = 1e-7;
    req.receiver.resistance = 0.42;
    const r = solve(req);
    expect(r.transmitter.capacitance).toBe(1e-7);
    expect(r.transmitter.tuned).toBe(false);
    expect(r.receiver.acResistance).toBe(0.42);
    expect(r.receiver.resistanceSource).toBe('measured');
  });
  test('path points for the 3D bench lie on the solver path (receiver placed)', () => {
    const req = example();
    const pts = coilPathPoints(req.receiver, req.placement, 16);
    const path = coilPath(req.receiver, poseFromPlacement(req.placement));
    const out = new Float64Array(6);
    path.evaluate(path.tEnd / 4, out, 0);
    expect(pts.length).toBe(3 * 17);
    expect(Math.hypot(pts[12] - out[0], pts[13] - out[1], pts[14] - out[2])).toBeLessThan(1e-15);
  });
  test('frequency response passes through the operating point', () => {
    const req = example();
    const fr = frequencyResponse(req, { startHz: 90e3, stopHz: 110e3, points: 21 });
    expect(fr.frequencyHz[10]).toBeCloseTo(1e5, 6);
    expect(relErr(fr.efficiency[10], solve(req).transfer.efficiency)).toBeLessThan(1e-12);
  });
  test('field at a point, with the exposure row that applies at 100 kHz', () => {
    const [p] = fieldAtPoints(example(), [[0.3, 0, 0]]);
    expect(p.fluxDensityRms).toBeGreaterThan(0);
    expect(p.exposure.limiting?.row.source).toMatch(/ICNIRP/);
  });
});

describe('input errors (SolveInputError -> 422 with field paths)', () => {
  test('receiver intersecting the transmitter', () => {
    const issues = issuesOf({ ...example(), receiver: { kind: 'loop', radius: 0.04, wireDiameter: 0.001 }, placement: { distance: 0 } , transmitter: { kind: 'loop', radius: 0.04, wireDiameter: 0.001 } });
    expect(issues).toEqual([expect.objectContaining({ path: ['placement'], message: expect.stringMatching(/touches or intersects/) })]);
  });
  test('helices closer than the sum of wire radii', () => {
    const req = example();
    req.receiver = { ...req.transmitter };
    req.placement = { distance: 0.0405 };
    expect(issuesOf(req)[0].path).toEqual(['placement']);
  });
  test('every problem reported with its path: negative radius, NaN, tolerance out of range, overlapping turns', () => {
    const req = example() as unknown as Record<string, Record<string, unknown>>;
    req.transmitter.radius = -1;
    req.transmitter.length = 0.001;
    req.receiver.wireDiameter = Number.NaN;
    (req as Record<string, unknown>).tolerance = 1e-12;
    req.circuit.frequency = Infinity;
    const paths = issuesOf(req).map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['transmitter.radius', 'transmitter.length', 'receiver.wireDiameter', 'tolerance', 'circuit.frequency']));
  });
  test('too many turns is refused', () => {
    const req = example();
    req.transmitter = { kind: 'helix', radius: 0.05, turns: 5000, length: 10, wireDiameter: 0.001 };
    expect(issuesOf(req).map((i) => i.path.join('.'))).toContain('transmitter.turns');
  });
});
