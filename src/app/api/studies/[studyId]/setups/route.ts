import { requireUser } from '@/lib/auth/session';
import { createSetup, listSetups } from '@/lib/data/setups';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { setupCreateSchema } from '@/lib/validations/setup';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string }> };

/** The study's saved setups. */
export const GET = route(async (_request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  return Response.json({ setups: await listSetups(user, studyId) });
});

/** Saves a setup: two of the study's coils, a placement and a circuit (SI units); 422 if it cannot be solved. */
export const POST = route(async (request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  const input = await parseJsonBody(request, setupCreateSchema);
  return Response.json({ setup: await createSetup(user, studyId, input) }, { status: 201 });
});
