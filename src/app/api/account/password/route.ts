import { requireSession } from '@/lib/auth/session';
import { clientAddress } from '@/lib/auth/sign-in-limiter';
import { changeOwnPassword } from '@/lib/data/users';
import { parseJsonBody, route } from '@/lib/http/respond';
import { passwordChangeSchema } from '@/lib/validations/account';

export const dynamic = 'force-dynamic';

/**
 * The signed-in person changes their own password. Their other sessions end; this one keeps working.
 * A wrong current password is 422 on `currentPassword` and counts as a failed sign-in (429 once paused).
 */
export const POST = route(async (request: Request) => {
  const { user, sessionId } = await requireSession();
  const input = await parseJsonBody(request, passwordChangeSchema);
  return Response.json(await changeOwnPassword(user, sessionId, input, clientAddress(request.headers)));
});
