import { requireUser } from '@/lib/auth/session';
import { createStudy, listStudiesFor } from '@/lib/data/studies';
import { parseJsonBody, route } from '@/lib/http/respond';
import { studyCreateSchema } from '@/lib/validations/study';

export const dynamic = 'force-dynamic';

/** The signed-in user's studies with their role on each. */
export const GET = route(async () => {
  const user = await requireUser();
  return Response.json({ studies: await listStudiesFor(user) });
});

/** Starts a study (researcher accounts and admins). */
export const POST = route(async (request: Request) => {
  const user = await requireUser();
  const input = await parseJsonBody(request, studyCreateSchema);
  return Response.json({ study: await createStudy(user, input) }, { status: 201 });
});
