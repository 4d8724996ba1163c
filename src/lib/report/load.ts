import 'server-only';
import type { SessionUser } from '../auth/session-user';
import { getCoil } from '../data/coils';
import { listPlanComments } from '../data/comments';
import { listPlanPoints } from '../data/plan-points';
import { getPlan } from '../data/plans';
import { listReadings } from '../data/readings';
import { getPlanReview } from '../data/review';
import { getSetup } from '../data/setups';
import { getStudy } from '../data/studies';
import { REVIEW_QUANTITIES, type PlanReview, type ReviewQuantity } from '../review/types';
import type { PlanReport } from './types';

/**
 * Gathers a plan's report for anyone who can see the study. Each data function checks access itself,
 * so a non-member gets the study's 404 from the first call and nothing else is read.
 */
export async function loadPlanReport(viewer: SessionUser, studyId: number, planId: number): Promise<PlanReport> {
  const study = await getStudy(viewer, studyId);
  const plan = await getPlan(viewer, studyId, planId);
  const setup = await getSetup(viewer, studyId, plan.setupId);
  const [transmitter, receiver, points, readings, comments, ...reviewList] = await Promise.all([
    getCoil(viewer, studyId, setup.transmitterCoilId),
    getCoil(viewer, studyId, setup.receiverCoilId),
    listPlanPoints(viewer, studyId, planId),
    listReadings(viewer, studyId, planId),
    listPlanComments(viewer, studyId, planId),
    ...REVIEW_QUANTITIES.map((quantity) => getPlanReview(viewer, studyId, planId, quantity)),
  ]);
  const reviews = Object.fromEntries(REVIEW_QUANTITIES.map((q, i) => [q, reviewList[i]])) as Record<ReviewQuantity, PlanReview>;
  return {
    generatedAt: new Date().toISOString(),
    study: { id: study.id, name: study.name },
    plan,
    setup,
    transmitter,
    receiver,
    points,
    reviews,
    comments,
    readings,
  };
}
