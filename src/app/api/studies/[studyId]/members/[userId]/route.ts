import { requireUser } from '@/lib/auth/session';
import { changeMemberRole } from '@/lib/data/members';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { memberRoleUpdateSchema } from '@/lib/validations/study';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string; userId: string }> };

/** Changes a member's role on the study. */
export const PATCH = route(async (request: Request, { params }: Context) => {
  const { studyId: rawStudyId, userId: rawUserId } = await params;
  const studyId = idParam(rawStudyId);
  const userId = idParam(rawUserId);
  const user = await requireUser();
  const { role } = await parseJsonBody(request, memberRoleUpdateSchema);
  return Response.json({ members: await changeMemberRole(user, studyId, userId, role) });
});
