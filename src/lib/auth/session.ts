import 'server-only';
import { decode } from 'next-auth/jwt';
import { cookies } from 'next/headers';
import { cache } from 'react';
import { unauthorized } from '../http/errors';
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
  const token = await sessionToken();
  const id = Number(token?.uid);
  const sessionId = token?.sid;
  if (!token || !Number.isInteger(id) || id <= 0 || typeof sessionId !== 'string' || sessionId === '') return null;
  const user = await findActiveSessionUser(id, sessionId);
  return user ? { user, sessionId } : null;
});

/**
 * The session cookie's name, as next-auth sets it: with the __Secure- prefix when the app is served
 * over https (its useSecureCookies default).
 */
function sessionCookieName(): string {
  return process.env.NEXTAUTH_URL?.startsWith('https://') ? '__Secure-next-auth.session-token' : 'next-auth.session-token';
}

/**
 * The claims of this request's session cookie, checked (signature, encryption, expiry) by next-auth's
 * own decoder; null when absent or not valid. This is what next-auth's getServerSession reads, without
 * the rest of its session handler: in a server component or route handler it re-encodes a fresh
 * cookie and a CSRF token that it cannot send, work that cost every request here. A cookie too long
 * for one header is split by next-auth into "<name>.0", "<name>.1", …, joined again in order.
 */
async function sessionToken(): Promise<{ uid?: unknown; sid?: unknown } | null> {
  const jar = await cookies();
  const name = sessionCookieName();
  let value = jar.get(name)?.value;
  if (!value) {
    const chunks = jar.getAll().filter((c) => c.name.startsWith(`${name}.`) && /^\d+$/.test(c.name.slice(name.length + 1)));
    value = chunks.sort((a, b) => Number(a.name.slice(name.length + 1)) - Number(b.name.slice(name.length + 1))).map((c) => c.value).join('');
  }
  if (!value) return null;
  const secret = process.env.NEXTAUTH_SECRET;
  if (!secret) throw new Error('NEXTAUTH_SECRET is not set');
  try {
    return await decode({ token: value, secret });
  } catch {
    return null; // tampered, expired, or signed with another secret: nobody is signed in
  }
}

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
