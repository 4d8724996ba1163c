import type { CoilSpec } from '../../../src/physics/types';
import { createCoil, deleteCoil } from '../../../src/lib/data/coils';
import { createSetup, deleteSetup, updateSetup } from '../../../src/lib/data/setups';
import { cancelPredictions, createPlan, deletePlan, getPlan, getPlanProgress, listPlans, recomputePredictions, transitionPlan, updatePlan } from '../../../src/lib/data/plans';
import { listPlanPoints, runSheetCsv } from '../../../src/lib/data/plan-points';
import { acknowledgeCautions, createReading } from '../../../src/lib/data/readings';
import { BENCH_CAUTIONS_VERSION } from '../../../src/lib/readings/bench-cautions';
import { readingCreateSchema } from '../../../src/lib/validations/reading';
import { planPredictionRun, setPlanSolverPool } from '../../../src/lib/data/plan-predictions';
import { pointPrediction, pointSolveJob } from '../../../src/lib/plans/solve-job';
import { runSolveJob } from '../../../src/lib/solver-pool/job';
import { createSourceWorker } from '../../../src/lib/solver-pool/source-worker';
import { SolverPool } from '../../../src/lib/solver-pool/solver-pool';
import { coilCreateSchema } from '../../../src/lib/validations/coil';
import { planCreateSchema, type PlanCreateInput } from '../../../src/lib/validations/plan';
import { setupCreateSchema } from '../../../src/lib/validations/setup';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';

const helix: CoilSpec = { kind: 'helix', radius: 0.05, turns: 20, length: 0.04, wireDiameter: 0.001 };
const circuit = { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 } as const;
const tilt = { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 90, step: 30 } as const;
const distance = { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.12, stop: 0.18, step: 0.02 } as const;
/** Same machine, same code: the pool's numbers equal an in-thread solve to rounding. */
const SAME_SOLVE_TOLERANCE = 1e-12;

describe('sweep plans data', () => {
  let padId: number;
  let setupId: number;
  let txId: number;
  let pool: SolverPool;
  const input = (name: string, extra: Partial<PlanCreateInput> = {}) =>
    planCreateSchema.parse({ name, setupId, axes: [tilt, distance], repeats: 2, referenceEvery: 5, orderMode: 'serpentine', minutesPerPoint: 2, ...extra });

  beforeAll(async () => {
    pool = new SolverPool({ size: 1, queueLimit: 64, timeoutMs: 60_000, createWorker: () => createSourceWorker() });
    setPlanSolverPool(pool);
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    padId = await studyIdByName(SEEDED.padStudy);
    txId = (await createCoil(researcher, padId, coilCreateSchema.parse({ name: 'Plan drill helix A', spec: helix }))).id;
    const rxId = (await createCoil(researcher, padId, coilCreateSchema.parse({ name: 'Plan drill helix B', spec: helix }))).id;
    setupId = (await createSetup(researcher, padId, setupCreateSchema.parse({
      name: 'Plan drill helices', transmitterCoilId: txId, receiverCoilId: rxId, placement: { distance: 0.15 }, circuit, operatorPoint: [0.3, 0, 0.1],
    }))).id;
  });
  afterAll(async () => {
    setPlanSolverPool(null);
    await pool.close();
    await db.destroy();
  });

  it('shows the seeded plan on the bench with computed predictions to every member', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const [seeded] = (await listPlans(student, padId)).filter((p) => p.name === 'Probe tilt x depth');
    expect(seeded).toMatchObject({ state: 'on_bench', pointCount: 30, prediction: { status: 'done', done: 30, total: 30 } });
    const points = await listPlanPoints(student, padId, seeded.id);
    expect(points.every((p) => p.predicted !== null && p.predicted.mutualInductance > 0 && p.predicted.fieldRatio !== null)).toBe(true);
  });

  it('creates a draft, computes every point, and the values equal a direct solve', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const plan = await createPlan(researcher, padId, input('Computed drill'));
    // 4 tilts x 4 distances x 2 repeats = 32 measurements, plus a reference after every 5th but the last
    expect(plan).toMatchObject({ state: 'draft', pointCount: 38, estimatedMinutes: 76, prediction: { status: 'running', total: 38 } });
    await planPredictionRun(plan.id);
    expect((await getPlan(researcher, padId, plan.id)).prediction).toEqual({ status: 'done', done: 38, total: 38, error: null, solverVersion: '1.0.0' });

    const points = await listPlanPoints(researcher, padId, plan.id);
    expect(points.map((p) => p.seq)).toEqual(Array.from({ length: 38 }, (_, i) => i + 1));
    const geometry = { transmitter: helix, receiver: helix, circuit, operatorPoint: [0.3, 0, 0.1] as [number, number, number] };
    for (const point of [points[0], points[9], points[37]]) {
      const direct = pointPrediction(runSolveJob(pointSolveJob(geometry, point.pose)));
      for (const [key, value] of Object.entries(direct)) {
        expect(Math.abs((point.predicted as unknown as Record<string, number>)[key] / (value as number) - 1)).toBeLessThan(SAME_SOLVE_TOLERANCE);
      }
    }
    expect(points[5]).toMatchObject({ isReference: true, pose: points[0].pose, predicted: points[0].predicted, solverVersion: '1.0.0' });
    const csv = runSheetCsv(points).split(/\r?\n/);
    expect(csv[0]).toContain('seq,repeat,is_reference,distance_m,lateral_offset_m,tilt_deg');
    expect(csv[0]).toContain('mutual_inductance_H,coupling');
    expect(csv).toHaveLength(39);
  });

  it('student and supervisor cannot create or edit (403); an outsider gets 404', async () => {
    const [researcher, student, supervisor, outsider] = await Promise.all([SEEDED.researcher, SEEDED.student, SEEDED.supervisor, SEEDED.otherResearcher].map(sessionUserByEmail));
    const plan = await createPlan(researcher, padId, input('Roles drill'));
    await planPredictionRun(plan.id);
    for (const reader of [student, supervisor]) {
      expect(await statusOf(() => createPlan(reader, padId, input('Not allowed')))).toBe(403);
      expect(await statusOf(() => updatePlan(reader, padId, plan.id, { name: 'Renamed' }))).toBe(403);
      expect(await statusOf(() => getPlan(reader, padId, plan.id))).toBe(200);
    }
    expect(await statusOf(() => getPlan(outsider, padId, plan.id))).toBe(404);
    expect(await statusOf(() => createPlan(outsider, padId, input('Not allowed')))).toBe(404);
    expect(await statusOf(() => listPlanPoints(outsider, padId, plan.id))).toBe(404);
  });

  it('moves through the states by role; only a draft changes or is deleted', async () => {
    const [researcher, student, supervisor] = await Promise.all([SEEDED.researcher, SEEDED.student, SEEDED.supervisor].map(sessionUserByEmail));
    const plan = await createPlan(researcher, padId, input('States drill'));
    await planPredictionRun(plan.id);
    expect(await statusOf(() => transitionPlan(student, padId, plan.id, { to: 'on_bench' }))).toBe(403);
    expect(await statusOf(() => transitionPlan(researcher, padId, plan.id, { to: 'accepted' }))).toBe(409);
    expect((await transitionPlan(researcher, padId, plan.id, { to: 'on_bench' })).state).toBe('on_bench');
    expect(await statusOf(() => updatePlan(researcher, padId, plan.id, { axes: [tilt] }))).toBe(409);
    expect(await statusOf(() => deletePlan(researcher, padId, plan.id))).toBe(409);
    expect(await statusOf(() => transitionPlan(supervisor, padId, plan.id, { to: 'in_review' }))).toBe(403);
    // review needs something to review: at least one reading
    expect(await statusOf(() => transitionPlan(student, padId, plan.id, { to: 'in_review' }))).toBe(409);
    await acknowledgeCautions(student, padId, plan.id, BENCH_CAUTIONS_VERSION);
    const [firstPoint] = await listPlanPoints(student, padId, plan.id);
    await createReading(student, padId, plan.id, readingCreateSchema.parse({ pointId: firstPoint.id, method: 'split_peaks', raw: { lowPeak: 6.6e6, highPeak: 6.9e6 } }));
    expect((await transitionPlan(student, padId, plan.id, { to: 'in_review' })).state).toBe('in_review');
    expect(await statusOf(() => transitionPlan(researcher, padId, plan.id, { to: 'accepted' }))).toBe(403);
    expect((await transitionPlan(supervisor, padId, plan.id, { to: 'on_bench', reason: 'Redo 30 degrees' })).state).toBe('on_bench');
    await transitionPlan(student, padId, plan.id, { to: 'in_review' });
    expect((await transitionPlan(supervisor, padId, plan.id, { to: 'accepted' })).state).toBe('accepted');
    const details = await db('audit_events').where({ target_table: 'sweep_plans', target_id: String(plan.id), action: 'plan.transition' }).pluck('details');
    expect(details.map((d: unknown) => (typeof d === 'string' ? JSON.parse(d) : d).to)).toEqual(['on_bench', 'in_review', 'on_bench', 'in_review', 'accepted']);
  });

  it('a plan changed while computing ends with every point predicted by the new run', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    // each solve held back 40 ms, so the first run (16 poses) is still computing when the axes change
    setPlanSolverPool({ solve: (job) => new Promise((resolve) => setTimeout(resolve, 40)).then(() => pool.solve(job)) });
    let firstRun: Promise<void>;
    try {
      const plan0 = await createPlan(researcher, padId, input('Changed drill', { repeats: 1, referenceEvery: null }));
      firstRun = planPredictionRun(plan0.id);
      const changed = await updatePlan(researcher, padId, plan0.id, { axes: [{ ...distance, start: 0.2, stop: 0.26 }] });
      expect(changed.prediction).toMatchObject({ status: 'running', done: 0, total: 4 });
      expect(changed.pointCount).toBe(4);
      await firstRun;
      await planPredictionRun(plan0.id);
    } finally {
      setPlanSolverPool(pool);
    }
    const plan = (await listPlans(researcher, padId)).find((p) => p.name === 'Changed drill')!;
    const progress = (await getPlan(researcher, padId, plan.id)).prediction;
    expect(progress).toMatchObject({ status: 'done', done: 4, total: 4 });
    const points = await listPlanPoints(researcher, padId, plan.id);
    expect(points.map((p) => p.pose.distance)).toEqual([0.2, 0.22, 0.24, 0.26]);
    const geometry = { transmitter: helix, receiver: helix, circuit, operatorPoint: [0.3, 0, 0.1] as [number, number, number] };
    for (const point of points) {
      const direct = pointPrediction(runSolveJob(pointSolveJob(geometry, point.pose)));
      expect(Math.abs(point.predicted!.mutualInductance / direct.mutualInductance - 1)).toBeLessThan(SAME_SOLVE_TOLERANCE);
    }
    const leftovers = await db('sweep_points').where({ plan_id: plan.id }).whereNotNull('pending_predicted').count({ n: '*' });
    expect(Number(leftovers[0].n)).toBe(0);
  });

  it('cancel stops a recompute and keeps the earlier predictions', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const plan = await createPlan(researcher, padId, input('Cancel drill'));
    await planPredictionRun(plan.id);
    const before = await listPlanPoints(researcher, padId, plan.id);
    await recomputePredictions(researcher, padId, plan.id);
    const progress = await cancelPredictions(researcher, padId, plan.id);
    expect(progress.status).toBe('cancelled');
    await planPredictionRun(plan.id);
    expect((await getPlan(researcher, padId, plan.id)).prediction.status).toBe('cancelled');
    expect(await listPlanPoints(researcher, padId, plan.id)).toEqual(before);
    expect(await statusOf(() => cancelPredictions(researcher, padId, plan.id))).toBe(409);
  });

  it('a failed recompute keeps the earlier predictions and says what failed', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const plan = await createPlan(researcher, padId, input('Failure drill', { repeats: 1, referenceEvery: null }));
    await planPredictionRun(plan.id);
    const before = await listPlanPoints(researcher, padId, plan.id);
    let calls = 0;
    setPlanSolverPool({ solve: (job) => (++calls === 3 ? Promise.reject(new Error('worker crashed')) : pool.solve(job)) });
    try {
      await recomputePredictions(researcher, padId, plan.id);
      await planPredictionRun(plan.id);
    } finally {
      setPlanSolverPool(pool);
    }
    const prediction = (await getPlan(researcher, padId, plan.id)).prediction;
    expect(prediction.status).toBe('failed');
    expect(prediction.error).toMatch(/^The solver failed on the point at distance .* The earlier predictions are kept/);
    expect(await listPlanPoints(researcher, padId, plan.id)).toEqual(before);
  });

  it('a 441-point plan of two 20-turn helices is computed end to end in under 5 s', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    // the benchmark sweep of README "Solver benchmarks": tilt 0-90 by 4.5 x distance 12-32 cm by 1 cm
    const started = performance.now();
    const plan = await createPlan(researcher, padId, input('Benchmark 441', {
      repeats: 1, referenceEvery: null, orderMode: 'as_listed',
      axes: [{ ...tilt, step: 4.5 }, { ...distance, start: 0.12, stop: 0.32, step: 0.01 }],
    }));
    await planPredictionRun(plan.id);
    const ms = performance.now() - started;
    console.log(`441-point plan, create to all predictions stored: ${ms.toFixed(0)} ms`);
    expect((await getPlan(researcher, padId, plan.id)).prediction).toMatchObject({ status: 'done', done: 441, total: 441 });
    expect(ms).toBeLessThan(5000);
    await deletePlan(researcher, padId, plan.id);
  });

  it('a change to the setup circuit computes its plans again', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const plan = await createPlan(researcher, padId, input('Circuit drill', { repeats: 1, referenceEvery: null, axes: [tilt] }));
    await planPredictionRun(plan.id);
    const newCircuit = { ...circuit, loadResistance: 20 };
    await updateSetup(researcher, padId, setupId, { circuit: { ...newCircuit, txCapacitance: undefined, rxCapacitance: undefined } });
    const plans = (await listPlans(researcher, padId)).filter((p) => p.setupId === setupId);
    await Promise.all(plans.map((p) => planPredictionRun(p.id)));
    expect((await getPlan(researcher, padId, plan.id)).prediction.status).toBe('done');
    const geometry = { transmitter: helix, receiver: helix, circuit: newCircuit, operatorPoint: [0.3, 0, 0.1] as [number, number, number] };
    for (const point of await listPlanPoints(researcher, padId, plan.id)) {
      const direct = pointPrediction(runSolveJob(pointSolveJob(geometry, point.pose)));
      expect(Math.abs(point.predicted!.loadPower / direct.loadPower - 1)).toBeLessThan(SAME_SOLVE_TOLERANCE);
    }
  });

  it('refuses to delete a setup or coil a plan uses, naming the plan', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const plan = await createPlan(researcher, padId, input('Usage drill', { repeats: 1, axes: [tilt] }));
    await planPredictionRun(plan.id);
    await expect(deleteSetup(researcher, padId, setupId)).rejects.toMatchObject({ status: 409, message: expect.stringContaining('sweep plan “Usage drill”') });
    await expect(deleteCoil(researcher, padId, txId)).rejects.toMatchObject({ status: 409, message: expect.stringContaining('sweep plan “Usage drill”') });
    await deletePlan(researcher, padId, plan.id);
    expect(await statusOf(() => getPlan(researcher, padId, plan.id))).toBe(404);
  });

  it('a run left "running" by a stopped server reads as failed with its predictions kept', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const plan = await createPlan(researcher, padId, input('Interrupted drill', { repeats: 1, referenceEvery: null, axes: [tilt] }));
    await planPredictionRun(plan.id);
    const before = await listPlanPoints(researcher, padId, plan.id);
    // What a server killed mid-run leaves behind: running, with a run id nobody computes.
    await db('sweep_plans').where({ id: plan.id }).update({ prediction_status: 'running', prediction_run_id: '00000000-0000-4000-8000-000000000000' });
    const progress = await getPlanProgress(researcher, padId, plan.id);
    expect(progress).toMatchObject({ status: 'failed', error: expect.stringContaining('interrupted') });
    expect(await listPlanPoints(researcher, padId, plan.id)).toEqual(before);
    await deletePlan(researcher, padId, plan.id);
  });
});
