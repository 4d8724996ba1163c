import { requireUser } from '@/lib/auth/session';
import { listStudyHistory } from '@/lib/data/audit-trail';
import { idParam, route } from '@/lib/http/respond';
import { historyQuerySchema } from '@/lib/validations/history';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string }> };

/** A page of the study's history, newest first: ?before=&limit=&planId=&actorId=&category= */
export const GET = route(async (request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  const query = historyQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return Response.json(await listStudyHistory(user, studyId, query));
});
