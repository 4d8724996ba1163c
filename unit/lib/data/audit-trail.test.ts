import { ZodError } from 'zod';
import type { SessionUser } from '../../../src/lib/auth/session-user';
import { HISTORY_CATEGORIES } from '../../../src/lib/audit/describe-event';
import { recordAudit } from '../../../src/lib/data/audit';
import { listStudyHistory, type HistoryEvent } from '../../../src/lib/data/audit-trail';
import { createCoil } from '../../../src/lib/data/coils';
import { createStudy } from '../../../src/lib/data/studies';
import { coilCreateSchema } from '../../../src/lib/validations/coil';
import type { HistoryQueryInput } from '../../../src/lib/validations/history';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';

const SEEDED_PLAN = 'Probe tilt x depth';
const quote = (name: string) => `\u201c${name}\u201d`;

/** Every event of a study that matches the query, following the cursor page by page. */
async function everyEvent(viewer: SessionUser, studyId: number, query: HistoryQueryInput = {}): Promise<HistoryEvent[]> {
  const events: HistoryEvent[] = [];
  let before: number | undefined;
  for (;;) {
    const page = await listStudyHistory(viewer, studyId, { ...query, limit: 200, before });
    events.push(...page.events);
    if (page.nextBefore === null) return events;
    before = page.nextBefore;
  }
}

/** The issue paths of the ZodError a call throws. */
async function refusedFields(action: () => Promise<unknown>): Promise<string[]> {
  try {
    await action();
  } catch (error) {
    if (error instanceof ZodError) return error.issues.map((issue) => issue.path.join('.'));
    throw error;
  }
  throw new Error('expected the call to be refused');
}

describe('study history (audit trail)', () => {
  let padId: number;
  let planId: number;
  let researcher: SessionUser;
  let student: SessionUser;
  let supervisor: SessionUser;

  beforeAll(async () => {
    padId = await studyIdByName(SEEDED.padStudy);
    planId = (await db('sweep_plans').where({ study_id: padId, name: SEEDED_PLAN }).first('id')).id;
    [researcher, student, supervisor] = await Promise.all([SEEDED.researcher, SEEDED.student, SEEDED.supervisor].map(sessionUserByEmail));

    // Events as the review and the bench write them, on the seeded plan, plus some that concern no plan.
    const reading = await db('readings').where({ plan_id: planId }).orderBy('id').first('id');
    const entries = [
      { actorId: supervisor.id, action: 'comment.create', targetTable: 'plan_comments', targetId: 1, details: { planId, planName: SEEDED_PLAN, pointSeq: 3 } },
      { actorId: student.id, action: 'reading.create', targetTable: 'readings', targetId: reading.id, details: { plan: SEEDED_PLAN, point: 1, method: 'open_circuit' } },
      { actorId: researcher.id, action: 'coil.update', targetTable: 'coils', targetId: 1, details: { name: 'Probe helix, 12 turns', fields: ['notes'] } },
      { actorId: researcher.id, action: 'invitation.create', targetTable: 'invitations', targetId: 1, details: { email: 'history.invitee@couplet.test', role: 'student' } },
      { actorId: researcher.id, action: 'member.role.change', targetTable: 'study_members', targetId: 1, details: { userId: student.id, from: 'student', to: 'student' } },
      { actorId: supervisor.id, action: 'plan.transition', targetTable: 'sweep_plans', targetId: planId, details: { name: SEEDED_PLAN, from: 'in_review', to: 'on_bench', reason: 'redo point 3' } },
      { actorId: researcher.id, action: 'plan.transition', targetTable: 'sweep_plans', targetId: planId, details: { name: SEEDED_PLAN, from: 'draft', to: 'on_bench' } },
      { actorId: researcher.id, action: 'bench.mystery', details: { note: 'an action this version does not know' } },
    ];
    for (const entry of entries) await recordAudit(db, { studyId: padId, ...entry });
  });
  afterAll(() => db.destroy());

  it('lists a fresh study newest first, in pages that join up through the cursor', async () => {
    const study = await createStudy(researcher, { name: `History drill ${Date.now()}`, summary: '', frequencyHz: null });
    for (const n of [1, 2, 3, 4, 5]) {
      await createCoil(researcher, study.id, coilCreateSchema.parse({ name: `History coil ${n}`, spec: { kind: 'loop', radius: 0.02, wireDiameter: 0.001 } }));
    }
    const all = await listStudyHistory(researcher, study.id);
    expect(all.nextBefore).toBeNull();
    expect(all.events.map((e) => e.sentence)).toEqual([
      ...[5, 4, 3, 2, 1].map((n) => `added the coil ${quote(`History coil ${n}`)} (loop)`),
      `created the study ${quote(study.name)}`,
    ]);
    expect(all.events.every((e) => e.actor?.name === 'Ines Okafor' && !Number.isNaN(Date.parse(e.at)))).toBe(true);
    expect(all.actors).toEqual([{ id: researcher.id, name: 'Ines Okafor' }]);

    const first = await listStudyHistory(researcher, study.id, { limit: 4 });
    expect(first.events.map((e) => e.id)).toEqual(all.events.slice(0, 4).map((e) => e.id));
    expect(first.nextBefore).toBe(all.events[3].id);
    // The cursor arrives as text from the query string.
    const second = await listStudyHistory(researcher, study.id, { limit: '4', before: String(first.nextBefore) });
    expect(second.events.map((e) => e.id)).toEqual(all.events.slice(4).map((e) => e.id));
    expect(second.nextBefore).toBeNull();
  });

  it('keeps ids strictly falling across the seeded study, whatever other tests wrote', async () => {
    const events = await everyEvent(student, padId);
    expect(events.length).toBeGreaterThanOrEqual(8);
    for (let i = 1; i < events.length; i++) expect(events[i].id).toBeLessThan(events[i - 1].id);
  });

  it('tells the seed\u2019s unnamed rows with the names their targets have now', async () => {
    const seeded = (await everyEvent(student, padId)).filter((e) => e.details?.seeded === true);
    expect(seeded.find((e) => e.action === 'setup.create')?.sentence).toBe(`saved the setup ${quote('Probe 10 cm deep, upright')}`);
    expect(seeded.find((e) => e.action === 'study.create')?.sentence).toBe(`created the study ${quote(SEEDED.padStudy)}`);
  });

  it('filters by plan: the plan itself, details naming it, and its readings', async () => {
    const events = await everyEvent(supervisor, padId, { planId });
    const actions = events.map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['comment.create', 'reading.create', 'plan.transition', 'plan.create']));
    expect(actions).not.toContain('coil.update');
    expect(events.every((e) => e.planId === planId && e.planName === SEEDED_PLAN)).toBe(true);
    const seeded = events.find((e) => e.action === 'plan.create' && e.details?.seeded === true);
    expect(seeded).toMatchObject({ sentence: `created the plan ${quote(SEEDED_PLAN)}`, actor: { name: 'Ines Okafor' }, category: 'plans' });
    expect(events.find((e) => e.action === 'reading.create')?.sentence).toBe(`logged an open-circuit voltage reading at point 1 of the plan ${quote(SEEDED_PLAN)}`);
    expect(await everyEvent(supervisor, padId, { planId: 999999 })).toEqual([]);
  });

  it('filters by person and by kind, the same categories the sentences carry', async () => {
    const bySupervisor = await everyEvent(researcher, padId, { actorId: supervisor.id });
    expect(bySupervisor.length).toBeGreaterThanOrEqual(2);
    expect(bySupervisor.every((e) => e.actor?.id === supervisor.id)).toBe(true);

    const all = await everyEvent(researcher, padId);
    for (const category of HISTORY_CATEGORIES) {
      const filtered = await everyEvent(researcher, padId, { category });
      expect({ category, ids: filtered.map((e) => e.id) }).toEqual({ category, ids: all.filter((e) => e.category === category).map((e) => e.id) });
    }
    const returned = all.find((e) => e.action === 'plan.transition' && e.details?.to === 'on_bench' && e.details?.from === 'in_review');
    expect(returned).toMatchObject({ category: 'review', sentence: `returned the plan ${quote(SEEDED_PLAN)} to the bench: redo point 3` });
    expect(all.find((e) => e.action === 'bench.mystery')?.category).toBe('other');
  });

  it('names the person a role change concerns, and shows invitees\u2019 addresses only to those who manage members', async () => {
    const roleChange = (await everyEvent(student, padId, { category: 'members' })).find((e) => e.action === 'member.role.change');
    expect(roleChange?.sentence).toBe('changed the study role of Tomasz Rehn from student to student');

    const invitation = (viewer: SessionUser) => everyEvent(viewer, padId, { category: 'members' }).then((events) => events.find((e) => e.action === 'invitation.create'));
    expect((await invitation(supervisor))?.sentence).toBe('invited history.invitee@couplet.test to join as a student');
    const seenByStudent = await invitation(student);
    expect(seenByStudent?.sentence).toBe('invited someone to join as a student');
    expect(JSON.stringify(seenByStudent)).not.toContain('history.invitee');
  });

  it('is not found for someone outside the study, and refuses a bad query naming the field', async () => {
    const outsider = await sessionUserByEmail(SEEDED.otherResearcher);
    expect(await statusOf(() => listStudyHistory(outsider, padId))).toBe(404);
    expect(await statusOf(() => listStudyHistory(student, 999999))).toBe(404);
    expect(await refusedFields(() => listStudyHistory(student, padId, { limit: 0 }))).toEqual(['limit']);
    expect(await refusedFields(() => listStudyHistory(student, padId, { limit: 201 }))).toEqual(['limit']);
    expect(await refusedFields(() => listStudyHistory(student, padId, { limit: 'ten' }))).toEqual(['limit']);
    expect(await refusedFields(() => listStudyHistory(student, padId, { before: '-4', category: 'gossip' }))).toEqual(['before', 'category']);
  });
});
