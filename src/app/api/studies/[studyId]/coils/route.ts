import { requireUser } from '@/lib/auth/session';
import { createCoil, listCoils } from '@/lib/data/coils';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { coilCreateSchema } from '@/lib/validations/coil';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string }> };

/** The study's coil library, each coil with its predicted L, Rdc and Rac at the study frequency. */
export const GET = route(async (_request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  return Response.json({ coils: await listCoils(user, studyId) });
});

/** Adds a coil (SI units) to the library. */
export const POST = route(async (request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  const input = await parseJsonBody(request, coilCreateSchema);
  return Response.json({ coil: await createCoil(user, studyId, input) }, { status: 201 });
});
