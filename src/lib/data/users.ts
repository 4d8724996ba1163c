import 'server-only';
import { db } from '../db';
import { hashPassword, verifyPassword } from '../auth/password';
import type { SiteRole } from '../auth/permissions';
import type { SessionUser } from '../auth/session-user';
import { endUserSessions } from '../auth/sessions';
import { assertSignInAllowed, clearSignInFailures, recordSignInFailure, SignInThrottledError } from '../auth/sign-in-limiter';
import { conflict, HttpError, notFound, unprocessable } from '../http/errors';
import { recordAudit } from './audit';

interface UserRow {
  id: number;
  email: string;
  name: string;
  site_role: SiteRole;
  password_hash: string;
  disabled_at: Date | null;
}

export interface SignInCandidate extends SessionUser {
  passwordHash: string;
  disabled: boolean;
}

/** The account behind an e-mail address, with what sign-in needs to check it. */
export async function findUserForSignIn(email: string): Promise<SignInCandidate | null> {
  const row = await db<UserRow>('users').where({ email }).first();
  if (!row) return null;
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    siteRole: row.site_role,
    passwordHash: row.password_hash,
    disabled: row.disabled_at !== null,
  };
}

export async function userExistsWithEmail(email: string): Promise<boolean> {
  const row = await db('users').where({ email }).first('id');
  return Boolean(row);
}

/** A paused account or address answers 429 with the wait, like the sign-in form says it. */
function throttled(error: SignInThrottledError): HttpError {
  return new HttpError(429, error.message, [], { 'Retry-After': String(error.retryAfterSeconds) });
}

async function withThrottleAsHttp<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (error) {
    if (error instanceof SignInThrottledError) throw throttled(error);
    throw error;
  }
}

/**
 * The signed-in person changes their own password. The current password must be given: a session
 * left open on a shared bench computer must not be enough to take the account over. Wrong guesses
 * count against the same limit as sign-in guesses (it is the same secret being guessed).
 *
 * Every other session of the account ends; the session that made the change (`sessionId`) keeps
 * working, so the person is not signed out in the middle of what they were doing. Returns how many
 * sessions were ended.
 */
export async function changeOwnPassword(
  actor: SessionUser,
  sessionId: string,
  input: { currentPassword: string; newPassword: string },
  clientAddress: string | null,
): Promise<{ otherSessionsEnded: number }> {
  await withThrottleAsHttp(() => assertSignInAllowed(actor.email, clientAddress));
  const row = await db<UserRow>('users').where({ id: actor.id }).first('id', 'password_hash');
  if (!row) throw notFound('No such account.');
  if (!(await verifyPassword(input.currentPassword, row.password_hash))) {
    await withThrottleAsHttp(() => recordSignInFailure(actor.email, clientAddress));
    throw unprocessable('Your current password is not right.', [{ path: 'currentPassword', message: 'This is not your current password.' }]);
  }
  await clearSignInFailures(actor.email);

  const newHash = await hashPassword(input.newPassword);
  const otherSessionsEnded = await db.transaction(async (trx) => {
    // bcrypt ran outside the transaction; a change that landed meanwhile wins, and this one asks again.
    const locked = await trx('users').where({ id: actor.id }).forUpdate().first('password_hash');
    if (!locked || locked.password_hash !== row.password_hash) {
      throw conflict('Your password was changed meanwhile. Try again with the new one as the current password.', [{ path: 'currentPassword', message: 'Changed meanwhile.' }]);
    }
    await trx('users').where({ id: actor.id }).update({ password_hash: newHash, updated_at: new Date() });
    const ended = await endUserSessions(trx, actor.id, { except: sessionId });
    await recordAudit(trx, {
      actorId: actor.id,
      action: 'account.update',
      targetTable: 'users',
      targetId: actor.id,
      details: { password: 'changed', otherSessionsEnded: ended },
    });
    return ended;
  });
  return { otherSessionsEnded };
}
