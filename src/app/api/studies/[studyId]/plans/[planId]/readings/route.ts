import { requireUser } from '@/lib/auth/session';
import { createReading, listReadings } from '@/lib/data/readings';
import { parseJsonBody, route } from '@/lib/http/respond';
import { readingCreateSchema } from '@/lib/validations/reading';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** Every version of every reading on the plan, with the server's derivations. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return Response.json({ readings: await listReadings(user, studyId, planId) });
});

/** Logs the first reading of a point by a method (201); a second one is a correction. */
export const POST = route(async (request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, readingCreateSchema);
  return Response.json({ reading: await createReading(user, studyId, planId, input) }, { status: 201 });
});
