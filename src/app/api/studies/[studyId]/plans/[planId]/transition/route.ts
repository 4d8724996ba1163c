import { requireUser } from '@/lib/auth/session';
import { transitionPlan } from '@/lib/data/plans';
import { parseJsonBody, route } from '@/lib/http/respond';
import { planTransitionSchema } from '@/lib/validations/plan';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** Moves the plan to `to` (409 if the states do not allow it, 403 if the role may not). */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, planTransitionSchema);
  return Response.json({ plan: await transitionPlan(user, studyId, planId, input) });
});
