import {
  allowedStudyActions,
  canCreateStudy,
  canManageAccounts,
  canOnStudy,
  canSeeStudy,
  STUDY_ACTIONS,
  type StudyAction,
  type StudyRole,
} from '../../../src/lib/auth/permissions';

/**
 * The role x action table of the product design (PRODUCT.md, "Roles"), restated here independently of
 * the implementation so a change to either one shows up as a failure.
 * Columns: researcher, student, supervisor, admin.
 */
const EXPECTED: Record<StudyAction, [boolean, boolean, boolean, boolean]> = {
  'study.edit': [true, false, false, true], // create a study, edit coils, placements, plans
  'members.manage': [true, false, true, true], // invite members, change roles on the study
  'readings.log': [true, true, false, false], // log readings, upload files, correct own readings
  'comments.write': [true, true, true, false], // comment on points
  'plan.decide': [false, false, true, false], // accept / return a plan
  'study.view': [true, true, true, true], // see the study
  // not a row of the product table: the analysis behind a decision (outliers set aside, fits, tolerance)
  // is the reviewer's and the plan's author's work, not the bench's
  'review.analyse': [true, false, true, false],
};

const ROLE_COLUMNS: StudyRole[] = ['researcher', 'student', 'supervisor'];

describe('study permissions follow the product role table', () => {
  it('covers every action in the table', () => {
    expect([...STUDY_ACTIONS].sort()).toEqual(Object.keys(EXPECTED).sort());
  });

  for (const action of STUDY_ACTIONS) {
    ROLE_COLUMNS.forEach((role, column) => {
      it(`${role} ${EXPECTED[action][column] ? 'may' : 'may not'} ${action}`, () => {
        expect(canOnStudy({ siteRole: 'member', studyRole: role }, action)).toBe(EXPECTED[action][column]);
      });
    });
    it(`site admin (not a member) ${EXPECTED[action][3] ? 'may' : 'may not'} ${action}`, () => {
      expect(canOnStudy({ siteRole: 'admin', studyRole: null }, action)).toBe(EXPECTED[action][3]);
    });
    it(`a non-member may not ${action}`, () => {
      expect(canOnStudy({ siteRole: 'member', studyRole: null }, action)).toBe(false);
      expect(canOnStudy({ siteRole: 'researcher', studyRole: null }, action)).toBe(false);
    });
  }

  it('an admin who is also a supervisor on the study gets the union of both rights', () => {
    const actor = { siteRole: 'admin' as const, studyRole: 'supervisor' as const };
    expect(canOnStudy(actor, 'plan.decide')).toBe(true);
    expect(canOnStudy(actor, 'study.edit')).toBe(true);
    expect(canOnStudy(actor, 'readings.log')).toBe(false);
  });

  it('only members and admins see a study (others must get 404, not 403)', () => {
    expect(canSeeStudy({ siteRole: 'member', studyRole: null })).toBe(false);
    expect(canSeeStudy({ siteRole: 'researcher', studyRole: null })).toBe(false);
    expect(canSeeStudy({ siteRole: 'member', studyRole: 'student' })).toBe(true);
    expect(canSeeStudy({ siteRole: 'admin', studyRole: null })).toBe(true);
  });

  it('lists the allowed actions for the UI', () => {
    expect(allowedStudyActions({ siteRole: 'member', studyRole: 'student' })).toEqual(['study.view', 'readings.log', 'comments.write']);
  });
});

describe('site-level rights', () => {
  it('admins and researcher accounts start studies; members do not', () => {
    expect(canCreateStudy('admin')).toBe(true);
    expect(canCreateStudy('researcher')).toBe(true);
    expect(canCreateStudy('member')).toBe(false);
  });
  it('only admins manage accounts', () => {
    expect(canManageAccounts('admin')).toBe(true);
    expect(canManageAccounts('researcher')).toBe(false);
    expect(canManageAccounts('member')).toBe(false);
  });
});
