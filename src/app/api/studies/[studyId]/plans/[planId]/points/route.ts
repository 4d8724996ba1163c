import { requireUser } from '@/lib/auth/session';
import { listPlanPoints } from '@/lib/data/plan-points';
import { route } from '@/lib/http/respond';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** The plan's points in measurement order with pose and predicted values (SI). */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json({ points: await listPlanPoints(user, studyId, planId) });
});
