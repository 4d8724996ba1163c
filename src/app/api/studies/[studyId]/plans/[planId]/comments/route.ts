import { requireUser } from '@/lib/auth/session';
import { createPlanComment, listPlanComments } from '@/lib/data/comments';
import { parseJsonBody, route } from '@/lib/http/respond';
import { commentCreateSchema } from '@/lib/validations/review';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** The plan's comments, oldest first. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json(await listPlanComments(user, studyId, planId));
});

/** A comment on the plan (pointId null) or on one of its points (201). */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, commentCreateSchema);
  return Response.json(await createPlanComment(user, studyId, planId, input), { status: 201 });
});
