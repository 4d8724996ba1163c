/**
 * The invitation page's server actions (src/app/invite/[token]/actions.ts), called directly as their
 * forms call them: a server action has no stable URL, so e2e/route-matrix.spec.ts lists them and
 * relies on this file. A new account needs only the invitation's token; joining with an existing
 * account needs the session of the invited address. A refusal comes back as a message saying what to
 * do, never with internals.
 */
jest.mock('next/navigation', () => ({
  // next's redirect() throws to end the action; this one throws something the tests can read
  redirect: (url: string) => {
    throw Object.assign(new Error('NEXT_REDIRECT'), { redirectedTo: url });
  },
}));
jest.mock('../../../src/lib/auth/session', () => ({ requireUser: jest.fn() }));
// the tests read the tokens as they are made, instead of from the e-mails that carry them
jest.mock('../../../src/lib/invitations/token', () => jest.requireActual('../../support/recorded-invitation-tokens').recordingTokenModule());
jest.mock('../../../src/lib/data/invitations', () => {
  const actual = jest.requireActual('../../../src/lib/data/invitations');
  return {
    ...actual,
    acceptInvitationAsUser: jest.fn(actual.acceptInvitationAsUser),
    acceptInvitationWithNewAccount: jest.fn(actual.acceptInvitationWithNewAccount),
  };
});

import { acceptWithNewAccount, joinAsSignedInUser } from '../../../src/app/invite/[token]/actions';
import type { SessionUser } from '../../../src/lib/auth/session-user';
import { requireUser } from '../../../src/lib/auth/session';
import { acceptInvitationAsUser, acceptInvitationWithNewAccount, createInvitation, viewInvitation } from '../../../src/lib/data/invitations';
import { createStudy } from '../../../src/lib/data/studies';
import { unauthorized } from '../../../src/lib/http/errors';
import { db, SEEDED, sessionUserByEmail } from '../../support/database';

const signedInAs = requireUser as jest.MockedFunction<typeof requireUser>;
const { issuedForTest } = jest.requireMock('../../../src/lib/invitations/token') as { issuedForTest: string[] };
const UNKNOWN_TOKEN = 'A'.repeat(43);
const PASSWORD = 'a-good-long-password';
/** What the actions answer for anything that is not a domain refusal. */
const SOMETHING_WENT_WRONG = 'Something went wrong on our side. Try again in a moment.';
/** An error of the kind a database throws: SQL, an error code and a source path. */
const internalError = () =>
  Object.assign(new Error("ER_LOCK_WAIT_TIMEOUT: Lock wait timeout exceeded: select * from `invitations` where `token_hash` = ? at /work/main/src/lib/data/invitations.ts:190:5"), {
    code: 'ER_LOCK_WAIT_TIMEOUT',
  });

function newAccountForm(name: string, password: string, confirmPassword = password): FormData {
  const form = new FormData();
  form.set('name', name);
  form.set('password', password);
  form.set('confirmPassword', confirmPassword);
  return form;
}

/** Where the action redirected to; fails when it answered instead. */
async function redirectOf(run: () => Promise<unknown>): Promise<string> {
  let answer: unknown;
  try {
    answer = await run();
  } catch (error) {
    const target = (error as { redirectedTo?: string }).redirectedTo;
    if (target) return target;
    throw error;
  }
  throw new Error(`Expected a redirect, got ${JSON.stringify(answer)}`);
}

async function membership(studyId: number, email: string): Promise<string | null> {
  const row = await db('study_members').join('users', 'users.id', 'study_members.user_id').where({ 'study_members.study_id': studyId, 'users.email': email }).first('study_members.role');
  return row?.role ?? null;
}

describe('server actions of the invitation page', () => {
  const stamp = Date.now();
  const studyName = `Server action drill ${stamp}`;
  let studyId: number;
  let researcher: SessionUser;
  let student: SessionUser;
  let supervisor: SessionUser;

  /** Invites `email` to the drill study and returns the invitation's token. */
  async function invite(email: string): Promise<string> {
    const before = issuedForTest.length;
    await createInvitation(researcher, studyId, { email, role: 'student' });
    expect(issuedForTest).toHaveLength(before + 1);
    return issuedForTest[before];
  }

  beforeAll(async () => {
    [researcher, student, supervisor] = await Promise.all([SEEDED.researcher, SEEDED.student, SEEDED.supervisor].map(sessionUserByEmail));
    // a study of its own, so the seeded study's members stay as other suites expect them
    studyId = (await createStudy(researcher, { name: studyName, summary: '', frequencyHz: null })).id;
  });
  afterEach(() => jest.clearAllMocks());
  afterAll(async () => {
    await db('study_members').where({ study_id: studyId, user_id: student.id }).del();
    await db.destroy();
  });

  describe('acceptWithNewAccount: the token is the credential', () => {
    it('an unknown token creates nothing and says the link is not valid', async () => {
      const [{ n: before }] = await db('users').count({ n: '*' });
      const answer = await acceptWithNewAccount(UNKNOWN_TOKEN, {}, newAccountForm('Nobody', PASSWORD));
      expect(answer).toEqual({ message: 'This invitation link is not valid.', name: 'Nobody' });
      const [{ n: after }] = await db('users').count({ n: '*' });
      expect(Number(after)).toBe(Number(before));
    });

    it('a form that needs attention is answered field by field before the token is used', async () => {
      const token = await invite(`form.check.${stamp}@lab.test`);
      const answer = await acceptWithNewAccount(token, {}, newAccountForm('Form Check', 'short', 'other'));
      expect(Object.keys(answer.fieldErrors ?? {}).sort()).toEqual(['confirmPassword', 'password']);
      expect(acceptInvitationWithNewAccount).not.toHaveBeenCalled();
      expect((await viewInvitation(token)).status).toBe('valid');
    });

    it('a valid token creates the account and the membership once, then sends the person to sign in', async () => {
      const email = `new.person.${stamp}@lab.test`;
      const token = await invite(email);
      const target = await redirectOf(() => acceptWithNewAccount(token, {}, newAccountForm('New Person', PASSWORD)));
      expect(target).toBe(`/signin?joined=1&email=${encodeURIComponent(email)}&callbackUrl=${encodeURIComponent(`/studies/${studyId}`)}`);
      expect(await membership(studyId, email)).toBe('student');
      expect(await acceptWithNewAccount(token, {}, newAccountForm('New Person', PASSWORD))).toEqual({
        message: 'This invitation has already been used.', name: 'New Person',
      });
      expect(await db('users').where({ email })).toHaveLength(1);
    });

    it('an address that already has an account must sign in instead; nobody joins', async () => {
      const token = await invite(student.email);
      const answer = await acceptWithNewAccount(token, {}, newAccountForm('Impostor', PASSWORD));
      expect(answer.message).toMatch(/exists already\. Sign in to join/);
      expect(await membership(studyId, student.email)).toBeNull();
      expect((await db('users').where({ email: student.email }).first('name')).name).toBe(student.name);
    });

    it('an unexpected failure answers a plain message with no internals', async () => {
      const token = await invite(`unlucky.${stamp}@lab.test`);
      (acceptInvitationWithNewAccount as jest.Mock).mockRejectedValueOnce(internalError());
      const quiet = jest.spyOn(console, 'error').mockImplementation(() => undefined);
      const answer = await acceptWithNewAccount(token, {}, newAccountForm('Unlucky', PASSWORD));
      quiet.mockRestore();
      expect(answer).toEqual({ message: SOMETHING_WENT_WRONG, name: 'Unlucky' });
    });
  });

  describe('joinAsSignedInUser: the session of the invited address', () => {
    let token: string;
    beforeAll(async () => {
      token = await invite(student.email);
    });

    it('signed out: asked to sign in, and the invitation is not touched', async () => {
      signedInAs.mockRejectedValueOnce(unauthorized());
      expect(await joinAsSignedInUser(token, {}, new FormData())).toEqual({ message: 'Sign in to continue.' });
      expect(acceptInvitationAsUser).not.toHaveBeenCalled();
      expect((await viewInvitation(token)).status).toBe('valid');
    });

    it('signed in as another account: refused, naming the address to sign in with; nobody joins', async () => {
      signedInAs.mockResolvedValueOnce(supervisor);
      const answer = await joinAsSignedInUser(token, {}, new FormData());
      expect(answer.message).toBe(`This invitation was sent to ${student.email}. Sign in with that address to accept it.`);
      expect(await membership(studyId, supervisor.email)).toBeNull();
      expect(await membership(studyId, student.email)).toBeNull();
      expect((await viewInvitation(token)).status).toBe('valid');
    });

    it('an unexpected failure answers a plain message with no internals', async () => {
      signedInAs.mockResolvedValueOnce(student);
      (acceptInvitationAsUser as jest.Mock).mockRejectedValueOnce(internalError());
      const quiet = jest.spyOn(console, 'error').mockImplementation(() => undefined);
      const answer = await joinAsSignedInUser(token, {}, new FormData());
      quiet.mockRestore();
      expect(answer).toEqual({ message: SOMETHING_WENT_WRONG });
      expect(await membership(studyId, student.email)).toBeNull();
    });

    it('signed in as the invited address: joins with the invited role and opens the study; the link then is used', async () => {
      signedInAs.mockResolvedValueOnce(student);
      expect(await redirectOf(() => joinAsSignedInUser(token, {}, new FormData()))).toBe(`/studies/${studyId}`);
      expect(await membership(studyId, student.email)).toBe('student');
      signedInAs.mockResolvedValueOnce(student);
      expect(await joinAsSignedInUser(token, {}, new FormData())).toEqual({ message: 'This invitation has already been used.' });
    });
  });
});
