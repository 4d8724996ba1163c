import { createPlan } from '../../src/lib/data/plans';
import { listPlanPoints, type PlanPoint } from '../../src/lib/data/plan-points';
import { planPredictionRun } from '../../src/lib/data/plan-predictions';
import { planCreateSchema, type PlanCreateInput } from '../../src/lib/validations/plan';
import { db, SEEDED, sessionUserByEmail, studyIdByName } from './database';

/** The demo lab's seeded setup (database/seeds/01_demo_lab.ts), at 6.78 MHz. */
export const SEEDED_SETUP = 'Probe 10 cm deep, upright';

/**
 * A draft plan of a test's own on the seeded pad study's setup, created by the researcher and fully
 * predicted (the caller sets the solver pool with setPlanSolverPool), with its points.
 */
export async function createPredictedPlan(design: Omit<PlanCreateInput, 'setupId' | 'minutesPerPoint'> & Partial<PlanCreateInput>): Promise<{ padId: number; planId: number; points: PlanPoint[] }> {
  const researcher = await sessionUserByEmail(SEEDED.researcher);
  const padId = await studyIdByName(SEEDED.padStudy);
  const setup = await db('setups').where({ study_id: padId, name: SEEDED_SETUP }).first('id');
  const plan = await createPlan(researcher, padId, planCreateSchema.parse({ setupId: setup.id, minutesPerPoint: 2, ...design }));
  await planPredictionRun(plan.id);
  return { padId, planId: plan.id, points: await listPlanPoints(researcher, padId, plan.id) };
}
