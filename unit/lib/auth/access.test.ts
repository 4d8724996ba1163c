import { requireStudyAccess } from '../../../src/lib/auth/access';
import { canOnStudy, STUDY_ACTIONS } from '../../../src/lib/auth/permissions';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';

/** The access gate against the seeded demo lab: 404 for outsiders, 403 for a role without the right. */
describe('requireStudyAccess on the real database', () => {
  let padStudy: number;
  beforeAll(async () => {
    padStudy = await studyIdByName(SEEDED.padStudy);
  });
  afterAll(() => db.destroy());

  const members = [
    ['researcher', SEEDED.researcher],
    ['student', SEEDED.student],
    ['supervisor', SEEDED.supervisor],
  ] as const;

  for (const [role, email] of members) {
    for (const action of STUDY_ACTIONS) {
      const expected = canOnStudy({ siteRole: 'member', studyRole: role }, action) ? 200 : 403;
      it(`${role} -> ${action} gives ${expected}`, async () => {
        const user = await sessionUserByEmail(email);
        expect(await statusOf(() => requireStudyAccess(user, padStudy, action))).toBe(expected);
      });
    }
  }

  for (const action of STUDY_ACTIONS) {
    it(`a researcher of another study gets 404 for ${action}`, async () => {
      const outsider = await sessionUserByEmail(SEEDED.otherResearcher);
      expect(await statusOf(() => requireStudyAccess(outsider, padStudy, action))).toBe(404);
    });
    const adminExpected = canOnStudy({ siteRole: 'admin', studyRole: null }, action) ? 200 : 403;
    it(`the site admin (not a member) gets ${adminExpected} for ${action}`, async () => {
      const admin = await sessionUserByEmail(SEEDED.admin);
      expect(await statusOf(() => requireStudyAccess(admin, padStudy, action))).toBe(adminExpected);
    });
  }

  it('a study that does not exist is a 404 even for the admin', async () => {
    const admin = await sessionUserByEmail(SEEDED.admin);
    expect(await statusOf(() => requireStudyAccess(admin, 987654, 'study.view'))).toBe(404);
  });

  it('returns the member role for the UI', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    await expect(requireStudyAccess(student, padStudy, 'readings.log')).resolves.toEqual({ studyId: padStudy, studyRole: 'student' });
  });
});
