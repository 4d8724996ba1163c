import {
  acceptInvitationAsUser,
  acceptInvitationWithNewAccount,
  createInvitation,
  listPendingInvitations,
  viewInvitation,
} from '../../../src/lib/data/invitations';
import { listMembers } from '../../../src/lib/data/members';
import { createStudy } from '../../../src/lib/data/studies';
import { deliverPending } from '../../../src/lib/mail/outbox';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';
import { appLinkIn, messagesTo } from '../../support/inbox';

function tokenFrom(link: string): string {
  return link.split('/invite/')[1];
}

async function latestInvitationLink(address: string): Promise<string> {
  // jest runs no outbox dispatcher: send what the invitation queued
  await deliverPending({ limit: 100 });
  // other suites' mail to the same person may go out in the same round
  const messages = (await messagesTo(address)).filter((m) => m.text.includes('/invite/'));
  expect(messages.length).toBeGreaterThan(0);
  const newest = [...messages].sort((a, b) => b.date.localeCompare(a.date))[0];
  return appLinkIn(newest, '/invite/');
}

describe('invitations', () => {
  let padStudy: number;
  beforeAll(async () => {
    padStudy = await studyIdByName(SEEDED.padStudy);
  });
  afterAll(() => db.destroy());

  it('a student may not invite (403) and nothing is stored or sent', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    expect(await statusOf(() => createInvitation(student, padStudy, { email: 'nobody@lab.test', role: 'student' }))).toBe(403);
    expect(await db('invitations').where({ email: 'nobody@lab.test' })).toHaveLength(0);
    expect(await db('mail_outbox').where({ to_address: 'nobody@lab.test' })).toHaveLength(0);
    expect(await messagesTo('nobody@lab.test')).toHaveLength(0);
  });

  it('inviting an existing member is a 409', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    expect(await statusOf(() => createInvitation(researcher, padStudy, { email: SEEDED.student, role: 'student' }))).toBe(409);
  });

  it('a new person gets an e-mail whose link works exactly once', async () => {
    // A study of its own, so the seeded study's member list stays as other suites expect it.
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const study = await createStudy(researcher, { name: 'Invitation drill', summary: '', frequencyHz: null });
    const address = 'liang.unit@lab.test';
    await createInvitation(researcher, study.id, { email: address, role: 'student' });
    expect((await listPendingInvitations(researcher, study.id)).map((i) => i.email)).toContain(address);

    const token = tokenFrom(await latestInvitationLink(address));
    const view = await viewInvitation(token);
    expect(view).toMatchObject({ status: 'valid', email: address, role: 'student', studyName: 'Invitation drill', accountExists: false });

    await acceptInvitationWithNewAccount(token, { name: 'Liang Unit', password: 'a-good-long-password' });
    const members = await listMembers(researcher, study.id);
    expect(members.find((m) => m.email === address)?.role).toBe('student');
    expect((await viewInvitation(token)).status).toBe('used');

    // Second use of the same link: 410 Gone, and no second account.
    expect(await statusOf(() => acceptInvitationWithNewAccount(token, { name: 'Again', password: 'a-good-long-password' }))).toBe(410);
    expect(await db('users').where({ email: address })).toHaveLength(1);
  });

  it('an expired link is refused with 410 and joins nobody', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const address = 'late.unit@lab.test';
    await createInvitation(researcher, padStudy, { email: address, role: 'supervisor' });
    const token = tokenFrom(await latestInvitationLink(address));
    await db('invitations').where({ email: address }).update({ expires_at: new Date(Date.now() - 1000) });
    expect((await viewInvitation(token)).status).toBe('expired');
    expect(await statusOf(() => acceptInvitationWithNewAccount(token, { name: 'Late', password: 'a-good-long-password' }))).toBe(410);
    expect(await db('users').where({ email: address })).toHaveLength(0);
  });

  it('an existing account joins only when signed in as the invited address', async () => {
    const railStudy = await studyIdByName(SEEDED.railStudy);
    const railResearcher = await sessionUserByEmail(SEEDED.otherResearcher);
    const student = await sessionUserByEmail(SEEDED.student);
    const supervisor = await sessionUserByEmail(SEEDED.supervisor);
    await createInvitation(railResearcher, railStudy, { email: student.email, role: 'student' });
    const token = tokenFrom(await latestInvitationLink(student.email));
    expect((await viewInvitation(token)).accountExists).toBe(true);

    expect(await statusOf(() => acceptInvitationAsUser(supervisor, token))).toBe(403);
    await expect(acceptInvitationAsUser(student, token)).resolves.toEqual({ studyId: railStudy });
    // Undo, so other suites still see the student only on the pad study.
    await db('study_members').where({ study_id: railStudy, user_id: student.id }).del();
  });

  it('an unknown or malformed token is a 404', async () => {
    expect(await statusOf(() => viewInvitation('x'.repeat(43)))).toBe(404);
    expect(await statusOf(() => viewInvitation('../../etc'))).toBe(404);
  });
});
