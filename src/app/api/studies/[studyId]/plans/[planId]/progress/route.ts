import { requireUser } from '@/lib/auth/session';
import { getPlanProgress } from '@/lib/data/plans';
import { route } from '@/lib/http/respond';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** { status, done, total, error, solverVersion } of the plan's predictions, for polling. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json(await getPlanProgress(user, studyId, planId));
});
