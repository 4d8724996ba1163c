import { requireUser } from '@/lib/auth/session';
import { deleteSetup, getSetup, updateSetup } from '@/lib/data/setups';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { setupUpdateSchema } from '@/lib/validations/setup';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string; setupId: string }> };

async function ids(params: Context['params']) {
  const { studyId, setupId } = await params;
  return { studyId: idParam(studyId), setupId: idParam(setupId) };
}

export const GET = route(async (_request: Request, { params }: Context) => {
  const { studyId, setupId } = await ids(params);
  const user = await requireUser();
  return Response.json({ setup: await getSetup(user, studyId, setupId) });
});

/** Changes a setup; placement, circuit, operatorPoint and view are replaced whole. */
export const PATCH = route(async (request: Request, { params }: Context) => {
  const { studyId, setupId } = await ids(params);
  const user = await requireUser();
  const input = await parseJsonBody(request, setupUpdateSchema);
  return Response.json({ setup: await updateSetup(user, studyId, setupId, input) });
});

export const DELETE = route(async (_request: Request, { params }: Context) => {
  const { studyId, setupId } = await ids(params);
  const user = await requireUser();
  await deleteSetup(user, studyId, setupId);
  return new Response(null, { status: 204 });
});
