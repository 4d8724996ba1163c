import { requireUser } from '@/lib/auth/session';
import { getPlanReview } from '@/lib/data/review';
import { route } from '@/lib/http/respond';
import { reviewQuerySchema } from '@/lib/validations/review';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** Predicted against measured for one quantity (?quantity=coupling|mutualInductance|efficiency). */
export const GET = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const { quantity } = reviewQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return Response.json(await getPlanReview(user, studyId, planId, quantity));
});
