import { solve, type SolveRequest } from '@/physics';
import { answer, runJob, type FieldAnswer, type SweepAnswer } from '@/components/bench/solver-jobs';
import { SWEEP_TILTS_DEG } from '@/components/bench/build-request';

/** Two coaxial-centred circular loops: at 90 degrees tilt with no offset M = 0 by symmetry (no source needed). */
const loops: SolveRequest = {
  transmitter: { kind: 'loop', radius: 0.05, wireDiameter: 0.001 },
  receiver: { kind: 'loop', radius: 0.02, wireDiameter: 0.001 },
  placement: { distance: 0.06, lateralOffset: 0, tiltDeg: 0 },
  circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 },
  tolerance: 1e-4,
};
/** |k(90)| below this fraction of k(0) counts as zero at the fast tolerance. */
const SYMMETRY_FRACTION = 1e-3;

describe('the worker jobs', () => {
  test('solve returns exactly what src/physics solve returns', () => {
    const a = runJob({ kind: 'solve', request: loops });
    expect(a.kind).toBe('solve');
    if (a.kind !== 'solve') return;
    expect(a.response).toEqual(solve(loops));
    expect(a.tolerance).toBe(1e-4);
  });

  test('the tilt sweep gives 19 points with k(90) = 0 for loops (symmetry) and k(0) the coaxial value', () => {
    const a = runJob({ kind: 'sweep', request: loops, tiltsDeg: SWEEP_TILTS_DEG }) as SweepAnswer;
    expect(a.points).toHaveLength(19);
    const k0 = a.points[0].coupling!;
    expect(k0).toBeCloseTo(solve(loops).coupling, 10);
    expect(Math.abs(a.points[18].coupling!)).toBeLessThan(SYMMETRY_FRACTION * Math.abs(k0));
    // |k| falls monotonically as the loop turns away (cos-like for small loops)
    for (let i = 1; i < a.points.length; i++) expect(Math.abs(a.points[i].coupling!)).toBeLessThanOrEqual(Math.abs(a.points[i - 1].coupling!) + 1e-12);
  });

  test('a tilt at which the receiver would touch the transmitter is a gap, not a failure', () => {
    // a receiver as large as the transmitter, 5 mm above it: tilted far, it cuts through the transmitter
    const close: SolveRequest = { ...loops, receiver: { kind: 'loop', radius: 0.05, wireDiameter: 0.001 }, placement: { distance: 0.005 } };
    const a = runJob({ kind: 'sweep', request: close, tiltsDeg: [0, 90] }) as SweepAnswer;
    expect(a.points[0].coupling).not.toBeNull();
    expect(a.points[1].coupling).toBeNull();
  });

  test('the field job answers plain data (structured-clone safe) with the operator assessment', () => {
    const grid = { xMin: -0.1, xMax: 0.1, zMin: -0.05, zMax: 0.15, n: 5 };
    const a = runJob({ kind: 'field', request: loops, grid, operatorPoint: [0.3, 0, 0.1], population: 'general' }) as FieldAnswer;
    expect(a.values).toHaveLength(25);
    expect(a.operator?.fluxDensityRms).toBeGreaterThan(0);
    // 6.78 MHz, general public: the most restrictive default row is ICNIRP 2020's whole-body level
    expect(a.operator?.limiting?.id).toBe('icnirp-2020-whole-body-general');
    expect(a.operator?.limiting?.ratio).toBeCloseTo(a.operator!.fluxDensityRms / a.operator!.limiting!.limitTesla, 12);
    expect(() => structuredClone(a)).not.toThrow();
  });

  test('refused requests answer with the issues and their paths; the handler never throws', () => {
    const touching = { ...loops, receiver: { kind: 'loop' as const, radius: 0.05, wireDiameter: 0.001 }, placement: { distance: 0 } };
    const reply = answer({ id: 4, job: { kind: 'solve', request: touching } });
    expect(reply).toMatchObject({ id: 4, kind: 'solve', ok: false });
    if (reply.ok) return;
    expect(reply.failure.issues[0].path).toBe('placement');
    expect(reply.failure.message).toMatch(/touches or intersects/);
    const bad = answer({ id: 5, job: { kind: 'solve', request: { ...loops, circuit: { ...loops.circuit, frequency: -1 } } } });
    expect(bad).toMatchObject({ id: 5, ok: false, failure: { issues: [{ path: 'circuit.frequency' }] } });
  });
});
