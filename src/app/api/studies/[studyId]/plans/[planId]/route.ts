import { requireUser } from '@/lib/auth/session';
import { deletePlan, getPlan, updatePlan } from '@/lib/data/plans';
import { parseJsonBody, route } from '@/lib/http/respond';
import { planUpdateSchema } from '@/lib/validations/plan';
import { planIds, type PlanContext } from './ids';

export const dynamic = 'force-dynamic';

export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json({ plan: await getPlan(user, studyId, planId) });
});

/** Changes a draft (any subset of its fields); 409 once it has left draft. */
export const PATCH = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, planUpdateSchema);
  return Response.json({ plan: await updatePlan(user, studyId, planId, input) });
});

export const DELETE = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  await deletePlan(user, studyId, planId);
  return new Response(null, { status: 204 });
});
