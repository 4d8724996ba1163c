import { requireUser } from '@/lib/auth/session';
import { revokeInvitation } from '@/lib/data/invitations';
import { idParam, route } from '@/lib/http/respond';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string; invitationId: string }> };

/** Withdraws a pending invitation. */
export const DELETE = route(async (_request: Request, { params }: Context) => {
  const { studyId: rawStudyId, invitationId: rawInvitationId } = await params;
  const studyId = idParam(rawStudyId);
  const invitationId = idParam(rawInvitationId);
  const user = await requireUser();
  await revokeInvitation(user, studyId, invitationId);
  return new Response(null, { status: 204 });
});
