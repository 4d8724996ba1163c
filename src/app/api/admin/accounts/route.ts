import { requireUser } from '@/lib/auth/session';
import { createAccount, listAccounts } from '@/lib/data/accounts';
import { parseJsonBody, route } from '@/lib/http/respond';
import { accountCreateSchema } from '@/lib/validations/account';

export const dynamic = 'force-dynamic';

export const GET = route(async () => {
  const user = await requireUser();
  return Response.json({ accounts: await listAccounts(user) });
});

export const POST = route(async (request: Request) => {
  const user = await requireUser();
  const input = await parseJsonBody(request, accountCreateSchema);
  return Response.json({ account: await createAccount(user, input) }, { status: 201 });
});
