import { requireUser } from '@/lib/auth/session';
import { recomputePredictions } from '@/lib/data/plans';
import { route } from '@/lib/http/respond';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** Recomputes the predictions on the same points; 202 with the progress to poll. */
export const POST = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json(await recomputePredictions(user, studyId, planId), { status: 202 });
});
