import { requireUser } from '@/lib/auth/session';
import { createReadingFromTouchstone } from '@/lib/data/readings-from-touchstone';
import { parseJsonBody, route } from '@/lib/http/respond';
import { readingFromFileSchema } from '@/lib/validations/reading';
import { planIds, type PlanContext } from '../../ids';

export const dynamic = 'force-dynamic';

/** Logs a two-port reading from a Touchstone file attached to the plan (201). */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, readingFromFileSchema);
  return Response.json({ reading: await createReadingFromTouchstone(user, studyId, planId, input) }, { status: 201 });
});
