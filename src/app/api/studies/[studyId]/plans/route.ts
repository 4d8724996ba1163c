import { requireUser } from '@/lib/auth/session';
import { createPlan, listPlans } from '@/lib/data/plans';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { planCreateSchema } from '@/lib/validations/plan';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string }> };

/** The study's sweep plans with point counts, states and prediction status. */
export const GET = route(async (_request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  return Response.json({ plans: await listPlans(user, studyId) });
});

/** Creates a draft plan (axes in SI); its predictions start computing in the background. */
export const POST = route(async (request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  const input = await parseJsonBody(request, planCreateSchema);
  return Response.json({ plan: await createPlan(user, studyId, input) }, { status: 201 });
});
