import 'server-only';
import { getServerSession } from 'next-auth';
import { cache } from 'react';
import { unauthorized } from '../http/errors';
import { authOptions } from './options';
import type { SessionUser } from './session-user';
import { findActiveSessionUser } from './sessions';

export interface CurrentSession {
  user: SessionUser;
  /** The user_sessions row this request's cookie names. */
  sessionId: string;
}

/**
 * This request's session, checked against MariaDB on every request: a cookie whose session was signed
 * out, ended by a password change elsewhere, idled out, or whose account was disabled counts as signed
 * out, however valid its signature. A cookie from before sessions had records (no sid) counts as signed
 * out too. Cached per request.
 */
const getCurrentSession = cache(async (): Promise<CurrentSession | null> => {
  const session = await getServerSession(authOptions);
  const id = Number(session?.user?.id);
  const sessionId = session?.sid;
  if (!session || !Number.isInteger(id) || id <= 0 || typeof sessionId !== 'string' || sessionId === '') return null;
  const user = await findActiveSessionUser(id, sessionId);
  return user ? { user, sessionId } : null;
});

/** The signed-in user for this request, or null. */
export const getSessionUser = cache(async (): Promise<SessionUser | null> => (await getCurrentSession())?.user ?? null);

/** The signed-in user, or a 401. */
export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) throw unauthorized();
  return user;
}

/** The signed-in user with their session's id (for acts on the session itself), or a 401. */
export async function requireSession(): Promise<CurrentSession> {
  const current = await getCurrentSession();
  if (!current) throw unauthorized();
  return current;
}
