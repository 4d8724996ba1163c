import { requireUser } from '@/lib/auth/session';
import { markOutlier } from '@/lib/data/review-analysis';
import { parseJsonBody, route } from '@/lib/http/respond';
import { outlierMarkSchema } from '@/lib/validations/review';
import { planIds, type PlanContext } from '../../ids';

export const dynamic = 'force-dynamic';

/** Sets a point aside as an outlier, with a reason (201). */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, outlierMarkSchema);
  return Response.json(await markOutlier(user, studyId, planId, input), { status: 201 });
});
