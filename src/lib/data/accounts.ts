import 'server-only';
import { db } from '../db';
import { hashPassword } from '../auth/password';
import { canManageAccounts, type SiteRole } from '../auth/permissions';
import { endUserSessions } from '../auth/sessions';
import type { SessionUser } from '../auth/session-user';
import { conflict, forbidden, notFound } from '../http/errors';
import { recordAudit } from './audit';

export interface Account {
  id: number;
  email: string;
  name: string;
  siteRole: SiteRole;
  disabled: boolean;
  studyCount: number;
  createdAt: string;
}

function requireAdmin(actor: SessionUser): void {
  if (!canManageAccounts(actor.siteRole)) throw forbidden('Only site admins manage accounts.');
}

function toAccount(row: {
  id: number;
  email: string;
  name: string;
  site_role: SiteRole;
  disabled_at: Date | null;
  study_count: number | string;
  created_at: Date;
}): Account {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    siteRole: row.site_role,
    disabled: row.disabled_at !== null,
    studyCount: Number(row.study_count),
    createdAt: new Date(row.created_at).toISOString(),
  };
}

function accountsQuery() {
  return db('users').select(
    'users.id',
    'users.email',
    'users.name',
    'users.site_role',
    'users.disabled_at',
    'users.created_at',
    db.raw('(select count(*) from study_members sm where sm.user_id = users.id) as study_count'),
  );
}

export async function listAccounts(actor: SessionUser): Promise<Account[]> {
  requireAdmin(actor);
  const rows = await accountsQuery().orderBy('users.name');
  return rows.map(toAccount);
}

export async function createAccount(
  actor: SessionUser,
  input: { email: string; name: string; siteRole: SiteRole; password: string },
): Promise<Account> {
  requireAdmin(actor);
  const passwordHash = await hashPassword(input.password);
  const id = await db.transaction(async (trx) => {
    const existing = await trx('users').where({ email: input.email }).first('id');
    if (existing) throw conflict('An account with this e-mail address exists already.', [{ path: 'email', message: 'Already in use.' }]);
    const [userId] = await trx('users').insert({ email: input.email, name: input.name, site_role: input.siteRole, password_hash: passwordHash });
    await recordAudit(trx, { actorId: actor.id, action: 'account.create', targetTable: 'users', targetId: userId, details: { siteRole: input.siteRole } });
    return userId as number;
  });
  return toAccount(await accountsQuery().where('users.id', id).first());
}

/**
 * Changes an account's name, site role or disabled state. Disabling ends the account's sessions.
 * Admins cannot demote or disable themselves, so a site is never left without an admin by accident.
 */
export async function updateAccount(
  actor: SessionUser,
  userId: number,
  input: { name?: string; siteRole?: SiteRole; disabled?: boolean },
): Promise<Account> {
  requireAdmin(actor);
  await db.transaction(async (trx) => {
    const row = await trx('users').where({ id: userId }).forUpdate().first('id', 'site_role', 'disabled_at');
    if (!row) throw notFound('No such account.');
    if (userId === actor.id && (input.disabled === true || (input.siteRole && input.siteRole !== 'admin'))) {
      throw conflict('You cannot disable or demote your own admin account.', [
        { path: input.disabled === true ? 'disabled' : 'siteRole', message: 'Ask another admin to do this.' },
      ]);
    }
    const changes: Record<string, unknown> = { updated_at: new Date() };
    if (input.name !== undefined) changes.name = input.name;
    if (input.siteRole !== undefined) changes.site_role = input.siteRole;
    if (input.disabled !== undefined) changes.disabled_at = input.disabled ? new Date() : null;
    await trx('users').where({ id: userId }).update(changes);
    // Ended, not only refused while disabled: re-enabling the account must not bring old cookies back.
    if (input.disabled === true) await endUserSessions(trx, userId);
    await recordAudit(trx, { actorId: actor.id, action: 'account.update', targetTable: 'users', targetId: userId, details: input });
  });
  return toAccount(await accountsQuery().where('users.id', userId).first());
}
