import { createStudy, getStudy, listStudiesFor } from '../../../src/lib/data/studies';
import { db, SEEDED, sessionUserByEmail, statusOf } from '../../support/database';

describe('studies data', () => {
  afterAll(() => db.destroy());

  it('lists only the studies a member is on, with their role', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const studies = await listStudiesFor(student);
    expect(studies.map((s) => [s.name, s.myRole])).toEqual([[SEEDED.padStudy, 'student']]);
    expect(studies[0].memberCount).toBe(3);
  });

  it('lists every study for the site admin, with no role of their own', async () => {
    const admin = await sessionUserByEmail(SEEDED.admin);
    const names = (await listStudiesFor(admin)).map((s) => s.name);
    expect(names).toEqual(expect.arrayContaining([SEEDED.padStudy, SEEDED.railStudy]));
    expect((await listStudiesFor(admin)).every((s) => s.myRole === null)).toBe(true);
  });

  it('refuses study creation to a member account (403) and writes nothing', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const before = await db('studies').count({ n: '*' }).first();
    expect(await statusOf(() => createStudy(student, { name: 'Student study', summary: '', frequencyHz: null }))).toBe(403);
    expect(await db('studies').count({ n: '*' }).first()).toEqual(before);
  });

  it('creates a study with its creator as researcher, audited, and refuses a duplicate name with 409', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const created = await createStudy(researcher, { name: 'Probe depth survey', summary: 'Depth only.', frequencyHz: 6.78e6 });
    expect(created).toMatchObject({ name: 'Probe depth survey', myRole: 'researcher', memberCount: 1, frequencyHz: 6.78e6 });
    const audit = await db('audit_events').where({ study_id: created.id, action: 'study.create' }).first();
    expect(audit?.actor_id).toBe(researcher.id);

    const countBefore = await db('studies').count({ n: '*' }).first();
    expect(await statusOf(() => createStudy(researcher, { name: 'Probe depth survey', summary: '', frequencyHz: null }))).toBe(409);
    expect(await db('studies').count({ n: '*' }).first()).toEqual(countBefore);
  });

  it('getStudy gives 404 to an outsider and the allowed actions to a member', async () => {
    const outsider = await sessionUserByEmail(SEEDED.otherResearcher);
    const supervisor = await sessionUserByEmail(SEEDED.supervisor);
    const padId = (await db('studies').where({ name: SEEDED.padStudy }).first('id')).id;
    expect(await statusOf(() => getStudy(outsider, padId))).toBe(404);
    const seen = await getStudy(supervisor, padId);
    expect(seen.allowedActions).toEqual(['study.view', 'members.manage', 'comments.write', 'plan.decide', 'review.analyse']);
    expect(seen.createdBy.name).toBe('Ines Okafor');
  });
});
