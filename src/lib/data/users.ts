import 'server-only';
import { db } from '../db';
import type { SiteRole } from '../auth/permissions';
import type { SessionUser } from '../auth/session-user';

interface UserRow {
  id: number;
  email: string;
  name: string;
  site_role: SiteRole;
  password_hash: string;
  session_version: number;
  disabled_at: Date | null;
}

export interface SignInCandidate extends SessionUser {
  passwordHash: string;
  sessionVersion: number;
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
    sessionVersion: row.session_version,
    disabled: row.disabled_at !== null,
  };
}

/**
 * The active account for a session, or null when the account was disabled or its sessions were
 * ended (session_version moved on) since the session was issued.
 */
export async function findActiveSessionUser(id: number, sessionVersion: number): Promise<SessionUser | null> {
  const row = await db<UserRow>('users').where({ id }).first('id', 'email', 'name', 'site_role', 'session_version', 'disabled_at');
  if (!row || row.disabled_at !== null || row.session_version !== sessionVersion) return null;
  return { id: row.id, email: row.email, name: row.name, siteRole: row.site_role };
}

export async function userExistsWithEmail(email: string): Promise<boolean> {
  const row = await db('users').where({ email }).first('id');
  return Boolean(row);
}
