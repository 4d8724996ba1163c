import { requireUser } from '@/lib/auth/session';
import { deleteCoil, getCoil, updateCoil } from '@/lib/data/coils';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { coilUpdateSchema } from '@/lib/validations/coil';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string; coilId: string }> };

async function ids(params: Context['params']) {
  const { studyId, coilId } = await params;
  return { studyId: idParam(studyId), coilId: idParam(coilId) };
}

export const GET = route(async (_request: Request, { params }: Context) => {
  const { studyId, coilId } = await ids(params);
  const user = await requireUser();
  return Response.json({ coil: await getCoil(user, studyId, coilId) });
});

/** Changes a coil; spec and measured values are replaced whole. */
export const PATCH = route(async (request: Request, { params }: Context) => {
  const { studyId, coilId } = await ids(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, coilUpdateSchema);
  return Response.json({ coil: await updateCoil(user, studyId, coilId, input) });
});

/** Deletes a coil; 409 naming every setup that still uses it. */
export const DELETE = route(async (_request: Request, { params }: Context) => {
  const { studyId, coilId } = await ids(params);
  const user = await requireUser();
  await deleteCoil(user, studyId, coilId);
  return new Response(null, { status: 204 });
});
