import type { SessionUser } from '../../src/lib/auth/session-user';
import { db } from '../../src/lib/db';

/**
 * Database-backed tests run against the fresh test database that `npm test` creates and seeds with
 * the demo lab (database/seeds). Running them without `npm test` fails here, loudly.
 */
if (!process.env.DATABASE_URL) {
  throw new Error('DATABASE_URL is not set: run database-backed tests through `npm test` (it starts the test database).');
}

export { db };

export async function sessionUserByEmail(email: string): Promise<SessionUser> {
  const row = await db('users').where({ email }).first('id', 'email', 'name', 'site_role');
  if (!row) throw new Error(`No seeded user ${email}`);
  return { id: row.id, email: row.email, name: row.name, siteRole: row.site_role };
}

export async function studyIdByName(name: string): Promise<number> {
  const row = await db('studies').where({ name }).first('id');
  if (!row) throw new Error(`No seeded study ${name}`);
  return row.id;
}

/** Runs `action` and returns the HTTP status of the HttpError it throws (or 200 when it succeeds). */
export async function statusOf(action: () => Promise<unknown>): Promise<number> {
  try {
    await action();
    return 200;
  } catch (error) {
    const status = (error as { status?: number }).status;
    if (typeof status !== 'number') throw error;
    return status;
  }
}

export const SEEDED = {
  padStudy: 'Seed-tray pad to buried soil probes',
  railStudy: 'Irrigation-rail cart docking coil',
  admin: 'admin@couplet.test',
  researcher: 'ines.okafor@couplet.test',
  student: 'tomasz.rehn@couplet.test',
  supervisor: 'maren.solberg@couplet.test',
  otherResearcher: 'kofi.mensah@couplet.test',
};
