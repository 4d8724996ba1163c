import type { SessionUser } from '../../src/lib/auth/session-user';

/**
 * Who is signed in, for tests that call route handlers directly: a test file replaces the session
 * module with `sessionStandIn` and picks the person with `actAs` before each call.
 *
 *   jest.mock('@/lib/auth/session', () => jest.requireActual('<path to>/unit/support/acting-user').sessionStandIn);
 *
 * (jest.requireActual shares this module's one instance with the test's own import of `actAs`.)
 */
let actor: SessionUser | null = null;

/** The person the next calls are made as; null for nobody signed in. */
export function actAs(user: SessionUser | null): void {
  actor = user;
}

/** Stands in for src/lib/auth/session: the person set by `actAs`. */
export const sessionStandIn = {
  getSessionUser: async (): Promise<SessionUser | null> => actor,
  requireUser: async (): Promise<SessionUser> => {
    if (!actor) throw new Error('no actor set');
    return actor;
  },
};
