import { changeMemberRole, listMembers } from '../../../src/lib/data/members';
import { createStudy } from '../../../src/lib/data/studies';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';

describe('study members', () => {
  afterAll(() => db.destroy());

  it('lists members researchers first', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const members = await listMembers(student, await studyIdByName(SEEDED.padStudy));
    expect(members.map((m) => m.role)).toEqual(['researcher', 'supervisor', 'student']);
  });

  it('a student cannot change roles (403); an outsider gets 404', async () => {
    const studyId = await studyIdByName(SEEDED.padStudy);
    const student = await sessionUserByEmail(SEEDED.student);
    const outsider = await sessionUserByEmail(SEEDED.otherResearcher);
    expect(await statusOf(() => changeMemberRole(student, studyId, student.id, 'supervisor'))).toBe(403);
    expect(await statusOf(() => changeMemberRole(outsider, studyId, student.id, 'supervisor'))).toBe(404);
  });

  it('keeps at least one researcher on a study (409), and audits role changes', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const admin = await sessionUserByEmail(SEEDED.admin);
    const study = await createStudy(researcher, { name: 'Role change drill', summary: '', frequencyHz: null });
    expect(await statusOf(() => changeMemberRole(researcher, study.id, researcher.id, 'student'))).toBe(409);
    expect((await listMembers(researcher, study.id))[0].role).toBe('researcher');

    // An admin may manage members of any study, even one they are not on.
    expect(await statusOf(() => changeMemberRole(admin, study.id, researcher.id, 'researcher'))).toBe(200);
    const audits = await db('audit_events').where({ study_id: study.id, action: 'member.role.change' });
    expect(audits).toHaveLength(0); // unchanged role: nothing to audit
  });
});
