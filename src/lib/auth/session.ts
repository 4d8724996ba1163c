import 'server-only';
import { getServerSession } from 'next-auth';
import { cache } from 'react';
import { findActiveSessionUser } from '../data/users';
import { unauthorized } from '../http/errors';
import { authOptions } from './options';
import type { SessionUser } from './session-user';

/**
 * The signed-in user for this request, checked against MariaDB on every request: a disabled account
 * or a session ended by a password change is treated as signed out. Cached per request.
 */
export const getSessionUser = cache(async (): Promise<SessionUser | null> => {
  const session = await getServerSession(authOptions);
  const id = Number(session?.user?.id);
  if (!session || !Number.isInteger(id) || id <= 0) return null;
  return findActiveSessionUser(id, session.sessionVersion);
});

/** The signed-in user, or a 401. */
export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) throw unauthorized();
  return user;
}
