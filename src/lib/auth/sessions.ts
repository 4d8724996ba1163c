import 'server-only';
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db';
import type { SiteRole } from './permissions';
import type { SessionUser } from './session-user';

/**
 * Server-side session records (user_sessions). The cookie is a signed JWT naming one row; a session is
 * live while its row exists, is not revoked, its account is not disabled and it has been seen within
 * SESSION_MAX_AGE_SECONDS. A missing row counts as signed out, so ended rows may be deleted at any time.
 */

/** How long a session lasts without activity: one working day. The JWT's own lifetime is the same. */
export const SESSION_MAX_AGE_SECONDS = 8 * 60 * 60;

/**
 * last_seen_at is written at most this often, so a busy session costs one write every few minutes
 * instead of one per request. The idle limit is therefore exact to within this much.
 */
const SEEN_EVERY_SECONDS = 5 * 60;

type Db = Knex | Knex.Transaction;

/** Narrows a user_sessions query to rows that can never be live again: revoked, or idle past the lifetime. */
function ended(query: Knex.QueryBuilder): Knex.QueryBuilder {
  return query.where((q) =>
    q.whereNotNull('revoked_at').orWhereRaw('coalesce(last_seen_at, created_at) < now(3) - interval ? second', [SESSION_MAX_AGE_SECONDS]),
  );
}

/**
 * Records a sign-in and returns the new session's id for the JWT. Clears the account's ended rows on
 * the way, so the table holds about one row per live session.
 */
export async function startSession(userId: number, trx: Db = db): Promise<string> {
  const id = randomUUID();
  await ended(trx('user_sessions').where({ user_id: userId })).del();
  await trx('user_sessions').insert({ id, user_id: userId });
  return id;
}

/** Ends one session (sign-out). Ending an ended or unknown session does nothing. */
export async function endSession(sessionId: string, trx: Db = db): Promise<void> {
  await trx('user_sessions').where({ id: sessionId }).whereNull('revoked_at').update({ revoked_at: trx.fn.now(3) });
}

/**
 * Ends every live session of an account, or every one but `except` (the session that changed the
 * password keeps working). Returns how many were ended.
 */
export async function endUserSessions(trx: Db, userId: number, options: { except?: string } = {}): Promise<number> {
  const query = trx('user_sessions').where({ user_id: userId }).whereNull('revoked_at');
  if (options.except) query.whereNot({ id: options.except });
  return query.update({ revoked_at: trx.fn.now(3) });
}

interface SessionRow {
  id: number;
  email: string;
  name: string;
  site_role: SiteRole;
  disabled_at: Date | null;
  revoked_at: Date | null;
  idle: number | string;
  stale: number | string;
}

/**
 * The account behind a live session, or null when the session was ended (signed out, password
 * changed elsewhere, account disabled), idled out, or never existed. Notes the session as seen.
 */
export async function findActiveSessionUser(userId: number, sessionId: string): Promise<SessionUser | null> {
  const row: SessionRow | undefined = await db('user_sessions as s')
    .join('users as u', 'u.id', 's.user_id')
    .where({ 's.id': sessionId, 's.user_id': userId })
    .first(
      'u.id',
      'u.email',
      'u.name',
      'u.site_role',
      'u.disabled_at',
      's.revoked_at',
      db.raw('coalesce(s.last_seen_at, s.created_at) < now(3) - interval ? second as idle', [SESSION_MAX_AGE_SECONDS]),
      db.raw('(s.last_seen_at is null or s.last_seen_at < now(3) - interval ? second) as stale', [SEEN_EVERY_SECONDS]),
    );
  if (!row || row.revoked_at !== null || row.disabled_at !== null) return null;
  if (Number(row.idle) === 1) {
    // Idle past its lifetime: end it for good, so seeing it again later does not revive it.
    await endSession(sessionId);
    return null;
  }
  if (Number(row.stale) === 1) {
    await db('user_sessions').where({ id: sessionId }).whereNull('revoked_at').update({ last_seen_at: db.fn.now(3) });
  }
  return { id: row.id, email: row.email, name: row.name, siteRole: row.site_role };
}
