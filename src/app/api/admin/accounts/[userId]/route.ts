import { requireUser } from '@/lib/auth/session';
import { updateAccount } from '@/lib/data/accounts';
import { idParam, parseJsonBody, route } from '@/lib/http/respond';
import { accountUpdateSchema } from '@/lib/validations/account';

export const dynamic = 'force-dynamic';

type Context = { params: Promise<{ userId: string }> };

export const PATCH = route(async (request: Request, { params }: Context) => {
  const userId = idParam((await params).userId);
  const user = await requireUser();
  const input = await parseJsonBody(request, accountUpdateSchema);
  return Response.json({ account: await updateAccount(user, userId, input) });
});
