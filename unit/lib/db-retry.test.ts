import { createPlan } from '../../src/lib/data/plans';
import { planPredictionRun, setPlanSolverPool } from '../../src/lib/data/plan-predictions';
import { isDeadlock, retryOnDeadlock } from '../../src/lib/db-retry';
import { runSolveJob } from '../../src/lib/solver-pool/job';
import { planCreateSchema } from '../../src/lib/validations/plan';
import { db, SEEDED, sessionUserByEmail, studyIdByName } from '../support/database';
import { SEEDED_SETUP } from '../support/predicted-plan';

/**
 * Deadlocks are real here: two transactions lock the same two rows in opposite orders, and InnoDB
 * rolls one back with ER_LOCK_DEADLOCK (1213). The rolled-back one is meant to be run again (MariaDB
 * manual, "Deadlocks": common practice).
 */
const KEYS = ['deadlock-test-a', 'deadlock-test-b'];
const HOLD_MS = 150;

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

/** Updates `first`, waits so the other transaction can take `second`, then updates `second`. */
const crosswise = (first: string, second: string) => () =>
  db.transaction(async (trx) => {
    await trx('sign_in_limits').where({ key: first }).increment('points', 1);
    await pause(HOLD_MS);
    await trx('sign_in_limits').where({ key: second }).increment('points', 1);
  });

describe('retrying deadlocked transactions', () => {
  beforeEach(async () => {
    await db('sign_in_limits').whereIn('key', KEYS).del();
    await db('sign_in_limits').insert(KEYS.map((key) => ({ key, points: 0, expire: null })));
  });

  afterAll(async () => {
    await db('sign_in_limits').whereIn('key', KEYS).del();
    setPlanSolverPool(null);
    await db.destroy();
  });

  it('without a retry, one of two crosswise transactions is rolled back as a deadlock', async () => {
    const results = await Promise.allSettled([crosswise(KEYS[0], KEYS[1])(), crosswise(KEYS[1], KEYS[0])()]);
    const failures = results.filter((r): r is PromiseRejectedResult => r.status === 'rejected');
    expect(failures).toHaveLength(1);
    expect(isDeadlock(failures[0].reason)).toBe(true);
  });

  it('with the retry both complete and every increment lands once', async () => {
    await Promise.all([retryOnDeadlock(crosswise(KEYS[0], KEYS[1])), retryOnDeadlock(crosswise(KEYS[1], KEYS[0]))]);
    const points = await db('sign_in_limits').whereIn('key', KEYS).orderBy('key').pluck('points');
    expect(points).toEqual([2, 2]);
  });

  it('twelve plans created at once in one study all succeed', async () => {
    setPlanSolverPool({ solve: async (job) => runSolveJob(job) });
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const padId = await studyIdByName(SEEDED.padStudy);
    const setup = await db('setups').where({ study_id: padId, name: SEEDED_SETUP }).first('id');
    const tag = `Concurrent ${Date.now()}`;
    const created = await Promise.all(Array.from({ length: 12 }, (_, i) => createPlan(researcher, padId, planCreateSchema.parse({
      name: `${tag} ${i}`, setupId: setup.id, minutesPerPoint: 1, repeats: 1, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null, notes: '',
      axes: [{ quantity: 'tiltDeg', displayUnit: 'deg', mode: 'list', values: [0, 30] }],
    }))));
    expect(created.map((p) => p.pointCount)).toEqual(Array(12).fill(2));
    await Promise.all(created.map((p) => planPredictionRun(p.id)));
    await db('sweep_plans').whereIn('id', created.map((p) => p.id)).del();
  });
});
