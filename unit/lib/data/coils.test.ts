import { coilProperties } from '../../../src/physics';
import type { CoilSpec } from '../../../src/physics/types';
import { createCoil, deleteCoil, getCoil, listCoils, updateCoil } from '../../../src/lib/data/coils';
import { createSetup } from '../../../src/lib/data/setups';
import { createStudy } from '../../../src/lib/data/studies';
import { coilCreateSchema } from '../../../src/lib/validations/coil';
import { setupCreateSchema } from '../../../src/lib/validations/setup';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';

const loop: CoilSpec = { kind: 'loop', radius: 0.02, wireDiameter: 0.001 };
const helix: CoilSpec = { kind: 'helix', radius: 0.012, turns: 10, length: 0.02, wireDiameter: 0.0006 };
const coilInput = (name: string, spec: CoilSpec = loop) => coilCreateSchema.parse({ name, spec });
const setupInput = (name: string, transmitterCoilId: number, receiverCoilId: number) =>
  setupCreateSchema.parse({
    name, transmitterCoilId, receiverCoilId, placement: { distance: 0.08 },
    circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 },
  });

/** The error a call throws, for its status and message. */
async function failureOf(action: () => Promise<unknown>): Promise<{ status?: number; message: string; issues?: { path: string }[] }> {
  try {
    await action();
  } catch (error) {
    return error as { status?: number; message: string };
  }
  throw new Error('expected the call to fail');
}

describe('coil library data', () => {
  afterAll(() => db.destroy());

  it('lists the seeded coils for any member, with predictions at the study frequency (src/physics coilProperties)', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const coils = await listCoils(student, await studyIdByName(SEEDED.padStudy));
    expect(coils.map((c) => c.name)).toEqual(expect.arrayContaining(['Bench pad, flat spiral', 'Probe helix, 12 turns', 'Probe loop, single turn']));
    for (const coil of coils) {
      const expected = coilProperties(coil.spec, 6.78e6);
      expect(coil.predicted).toEqual({
        frequencyHz: 6.78e6, selfInductance: expected.selfInductance, dcResistance: expected.dcResistance, acResistance: expected.acResistance,
      });
    }
    const probe = coils.find((c) => c.name === 'Probe helix, 12 turns')!;
    expect(probe).toMatchObject({ wireLabel: 'AWG 22', measured: { inductance: 2.21e-6, frequencyHz: 6.78e6 } });
  });

  it('an outsider gets 404 for reading and writing; student and supervisor get 403 for writing', async () => {
    const padId = await studyIdByName(SEEDED.padStudy);
    const [outsider, student, supervisor, researcher] = await Promise.all(
      [SEEDED.otherResearcher, SEEDED.student, SEEDED.supervisor, SEEDED.researcher].map(sessionUserByEmail),
    );
    const coil = await createCoil(researcher, padId, coilInput('Role drill coil'));
    expect(await statusOf(() => listCoils(outsider, padId))).toBe(404);
    expect(await statusOf(() => getCoil(outsider, padId, coil.id))).toBe(404);
    expect(await statusOf(() => createCoil(outsider, padId, coilInput('Outsider coil')))).toBe(404);
    for (const reader of [student, supervisor]) {
      expect(await statusOf(() => getCoil(reader, padId, coil.id))).toBe(200);
      expect(await statusOf(() => createCoil(reader, padId, coilInput('Student coil')))).toBe(403);
      expect(await statusOf(() => updateCoil(reader, padId, coil.id, { name: 'Renamed' }))).toBe(403);
      expect(await statusOf(() => deleteCoil(reader, padId, coil.id))).toBe(403);
    }
    expect(await db('coils').where({ study_id: padId, name: 'Student coil' }).first()).toBeUndefined();
  });

  it('a coil of another study is not found through this study', async () => {
    const padId = await studyIdByName(SEEDED.padStudy);
    const railId = await studyIdByName(SEEDED.railStudy);
    const kofi = await sessionUserByEmail(SEEDED.otherResearcher);
    const admin = await sessionUserByEmail(SEEDED.admin);
    const railCoil = await createCoil(kofi, railId, coilInput('Dock loop'));
    expect(await statusOf(() => getCoil(admin, padId, railCoil.id))).toBe(404);
    expect(await statusOf(() => deleteCoil(admin, padId, railCoil.id))).toBe(404);
  });

  it('creates with an audit row, and refuses a duplicate name with 409 writing nothing', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const padId = await studyIdByName(SEEDED.padStudy);
    const created = await createCoil(researcher, padId, coilInput('Audit drill helix', helix));
    expect(created).toMatchObject({ name: 'Audit drill helix', spec: helix, studyId: padId, notes: '', wireLabel: null });
    const audit = await db('audit_events').where({ action: 'coil.create', target_id: String(created.id) }).first();
    expect(audit?.actor_id).toBe(researcher.id);

    const before = await db('coils').count({ n: '*' }).first();
    const failure = await failureOf(() => createCoil(researcher, padId, coilInput('Audit drill helix')));
    expect(failure.status).toBe(409);
    expect(failure.issues?.map((i) => i.path)).toEqual(['name']);
    expect(await db('coils').count({ n: '*' }).first()).toEqual(before);

    const other = await createCoil(researcher, padId, coilInput('Audit drill loop'));
    expect(await statusOf(() => updateCoil(researcher, padId, other.id, { name: 'Audit drill helix' }))).toBe(409);
  });

  it('updates spec and measured values; a gauge label that no longer matches is refused (422)', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const padId = await studyIdByName(SEEDED.padStudy);
    const awg18 = 0.005 * 0.0254 * 92 ** ((36 - 18) / 39); // ASTM B258
    const coil = await createCoil(researcher, padId, coilCreateSchema.parse({ name: 'Gauge drill', spec: { ...loop, wireDiameter: awg18 }, wireLabel: 'AWG 18' }));
    const failure = await failureOf(() => updateCoil(researcher, padId, coil.id, { spec: loop }));
    expect(failure.status).toBe(422);
    expect(failure.issues?.map((i) => i.path)).toEqual(['wireLabel']);

    const measured = { inductance: 1.1e-7, resistance: 0.05, qualityFactor: null, frequencyHz: 1e6 };
    const updated = await updateCoil(researcher, padId, coil.id, { spec: loop, wireLabel: null, measured });
    expect(updated).toMatchObject({ spec: loop, wireLabel: null, measured });
    expect(updated.predicted?.selfInductance).toBe(coilProperties(loop, 6.78e6).selfInductance);
  });

  it('gives no prediction in a study without an operating frequency', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const study = await createStudy(researcher, { name: 'Coils without a frequency', summary: '', frequencyHz: null });
    expect((await createCoil(researcher, study.id, coilInput('Bare loop'))).predicted).toBeNull();
  });

  it('refuses to delete a coil while setups use it, naming each setup; deletes it once they are gone', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const padId = await studyIdByName(SEEDED.padStudy);
    const tx = await createCoil(researcher, padId, coilInput('Delete drill pad', { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.12, turns: 6, wireDiameter: 0.0012 }));
    const rx = await createCoil(researcher, padId, coilInput('Delete drill probe', helix));
    const first = await createSetup(researcher, padId, setupInput('Drill setup A', tx.id, rx.id));
    await createSetup(researcher, padId, setupInput('Drill setup B', tx.id, rx.id));

    const failure = await failureOf(() => deleteCoil(researcher, padId, rx.id));
    expect(failure.status).toBe(409);
    expect(failure.message).toBe('“Delete drill probe” is used by setup “Drill setup A” and setup “Drill setup B”. Delete or change them first.');
    expect(await db('coils').where({ id: rx.id }).first()).toBeDefined();

    await db('setups').where({ study_id: padId }).whereIn('name', ['Drill setup B']).del();
    const single = await failureOf(() => deleteCoil(researcher, padId, rx.id));
    expect(single.message).toBe('“Delete drill probe” is used by setup “Drill setup A”. Delete or change it first.');

    await db('setups').where({ id: first.id }).del();
    expect(await statusOf(() => deleteCoil(researcher, padId, rx.id))).toBe(200);
    expect(await db('coils').where({ id: rx.id }).first()).toBeUndefined();
    expect(await db('audit_events').where({ action: 'coil.delete', target_id: String(rx.id) }).first()).toBeDefined();
  });

  it('the seeded setup keeps its coils from being deleted', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const padId = await studyIdByName(SEEDED.padStudy);
    const pad = await db('coils').where({ study_id: padId, name: 'Bench pad, flat spiral' }).first('id');
    const failure = await failureOf(() => deleteCoil(researcher, padId, pad.id));
    expect(failure.status).toBe(409);
    expect(failure.message).toContain('setup “Probe 10 cm deep, upright”');
  });
});
