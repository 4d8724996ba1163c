import { requireUser } from '@/lib/auth/session';
import { createInvitation, listPendingInvitations } from '@/lib/data/invitations';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { invitationCreateSchema } from '@/lib/validations/study';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ studyId: string }> };

export const GET = route(async (_request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  return Response.json({ invitations: await listPendingInvitations(user, studyId) });
});

/** Invites an e-mail address to the study with a role; the invitee gets a single-use link. */
export const POST = route(async (request: Request, { params }: Context) => {
  const studyId = idParam((await params).studyId);
  const user = await requireUser();
  const input = await parseJsonBody(request, invitationCreateSchema);
  return Response.json({ invitation: await createInvitation(user, studyId, input) }, { status: 201 });
});
