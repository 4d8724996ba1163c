import { requireUser } from '@/lib/auth/session';
import { setReviewTolerance } from '@/lib/data/review-analysis';
import { parseJsonBody, route } from '@/lib/http/respond';
import { reviewToleranceSchema } from '@/lib/validations/review';
import { planIds, type PlanContext } from '../../ids';

export const dynamic = 'force-dynamic';

/** Sets the tolerance the review's summary counts against (a fraction). */
export const PUT = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const { tolerance } = await parseJsonBody(request, reviewToleranceSchema);
  return Response.json(await setReviewTolerance(user, studyId, planId, tolerance));
});
