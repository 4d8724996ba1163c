import { createPlanComment, listPlanComments } from '../../../src/lib/data/comments';
import { runFit } from '../../../src/lib/data/plan-fits';
import { recomputePredictions, transitionPlan } from '../../../src/lib/data/plans';
import { beginRunsForSetups, loadGeometry, setPlanSolverPool } from '../../../src/lib/data/plan-predictions';
import type { PlanPoint } from '../../../src/lib/data/plan-points';
import { getPlanReview } from '../../../src/lib/data/review';
import { deliverPending } from '../../../src/lib/mail/outbox';
import { markOutlier, setReviewTolerance, unmarkOutlier } from '../../../src/lib/data/review-analysis';
import { acknowledgeCautions, createReading } from '../../../src/lib/data/readings';
import { pointPrediction, pointSolveJob } from '../../../src/lib/plans/solve-job';
import { BENCH_CAUTIONS_VERSION } from '../../../src/lib/readings/bench-cautions';
import { createSourceWorker } from '../../../src/lib/solver-pool/source-worker';
import { runSolveJob } from '../../../src/lib/solver-pool/job';
import { SolverPool } from '../../../src/lib/solver-pool/solver-pool';
import { readingCreateSchema } from '../../../src/lib/validations/reading';
import { db, SEEDED, sessionUserByEmail, statusOf } from '../../support/database';
import { appLinkIn, messagesTo } from '../../support/inbox';
import { createPredictedPlan } from '../../support/predicted-plan';

/**
 * The review of a plan measured on a synthetic bench whose answer is known: open-circuit readings made
 * from the solver's own M at every planned tilt plus TILT_ERROR_DEG (a jig that leans), rounded to four
 * significant digits as a meter shows them, and one reading 20 % high (a slipped range).
 */
const TILT_ERROR_DEG = 3;
const FREQUENCY_HZ = 6.78e6;
const TX_CURRENT_A = 0.25;
const SLIPPED_SEQ = 5;
const SLIP = 1.2;
/** Four-digit readings move M by up to 5e-5 relative; the tilt that explains them is good to a few hundredths of a degree. */
const TILT_FIT_TOLERANCE_DEG = 0.05;
/** Same formula (M = |V2| / (ω |I1|), Keysight Impedance Measurement Handbook), same doubles. */
const SAME_FORMULA = 1e-9;

describe('plan review: agreement, outliers, fits, comments and decisions', () => {
  let pool: SolverPool;
  let padId: number;
  let planId: number;
  let points: PlanPoint[];

  beforeAll(async () => {
    pool = new SolverPool({ size: 1, queueLimit: 64, timeoutMs: 60_000, createWorker: () => createSourceWorker() });
    setPlanSolverPool(pool);
    ({ padId, planId, points } = await createPredictedPlan({
      name: 'Review drill', repeats: 2, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null, notes: '',
      axes: [{ quantity: 'tiltDeg', displayUnit: 'deg', mode: 'list', values: [0, 15, 30, 45] }],
    }));
    const [researcher, student] = await Promise.all([SEEDED.researcher, SEEDED.student].map(sessionUserByEmail));
    await transitionPlan(researcher, padId, planId, { to: 'on_bench' });
    await acknowledgeCautions(student, padId, planId, BENCH_CAUTIONS_VERSION);
    const geometry = (await loadGeometry(planId))!;
    for (const point of points) {
      const leaning = pointPrediction(runSolveJob(pointSolveJob(geometry, { ...point.pose, tiltDeg: point.pose.tiltDeg + TILT_ERROR_DEG })));
      const slip = point.seq === SLIPPED_SEQ ? SLIP : 1;
      const rxVoltage = Number((2 * Math.PI * FREQUENCY_HZ * Math.abs(leaning.mutualInductance) * TX_CURRENT_A * slip).toPrecision(4));
      await createReading(student, padId, planId, readingCreateSchema.parse({
        pointId: point.id, method: 'open_circuit', raw: { frequency: FREQUENCY_HZ, txCurrent: TX_CURRENT_A, rxVoltage, phaseDeg: 89.5 },
        accuracy: { relative: 0.005, phaseDeg: 1 },
      }));
    }
  });

  afterAll(async () => {
    await db('readings').where({ plan_id: planId }).del();
    await db('sweep_plans').where({ id: planId }).del();
    setPlanSolverPool(null);
    await pool.close();
    await db.destroy();
  });

  it('compares each pose’s mean with its prediction, the relative errors recomputed here from the raw readings', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const review = await getPlanReview(researcher, padId, planId, 'coupling');
    expect(review.poses).toHaveLength(4);
    expect(review.summary).toMatchObject({ compared: 4, observations: 8, tolerance: 0.1, setAside: 0 });
    const raws = await db('readings').join('sweep_points', 'sweep_points.id', 'readings.point_id')
      .where('readings.plan_id', planId).select('sweep_points.id as pointId', 'readings.raw');
    const relatives = review.poses.map((pose) => {
      const first = points.find((p) => p.id === pose.pointIds[0])!.predicted!;
      const ks = raws.filter((r) => pose.pointIds.includes(r.pointId)).map((r) => {
        const raw = typeof r.raw === 'string' ? JSON.parse(r.raw) : r.raw;
        const m = raw.rxVoltage / (2 * Math.PI * raw.frequency * raw.txCurrent);
        return m / Math.sqrt(first.txSelfInductance * first.rxSelfInductance);
      });
      const mean = ks.reduce((a, b) => a + b, 0) / ks.length;
      expect(pose.measured!.mean).toBeCloseTo(mean, 12);
      expect(pose.relative! / ((mean - first.coupling) / first.coupling) - 1).toBeLessThan(SAME_FORMULA);
      return (mean - first.coupling) / first.coupling;
    });
    // rms, signed maximum and mean, by definition
    const rms = Math.sqrt(relatives.reduce((a, r) => a + r * r, 0) / relatives.length);
    expect(review.summary.rmsRelative!).toBeCloseTo(rms, 12);
    expect(review.summary.bias!).toBeCloseTo(relatives.reduce((a, b) => a + b, 0) / relatives.length, 12);
    expect(Math.abs(review.summary.maxRelative!)).toBeCloseTo(Math.max(...relatives.map(Math.abs)), 12);
    // a jig leaning further over lowers k more the more the probe is tilted (the residual trend a reviewer looks for)
    const byTilt = [...review.poses].sort((a, b) => a.pose.tiltDeg - b.pose.tiltDeg).filter((p) => !p.seqs.includes(SLIPPED_SEQ));
    expect(byTilt.at(-1)!.relative!).toBeLessThan(byTilt[0].relative!);
  });

  it('flags the slipped reading by the three-sigma rule and no other', async () => {
    const review = await getPlanReview(await sessionUserByEmail(SEEDED.student), padId, planId, 'coupling');
    const slipped = review.observations.find((o) => o.seq === SLIPPED_SEQ)!;
    expect(slipped.autoOutlier).toBe(true);
    expect(Math.abs(slipped.normalized!)).toBeGreaterThan(3);
    for (const o of review.observations) expect(o.autoOutlier).toBe(Math.abs(o.normalized!) > 3);
  });

  it('sets a point aside by hand and back, for reviewers only', async () => {
    const [supervisor, student] = await Promise.all([SEEDED.supervisor, SEEDED.student].map(sessionUserByEmail));
    const slippedPoint = points.find((p) => p.seq === SLIPPED_SEQ)!;
    expect(await statusOf(() => markOutlier(student, padId, planId, { pointId: slippedPoint.id, reason: 'range' }))).toBe(403);
    const mark = await markOutlier(supervisor, padId, planId, { pointId: slippedPoint.id, reason: 'Scope on the wrong attenuation' });
    expect(mark).toMatchObject({ seq: SLIPPED_SEQ, reason: 'Scope on the wrong attenuation', markedBy: { name: supervisor.name } });
    expect(await statusOf(() => markOutlier(supervisor, padId, planId, { pointId: slippedPoint.id, reason: 'again' }))).toBe(409);
    const review = await getPlanReview(supervisor, padId, planId, 'coupling');
    expect(review.summary).toMatchObject({ setAside: 1, observations: 7 });
    expect(review.observations.find((o) => o.seq === SLIPPED_SEQ)!.setAside).toBe(true);
    await unmarkOutlier(supervisor, padId, planId, slippedPoint.id);
    expect((await getPlanReview(supervisor, padId, planId, 'coupling')).summary.setAside).toBe(0);
    expect(await statusOf(() => unmarkOutlier(supervisor, padId, planId, slippedPoint.id))).toBe(404);
    await markOutlier(supervisor, padId, planId, { pointId: slippedPoint.id, reason: 'Scope on the wrong attenuation' });
  });

  it('recovers the jig’s tilt error by least squares and leaves the prediction alone', async () => {
    const supervisor = await sessionUserByEmail(SEEDED.supervisor);
    const before = await db('sweep_points').where({ plan_id: planId }).orderBy('seq').pluck('predicted');
    const fit = await runFit(supervisor, padId, planId, { model: 'tilt_offset', quantity: 'coupling' });
    expect(Math.abs(fit.value - TILT_ERROR_DEG)).toBeLessThan(TILT_FIT_TOLERANCE_DEG);
    expect(fit.uncertainty).toBeGreaterThan(0);
    expect(fit.posesUsed).toBe(4);
    expect(fit.rmsRelativeAfter!).toBeLessThan(1e-3);
    expect(fit.repredicted).toHaveLength(4);
    expect(await db('sweep_points').where({ plan_id: planId }).orderBy('seq').pluck('predicted')).toEqual(before);
    const review = await getPlanReview(supervisor, padId, planId, 'coupling');
    expect(review.fit?.id).toBe(fit.id);
    expect(review.poses.every((p) => p.refit !== null)).toBe(true);
    expect(review.summary.rmsRelative!).toBeGreaterThan(10 * fit.rmsRelativeAfter!);
  });

  it('refuses a fit that does not explain the quantity, or has nothing to fit', async () => {
    const supervisor = await sessionUserByEmail(SEEDED.supervisor);
    const pathOf = async (action: () => Promise<unknown>) => action().then(() => null, (e) => e.issues?.[0]?.path);
    expect(await pathOf(() => runFit(supervisor, padId, planId, { model: 'extra_rx_resistance', quantity: 'coupling' }))).toBe('model');
    expect(await pathOf(() => runFit(supervisor, padId, planId, { model: 'extra_rx_resistance', quantity: 'efficiency' }))).toBe('quantity');
    const student = await sessionUserByEmail(SEEDED.student);
    expect(await statusOf(() => runFit(student, padId, planId, { model: 'tilt_offset', quantity: 'coupling' }))).toBe(403);
  });

  it('keeps comments on the plan and its points for every member to read', async () => {
    const [student, supervisor, admin, outsider] = await Promise.all([SEEDED.student, SEEDED.supervisor, SEEDED.admin, SEEDED.otherResearcher].map(sessionUserByEmail));
    const onPoint = await createPlanComment(student, padId, planId, { pointId: points[2].id, body: 'Jig scale hard to read here.' });
    expect(onPoint).toMatchObject({ seq: points[2].seq, author: { name: student.name, role: 'student' } });
    await createPlanComment(supervisor, padId, planId, { pointId: null, body: 'Check the jig zero.' });
    const listed = await listPlanComments(admin, padId, planId);
    expect(listed.map((c) => [c.seq, c.author.role])).toEqual([[points[2].seq, 'student'], [null, 'supervisor']]);
    expect(await statusOf(() => createPlanComment(admin, padId, planId, { pointId: null, body: 'x' }))).toBe(403);
    expect(await statusOf(() => listPlanComments(outsider, padId, planId))).toBe(404);
    expect(await statusOf(() => createPlanComment(student, padId, planId, { pointId: 999999999, body: 'x' }))).toBe(422);
  });

  it('returns with a reason and accepts with the supervisor’s name, telling the researcher and student', async () => {
    const [researcher, student, supervisor] = await Promise.all([SEEDED.researcher, SEEDED.student, SEEDED.supervisor].map(sessionUserByEmail));
    await setReviewTolerance(supervisor, padId, planId, 0.05);
    await transitionPlan(student, padId, planId, { to: 'in_review' });
    expect(await statusOf(() => transitionPlan(student, padId, planId, { to: 'accepted' }))).toBe(403);
    const noReason = await transitionPlan(supervisor, padId, planId, { to: 'on_bench' }).catch((e) => e);
    expect(noReason.status).toBe(422);
    expect(noReason.issues[0].path).toBe('reason');
    expect((await db('sweep_plans').where({ id: planId }).first('state')).state).toBe('in_review');

    await transitionPlan(supervisor, padId, planId, { to: 'on_bench', reason: 'Re-zero the tilt jig and repeat 45 degrees.' });
    await deliverPending({ limit: 100 }); // jest runs no outbox dispatcher
    const returned = (await messagesTo(student.email)).find((m) => m.subject.includes('"Review drill" was returned'))!;
    expect(returned.subject).toContain('returned');
    expect(returned.text).toContain('Re-zero the tilt jig');
    expect(appLinkIn(returned, `/studies/${padId}/plans/${planId}/review`)).toBeTruthy();
    expect((await messagesTo(researcher.email)).some((m) => m.subject === returned.subject)).toBe(true);

    await transitionPlan(student, padId, planId, { to: 'in_review' });
    await transitionPlan(supervisor, padId, planId, { to: 'accepted' });
    const { decisions } = await getPlanReview(researcher, padId, planId, 'coupling');
    expect(decisions.map((d) => [d.decision, d.reviewer.name])).toEqual([['returned', supervisor.name], ['accepted', supervisor.name]]);
    expect(decisions[0].reason).toBe('Re-zero the tilt jig and repeat 45 degrees.');
    expect(decisions[1].summary).toMatchObject({ tolerance: 0.05, setAside: 1 });
    // an accepted plan's review is closed
    expect(await statusOf(() => setReviewTolerance(supervisor, padId, planId, 0.1))).toBe(409);
    expect(await statusOf(() => runFit(supervisor, padId, planId, { model: 'tilt_offset', quantity: 'coupling' }))).toBe(409);
    // and keeps the predictions it was accepted against: no recompute, by hand or after a setup change
    expect(await statusOf(() => recomputePredictions(researcher, padId, planId))).toBe(409);
    const setupId = (await db('sweep_plans').where({ id: planId }).first('setup_id')).setup_id;
    // which plans a change to its setup would recompute, in a transaction thrown away afterwards
    class Undo extends Error { constructor(readonly planIds: number[]) { super('undo'); } }
    const rerun = await db.transaction(async (trx) => {
      throw new Undo((await beginRunsForSetups(trx, [setupId])).map((b) => b.planId));
    }).catch((e) => (e instanceof Undo ? e.planIds : Promise.reject(e)));
    expect(rerun.length).toBeGreaterThan(0);
    expect(rerun).not.toContain(planId);
    expect(await statusOf(() => unmarkOutlier(supervisor, padId, planId, points.find((p) => p.seq === SLIPPED_SEQ)!.id))).toBe(409);
  });
});
