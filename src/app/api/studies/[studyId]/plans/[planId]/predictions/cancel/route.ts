import { requireUser } from '@/lib/auth/session';
import { cancelPredictions } from '@/lib/data/plans';
import { route } from '@/lib/http/respond';
import { planIds, type PlanContext } from '../../ids';

export const dynamic = 'force-dynamic';

/** Stops the running computation at its next batch (the earlier predictions stay); 409 when none runs. */
export const POST = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json(await cancelPredictions(user, studyId, planId));
});
