/**
 * Hostile input to the invitation page's server actions (src/app/invite/[token]/actions.ts), called
 * directly as their forms call them (as unit/lib/auth/server-actions-access.test.ts does), property-based
 * with fast-check. A server action is a public endpoint: its client sends whatever arguments it likes,
 * so the form may miss fields, repeat them, carry files where text belongs, hold megabytes, NUL, bidi
 * controls or lone surrogates, try to set what only the invitation decides (e-mail, site role, study
 * role), or not be a FormData at all; the token comes from the URL, so it may be anything. Either the
 * action answers a state (fieldErrors or a message, never internals) and the database is as it was, or,
 * for a valid form and a usable token only, it redirects having done exactly what the invitation says.
 * Replay a failure with FUZZ_SEED (in the test names) and FUZZ_RUNS.
 */
jest.mock('next/navigation', () => ({
  // next's redirect() throws to end the action; this one throws something the tests can read
  redirect: (url: string) => {
    throw Object.assign(new Error('NEXT_REDIRECT'), { redirectedTo: url });
  },
}));
jest.mock('@/lib/auth/session', () => ({ requireUser: jest.fn(), getSessionUser: jest.fn() }));
// the tests read the tokens as they are made, instead of from the e-mails that carry them
jest.mock('@/lib/invitations/token', () => jest.requireActual('../support/recorded-invitation-tokens').recordingTokenModule());

import fc from 'fast-check';
import { acceptWithNewAccount, joinAsSignedInUser, type JoinState, type NewAccountState } from '@/app/invite/[token]/actions';
import type { SessionUser } from '@/lib/auth/session-user';
import { requireUser } from '@/lib/auth/session';
import { createInvitation, revokeInvitation } from '@/lib/data/invitations';
import { createStudy } from '@/lib/data/studies';
import { unauthorized } from '@/lib/http/errors';
import { db, SEEDED, sessionUserByEmail } from '../support/database';
import { databaseState, edgeStrings, FUZZ_RUNS, FUZZ_SEED, RAW_NUMBERS } from '../support/fuzz-json';
import { baseline, removeSince, type Baseline } from '../support/fuzz-fixtures';

const signedInAs = requireUser as jest.MockedFunction<typeof requireUser>;
const { issuedForTest } = jest.requireMock('@/lib/invitations/token') as { issuedForTest: string[] };

const PASSWORD = 'a-good-long-password';
/** A run costs a bcrypt hash (about 0.15 s) when the form is valid, and two checksums of every table [ms]. */
const PROPERTY_TIMEOUT_MS = 30_000 + FUZZ_RUNS * 500;
const NEW_ACCOUNT_FIELDS = ['name', 'password', 'confirmPassword'] as const;
/** What a state would show only by mistake: a stack frame, a source or install path, a driver code, SQL, a JavaScript error's name. */
const INTERNALS = [/\n\s+at \S/, /node_modules|\/work\/|\/tmp\/|\.tsx?:\d+/, /\bER_[A-Z_]{3,}\b/, /\b(insert into|delete from|select \S+ from|update `)/i, /\b(TypeError|RangeError|SyntaxError)\b/];

/** The action's answer, or where it redirected; anything else it throws fails the test. */
async function outcome<T>(run: () => Promise<T>): Promise<{ state: T } | { redirectedTo: string }> {
  try {
    return { state: await run() };
  } catch (error) {
    const target = (error as { redirectedTo?: string }).redirectedTo;
    if (target) return { redirectedTo: target };
    throw new Error(`the action threw instead of answering: ${String(error)}`);
  }
}

function expectPlainMessage(message: unknown): void {
  expect(message).toEqual(expect.any(String));
  for (const pattern of INTERNALS) expect(message).not.toMatch(pattern);
}

// ---------------------------------------------------------------------------------------------
// values

const hugeText = fc.tuple(fc.constantFrom('a', ' ', '\u0000', '\u1e9e', '\ud83e\uddf2', '\ud800', '\u202e'), fc.integer({ min: 60, max: 1_000_000 })).map(([c, n]) => c.repeat(n));
const hostileText = fc.oneof({ weight: 6, arbitrary: edgeStrings }, { weight: 2, arbitrary: fc.constantFrom(...RAW_NUMBERS) }, { weight: 1, arbitrary: hugeText },
  { weight: 1, arbitrary: fc.constantFrom('x\ud800y'.repeat(10), `${PASSWORD}\ud800`, `\u0000${PASSWORD}`, `${PASSWORD}\u202e`, '\u00e9'.repeat(36), '\u00e9'.repeat(37)) });
const fileValue = fc.tuple(fc.uint8Array({ maxLength: 64 }), fc.oneof(edgeStrings, fc.constant('a.txt'))).map(([bytes, name]) => new File([bytes], name));

/** One field's value(s) in the form: as a person types it, missing, hostile text, a file, or repeated. */
type FieldValue = { kind: 'valid' } | { kind: 'missing' } | { kind: 'values'; values: (string | File)[] };
const fieldValue: fc.Arbitrary<FieldValue> = fc.oneof(
  { weight: 4, arbitrary: fc.constant<FieldValue>({ kind: 'valid' }) },
  { weight: 1, arbitrary: fc.constant<FieldValue>({ kind: 'missing' }) },
  { weight: 3, arbitrary: hostileText.map((v): FieldValue => ({ kind: 'values', values: [v] })) },
  { weight: 1, arbitrary: fileValue.map((f): FieldValue => ({ kind: 'values', values: [f] })) },
  { weight: 1, arbitrary: fc.array(fc.oneof(hostileText, fileValue), { minLength: 2, maxLength: 3 }).map((values): FieldValue => ({ kind: 'values', values })) },
);
/** Fields the form does not have, named as the things the invitation decides. */
const extraField = fc.tuple(fc.constantFrom('email', 'siteRole', 'site_role', 'role', 'studyId', 'userId', 'token', '$ACTION_ID_x', '__proto__', ''), fc.oneof(hostileText, fc.constantFrom('admin', 'supervisor', 'researcher', '1', 'admin@couplet.test')));

/** Arguments that are not a FormData at all, as a client of the action endpoint may send them. */
const notAForm = fc.constantFrom<unknown>(null, undefined, '', 'name=x&password=y', 42, [], {}, { name: 'Ann', password: PASSWORD, confirmPassword: PASSWORD },
  { get: () => { throw new Error('boom'); } }, new URLSearchParams({ name: 'Ann', password: PASSWORD, confirmPassword: PASSWORD }), new Map([['name', 'Ann']]), new Blob(['x']));

/** Stands for the form the test builds, in place of one of `notAForm`. */
const A_FORM = Symbol('a form');

/** Tokens as a URL may carry them: not base64url, the right length with one wrong character, huge, unicode. */
const garbageToken = fc.oneof(
  edgeStrings,
  fc.constantFrom('A'.repeat(43), 'A'.repeat(42), 'A'.repeat(44), `${'A'.repeat(42)}=`, `${'A'.repeat(42)}\u0410`, `${'A'.repeat(42)}\ud800`, `${'A'.repeat(42)}\n`, '%41'.repeat(43), '../'.repeat(15)),
  fc.string({ unit: fc.constantFrom(...'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_'), minLength: 43, maxLength: 43 }),
  fc.integer({ min: 44, max: 2_000_000 }).map((n) => 'A'.repeat(n)),
);
type TokenChoice = 'usable' | 'used' | 'revoked' | { garbage: string };
const tokenChoice: fc.Arbitrary<TokenChoice> = fc.oneof(
  { weight: 4, arbitrary: fc.constant<TokenChoice>('usable') },
  { weight: 1, arbitrary: fc.constantFrom<TokenChoice>('used', 'revoked') },
  { weight: 3, arbitrary: garbageToken.map((garbage): TokenChoice => ({ garbage })) },
);

// ---------------------------------------------------------------------------------------------

describe(`invitation server actions answer hostile forms and tokens with a state (FUZZ_SEED=${FUZZ_SEED})`, () => {
  let base: Baseline;
  let researcher: SessionUser;
  let studyId: number;
  let serial = 0;
  let usedToken: string;
  let revokedToken: string;

  /** Invites a new address to the fixture study as a student; returns the address and the link's token. */
  async function invite(prefix: string): Promise<{ email: string; token: string }> {
    serial += 1;
    const email = `${prefix}.${process.pid}.${serial}@fuzz.test`;
    const before = issuedForTest.length;
    await createInvitation(researcher, studyId, { email, role: 'student' });
    return { email, token: issuedForTest[before] };
  }

  beforeAll(async () => {
    base = await baseline();
    researcher = await sessionUserByEmail(SEEDED.researcher);
    studyId = (await createStudy(researcher, { name: `Fuzz invitations ${process.pid}-${Date.now()}`, summary: '', frequencyHz: null })).id;
    const used = await invite('used');
    await db('invitations').where({ email: used.email }).update({ accepted_at: new Date() });
    usedToken = used.token;
    const revoked = await invite('revoked');
    await revokeInvitation(researcher, studyId, (await db('invitations').where({ email: revoked.email }).first('id')).id);
    revokedToken = revoked.token;
  });

  afterEach(() => jest.clearAllMocks());
  afterAll(async () => {
    await removeSince(base);
    await db.destroy();
  });

  const tokenOf = (choice: TokenChoice, usable: string) =>
    choice === 'usable' ? usable : choice === 'used' ? usedToken : choice === 'revoked' ? revokedToken : choice.garbage;

  function buildForm(fields: Record<(typeof NEW_ACCOUNT_FIELDS)[number], FieldValue>, extras: [string, string][], valid: Record<string, string>): FormData {
    const form = new FormData();
    for (const key of NEW_ACCOUNT_FIELDS) {
      const v = fields[key];
      if (v.kind === 'valid') form.append(key, valid[key]);
      else if (v.kind === 'values') for (const value of v.values) form.append(key, value);
    }
    for (const [key, value] of extras) form.append(key, value);
    return form;
  }

  test('acceptWithNewAccount: hostile forms and tokens get fieldErrors or a message and change nothing; only a valid form with a usable token creates the account', async () => {
    let pending = await invite('new');
    const counts = { refused: 0, joined: 0 };
    await fc.assert(
      fc.asyncProperty(
        fc.record({ name: fieldValue, password: fieldValue, confirmPassword: fieldValue }),
        fc.array(extraField, { maxLength: 3 }),
        fc.oneof({ weight: 8, arbitrary: fc.constant<unknown>(A_FORM) }, { weight: 1, arbitrary: notAForm }),
        tokenChoice,
        fc.constantFrom<unknown>({}, undefined, null, { fieldErrors: { name: 'x' }, message: 'earlier' }),
        async (fields, extras, other, choice, previous) => {
          const token = tokenOf(choice, pending.token);
          const formData = other === A_FORM ? buildForm(fields, extras, { name: ' Fuzz Person ', password: PASSWORD, confirmPassword: PASSWORD }) : (other as FormData);
          const before = await databaseState();
          const result = await outcome(() => acceptWithNewAccount(token, previous as NewAccountState, formData));
          if ('redirectedTo' in result) {
            counts.joined += 1;
            expect(choice).toBe('usable');
            const user = await db('users').where({ email: pending.email }).first('id', 'site_role', 'name');
            expect(user.site_role).toBe('member');
            expect(await db('study_members').where({ study_id: studyId, user_id: user.id }).pluck('role')).toEqual(['student']);
            expect(result.redirectedTo).toBe(`/signin?joined=1&email=${encodeURIComponent(pending.email)}&callbackUrl=${encodeURIComponent(`/studies/${studyId}`)}`);
            pending = await invite('new');
            return;
          }
          counts.refused += 1;
          const { state } = result;
          expect(Object.keys(state).every((key) => ['message', 'fieldErrors', 'name'].includes(key))).toBe(true);
          expect(state.message !== undefined || Object.keys(state.fieldErrors ?? {}).length > 0).toBe(true);
          if (state.message !== undefined) expectPlainMessage(state.message);
          for (const [key, message] of Object.entries(state.fieldErrors ?? {})) {
            expect(NEW_ACCOUNT_FIELDS).toContain(key);
            expectPlainMessage(message);
          }
          if (state.name !== undefined) expect(state.name).toEqual(expect.any(String));
          expect(await databaseState()).toEqual(before);
        },
      ),
      { numRuns: FUZZ_RUNS * 2 },
    );
    if (process.env.FUZZ_VERBOSE) console.log('acceptWithNewAccount', counts);
  }, PROPERTY_TIMEOUT_MS);

  test('acceptWithNewAccount sends back at most 1,000 characters of a name far over the limit', async () => {
    const { token } = await invite('long-name');
    const before = await databaseState();
    const form = new FormData();
    form.append('name', 'N'.repeat(1_000_000));
    form.append('password', PASSWORD);
    form.append('confirmPassword', PASSWORD);
    const answer = await acceptWithNewAccount(token, {}, form);
    expect(answer.fieldErrors?.name).toMatch(/at most 120 characters/);
    expect(answer.name).toBe('N'.repeat(1000));
    expect(await databaseState()).toEqual(before);
  });

  // Found with FUZZ_SEED=891050573: a null form (and any other value that is not a FormData) made acceptWithNewAccount throw a TypeError.
  test.each([null, undefined, 'name=x', {}, { get: () => PASSWORD }, new URLSearchParams({ name: 'Ann', password: PASSWORD, confirmPassword: PASSWORD })])(
    'acceptWithNewAccount answers a form that is not a FormData (%p) field by field, without using the token',
    async (formData) => {
      const { token } = await invite('not-a-form');
      const before = await databaseState();
      const answer = await acceptWithNewAccount(token, {}, formData as unknown as FormData);
      expect(answer).toEqual({ fieldErrors: { name: expect.any(String), password: expect.any(String) }, name: '' });
      expect(await databaseState()).toEqual(before);
    },
  );

  test('joinAsSignedInUser: hostile tokens, sessions and arguments get a message and change nothing; only the invited account with a usable token joins', async () => {
    // An account of its own for each invitation, so a join that succeeds can be followed by more.
    const nextInvitee = async () => {
      const invited = await invite('member');
      await db('users').insert({ email: invited.email, name: 'Fuzz Invitee', password_hash: 'not a usable hash', site_role: 'member' });
      return { ...invited, user: await sessionUserByEmail(invited.email) };
    };
    let pending = await nextInvitee();
    const others = await Promise.all([SEEDED.admin, SEEDED.student].map(sessionUserByEmail));
    const counts = { refused: 0, joined: 0 };
    await fc.assert(
      fc.asyncProperty(
        tokenChoice,
        fc.constantFrom<'invitee' | 'signed out' | 'admin' | 'other'>('invitee', 'invitee', 'signed out', 'admin', 'other'),
        fc.oneof(notAForm, fc.array(extraField, { maxLength: 3 }).map((extras) => {
          const form = new FormData();
          for (const [key, value] of extras) form.append(key, value);
          return form;
        })),
        async (choice, who, formData) => {
          const token = tokenOf(choice, pending.token);
          if (who === 'signed out') signedInAs.mockRejectedValueOnce(unauthorized());
          else signedInAs.mockResolvedValueOnce(who === 'invitee' ? pending.user : who === 'admin' ? others[0] : others[1]);
          const before = await databaseState();
          const result = await outcome(() => joinAsSignedInUser(token, {} as JoinState, formData as FormData));
          if ('redirectedTo' in result) {
            counts.joined += 1;
            expect([choice, who]).toEqual(['usable', 'invitee']);
            expect(result.redirectedTo).toBe(`/studies/${studyId}`);
            expect(await db('study_members').where({ study_id: studyId, user_id: pending.user.id }).pluck('role')).toEqual(['student']);
            pending = await nextInvitee();
            return;
          }
          counts.refused += 1;
          expect(Object.keys(result.state)).toEqual(['message']);
          expectPlainMessage(result.state.message);
          expect(await databaseState()).toEqual(before);
        },
      ),
    );
    if (process.env.FUZZ_VERBOSE) console.log('joinAsSignedInUser', counts);
  }, PROPERTY_TIMEOUT_MS);
});
