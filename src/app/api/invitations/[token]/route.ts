import { viewInvitation } from '@/lib/data/invitations';
import { route } from '@/lib/http/respond';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ token: string }> };

/** What an invitation link is for and whether it can still be used (the token is the credential). */
export const GET = route(async (_request: Request, { params }: Context) => {
  const { token } = await params;
  return Response.json({ invitation: await viewInvitation(token) });
});
