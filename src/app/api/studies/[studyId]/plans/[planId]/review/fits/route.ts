import { requireUser } from '@/lib/auth/session';
import { runFit } from '@/lib/data/plan-fits';
import { parseJsonBody, route } from '@/lib/http/respond';
import { fitRequestSchema } from '@/lib/validations/review';
import { planIds, type PlanContext } from '../../ids';

export const dynamic = 'force-dynamic';

/** Fits one effective parameter to the measured means by least squares; stored apart from the prediction (201). */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, fitRequestSchema);
  return Response.json(await runFit(user, studyId, planId, input), { status: 201 });
});
