import { requireUser } from '@/lib/auth/session';
import { unmarkOutlier } from '@/lib/data/review-analysis';
import { idParam, route } from '@/lib/http/respond';
import { planIds } from '../../../ids';

export const dynamic = 'force-dynamic';

type MarkContext = { params: Promise<{ studyId: string; planId: string; pointId: string }> };

/** Brings a set-aside point back into the numbers (204). */
export const DELETE = route(async (_request: Request, { params }: MarkContext) => {
  const { studyId, planId } = await planIds(params);
  const pointId = idParam((await params).pointId);
  const user = await requireUser();
  await unmarkOutlier(user, studyId, planId, pointId);
  return new Response(null, { status: 204 });
});
