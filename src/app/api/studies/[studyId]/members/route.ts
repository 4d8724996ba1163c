import { requireUser } from '@/lib/auth/session';
import { listMembers } from '@/lib/data/members';
import { idParam, route } from '@/lib/http/respond';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string }> };

export const GET = route(async (_request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  return Response.json({ members: await listMembers(user, studyId) });
});
