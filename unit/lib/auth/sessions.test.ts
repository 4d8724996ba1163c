import type { JWT } from 'next-auth/jwt';
import { verifyPassword } from '../../../src/lib/auth/password';
import { authOptions } from '../../../src/lib/auth/options';
import type { SessionUser } from '../../../src/lib/auth/session-user';
import { endSession, endUserSessions, findActiveSessionUser, SESSION_MAX_AGE_SECONDS, startSession } from '../../../src/lib/auth/sessions';
import { createAccount, updateAccount } from '../../../src/lib/data/accounts';
import { changeOwnPassword, findUserForSignIn } from '../../../src/lib/data/users';
import { passwordChangeSchema } from '../../../src/lib/validations/account';
import { db, SEEDED, sessionUserByEmail, statusOf } from '../../support/database';

const TAG = Date.now().toString(36);
const FIRST_PASSWORD = 'first bench password 1';
const SECOND_PASSWORD = 'second bench password 2';

/** A throwaway member account, so no demo account's password or sessions change. */
async function throwaway(label: string): Promise<SessionUser> {
  const admin = await sessionUserByEmail(SEEDED.admin);
  const account = await createAccount(admin, { email: `sessions-${label}-${TAG}@couplet.test`, name: `Sessions ${label}`, siteRole: 'member', password: FIRST_PASSWORD });
  return { id: account.id, email: account.email, name: account.name, siteRole: account.siteRole };
}

const live = async (user: SessionUser, sessionId: string) => (await findActiveSessionUser(user.id, sessionId)) !== null;

/** Moves a session's timestamps `seconds` into the past (database time, as the server compares them). */
async function ageSession(sessionId: string, seconds: number, column: 'created_at' | 'last_seen_at' = 'last_seen_at'): Promise<void> {
  await db('user_sessions').where({ id: sessionId }).update({ [column]: db.raw('now(3) - interval ? second', [seconds]) });
}

afterAll(() => db.destroy());

describe('session records', () => {
  it('a started session is live until it is signed out; another session of the same person is not affected', async () => {
    const user = await throwaway('signout');
    const first = await startSession(user.id);
    const second = await startSession(user.id);
    expect(first).not.toBe(second);
    expect(await findActiveSessionUser(user.id, first)).toEqual(user);

    await endSession(first);
    expect(await live(user, first)).toBe(false);
    expect(await live(user, second)).toBe(true);
    // ending it again (a second sign-out from a copied cookie) changes nothing and does not throw
    await endSession(first);
    expect(await live(user, first)).toBe(false);
  });

  it('refuses an unknown session id and a session presented with another person\u2019s id', async () => {
    const user = await throwaway('foreign');
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const sessionId = await startSession(user.id);
    expect(await live(researcher, sessionId)).toBe(false);
    expect(await findActiveSessionUser(user.id, '00000000-0000-4000-8000-000000000000')).toBeNull();
    expect(await live(user, sessionId)).toBe(true);
  });

  it('notes when a session was seen at most every few minutes, and ends one idle past the session lifetime', async () => {
    const user = await throwaway('idle');
    const sessionId = await startSession(user.id);
    const seenAt = async () => (await db('user_sessions').where({ id: sessionId }).first('last_seen_at')).last_seen_at as Date | null;

    expect(await seenAt()).toBeNull();
    expect(await live(user, sessionId)).toBe(true);
    expect(await seenAt()).not.toBeNull();

    // seen a minute ago: not written again (one write every few minutes, not one per request)
    await ageSession(sessionId, 60);
    const minuteAgo = await seenAt();
    expect(await live(user, sessionId)).toBe(true);
    expect(await seenAt()).toEqual(minuteAgo);

    // seen ten minutes ago: written again
    await ageSession(sessionId, 600);
    const tenMinutesAgo = await seenAt();
    expect(await live(user, sessionId)).toBe(true);
    expect((await seenAt())!.getTime()).toBeGreaterThan(tenMinutesAgo!.getTime());

    // not seen for a minute longer than the lifetime: signed out, and it stays so once seen again
    await ageSession(sessionId, SESSION_MAX_AGE_SECONDS + 60);
    expect(await live(user, sessionId)).toBe(false);
    expect((await db('user_sessions').where({ id: sessionId }).first('revoked_at')).revoked_at).not.toBeNull();
    await ageSession(sessionId, 0);
    expect(await live(user, sessionId)).toBe(false);

    // never seen, started longer ago than the lifetime: the same
    const unseen = await startSession(user.id);
    await ageSession(unseen, SESSION_MAX_AGE_SECONDS + 60, 'created_at');
    expect(await live(user, unseen)).toBe(false);
  });

  it('a new sign-in clears the person\u2019s ended rows and keeps the live ones', async () => {
    const user = await throwaway('prune');
    const ended = await startSession(user.id);
    const kept = await startSession(user.id);
    await endSession(ended);
    await startSession(user.id);
    expect(await db('user_sessions').where({ id: ended }).first()).toBeUndefined();
    expect(await live(user, kept)).toBe(true);
  });

  it('ends every session of a person, or every one but the given one', async () => {
    const user = await throwaway('end-all');
    const [a, b, c] = [await startSession(user.id), await startSession(user.id), await startSession(user.id)];
    expect(await endUserSessions(db, user.id, { except: a })).toBe(2);
    expect([await live(user, a), await live(user, b), await live(user, c)]).toEqual([true, false, false]);
    expect(await endUserSessions(db, user.id)).toBe(1);
    expect(await live(user, a)).toBe(false);
  });

  it('disabling an account ends its sessions, and enabling it again does not bring them back', async () => {
    const admin = await sessionUserByEmail(SEEDED.admin);
    const user = await throwaway('disabled');
    const sessionId = await startSession(user.id);
    await updateAccount(admin, user.id, { disabled: true });
    expect(await live(user, sessionId)).toBe(false);
    await updateAccount(admin, user.id, { disabled: false });
    expect(await live(user, sessionId)).toBe(false);
    expect(await live(user, await startSession(user.id))).toBe(true);
  });
});

describe('next-auth wiring', () => {
  it('sign-in (the jwt callback with a user) starts a session whose id the token carries; sign-out ends it', async () => {
    const user = await throwaway('wiring');
    const jwt = authOptions.callbacks!.jwt!;
    const token = (await jwt({ token: { name: user.name, email: user.email }, user: { id: String(user.id), siteRole: user.siteRole }, account: null, trigger: 'signIn' } as never)) as JWT;
    expect(typeof token.sid).toBe('string');
    expect(await live(user, token.sid!)).toBe(true);

    // every later request re-reads the token without a user: no new session
    const before = await db('user_sessions').where({ user_id: user.id }).count({ n: '*' }).first();
    const again = (await jwt({ token, account: null } as never)) as JWT;
    expect(again.sid).toBe(token.sid);
    expect(await db('user_sessions').where({ user_id: user.id }).count({ n: '*' }).first()).toEqual(before);

    await authOptions.events!.signOut!({ token } as never);
    expect(await live(user, token.sid!)).toBe(false);
  });

  it('sign-out with a token that names no session (from before session records, or undecodable) does nothing', async () => {
    await expect(authOptions.events!.signOut!({ token: {} } as never)).resolves.toBeUndefined();
    await expect(authOptions.events!.signOut!({ token: null } as never)).resolves.toBeUndefined();
  });
});

describe('changing one\u2019s own password', () => {
  it('refuses a new password equal to the current one or too short, naming the field', () => {
    const same = passwordChangeSchema.safeParse({ currentPassword: FIRST_PASSWORD, newPassword: FIRST_PASSWORD });
    expect(same.success).toBe(false);
    expect(same.error?.issues.map((i) => i.path.join('.'))).toEqual(['newPassword']);
    const short = passwordChangeSchema.safeParse({ currentPassword: FIRST_PASSWORD, newPassword: 'short' });
    expect(short.error?.issues.map((i) => i.path.join('.'))).toEqual(['newPassword']);
    const missing = passwordChangeSchema.safeParse({ newPassword: SECOND_PASSWORD });
    expect(missing.error?.issues.map((i) => i.path.join('.'))).toEqual(['currentPassword']);
  });

  it('ends every other session of the person, keeps the one that changed it, and the new password is the one that works', async () => {
    const user = await throwaway('change');
    const here = await startSession(user.id);
    const elsewhere = [await startSession(user.id), await startSession(user.id)];
    const someoneElse = await sessionUserByEmail(SEEDED.researcher);
    const theirs = await startSession(someoneElse.id);

    expect(await changeOwnPassword(user, here, { currentPassword: FIRST_PASSWORD, newPassword: SECOND_PASSWORD }, null)).toEqual({ otherSessionsEnded: 2 });
    expect(await live(user, here)).toBe(true);
    for (const sessionId of elsewhere) expect(await live(user, sessionId)).toBe(false);
    expect(await live(someoneElse, theirs)).toBe(true);

    const stored = await findUserForSignIn(user.email);
    expect(await verifyPassword(SECOND_PASSWORD, stored!.passwordHash)).toBe(true);
    expect(await verifyPassword(FIRST_PASSWORD, stored!.passwordHash)).toBe(false);

    const audit = await db('audit_events').where({ action: 'account.update', target_table: 'users', target_id: String(user.id) }).orderBy('id', 'desc').first();
    expect(audit.actor_id).toBe(user.id);
    const details = typeof audit.details === 'string' ? JSON.parse(audit.details) : audit.details;
    expect(details).toEqual({ password: 'changed', otherSessionsEnded: 2 });
    expect(JSON.stringify(details)).not.toContain(SECOND_PASSWORD);
  });

  it('a wrong current password is 422 on currentPassword, ends nothing, and counts toward the sign-in pause (429)', async () => {
    const user = await throwaway('wrong');
    const here = await startSession(user.id);
    const elsewhere = await startSession(user.id);
    const attempt = () => changeOwnPassword(user, here, { currentPassword: 'not the password 0', newPassword: SECOND_PASSWORD }, null);

    let issues: unknown;
    try {
      await attempt();
    } catch (error) {
      expect((error as { status: number }).status).toBe(422);
      issues = (error as { issues: unknown }).issues;
    }
    expect(issues).toEqual([expect.objectContaining({ path: 'currentPassword' })]);
    expect(await live(user, elsewhere)).toBe(true);

    // the sign-in limiter allows five failures per account in its window (sign-in-limiter.ts); the sixth pauses it
    for (let failure = 2; failure <= 5; failure += 1) expect(await statusOf(attempt)).toBe(422);
    expect(await statusOf(attempt)).toBe(429);
    // paused: even the right password is not tried, so guessing cannot go on through this route
    expect(await statusOf(() => changeOwnPassword(user, here, { currentPassword: FIRST_PASSWORD, newPassword: SECOND_PASSWORD }, null))).toBe(429);
    expect(await verifyPassword(FIRST_PASSWORD, (await findUserForSignIn(user.email))!.passwordHash)).toBe(true);
    expect(await live(user, elsewhere)).toBe(true);
  });
});
