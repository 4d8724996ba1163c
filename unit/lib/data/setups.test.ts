import type { CoilSpec } from '../../../src/physics/types';
import { createCoil } from '../../../src/lib/data/coils';
import { createSetup, deleteSetup, getSetup, listSetups, updateSetup } from '../../../src/lib/data/setups';
import { coilCreateSchema } from '../../../src/lib/validations/coil';
import { setupCreateSchema, type SetupCreateInput } from '../../../src/lib/validations/setup';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';

const pad: CoilSpec = { kind: 'spiral', innerRadius: 0.03, outerRadius: 0.12, turns: 6, wireDiameter: 0.0012 };
const probe: CoilSpec = { kind: 'helix', radius: 0.012, turns: 10, length: 0.02, wireDiameter: 0.0006 };
const circuit = { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 } as const;

async function issuePaths(action: () => Promise<unknown>): Promise<string[]> {
  try {
    await action();
  } catch (error) {
    return ((error as { issues?: { path: string }[] }).issues ?? []).map((issue) => issue.path);
  }
  throw new Error('expected the call to fail');
}

describe('saved setups data', () => {
  let padId: number;
  let txId: number;
  let rxId: number;
  const input = (name: string, extra: Partial<SetupCreateInput> = {}) =>
    setupCreateSchema.parse({ name, transmitterCoilId: txId, receiverCoilId: rxId, placement: { distance: 0.1, tiltDeg: 30 }, circuit, ...extra });

  beforeAll(async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    padId = await studyIdByName(SEEDED.padStudy);
    txId = (await createCoil(researcher, padId, coilCreateSchema.parse({ name: 'Setup drill pad', spec: pad }))).id;
    rxId = (await createCoil(researcher, padId, coilCreateSchema.parse({ name: 'Setup drill probe', spec: probe }))).id;
  });
  afterAll(() => db.destroy());

  it('lists the seeded setup for any member, in SI as stored', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const [seeded] = (await listSetups(student, padId)).filter((s) => s.name === 'Probe 10 cm deep, upright');
    expect(seeded).toMatchObject({
      placement: { distance: 0.1, lateralOffset: 0, tiltDeg: 0 },
      circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 },
      operatorPoint: [0.4, 0, 0.3],
      view: { position: [0.35, -0.45, 0.3], target: [0, 0, 0.05] },
    });
  });

  it('creates, updates the view and deletes, each audited; the JSON comes back exactly', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const created = await createSetup(researcher, padId, input('Tilted 30 degrees', { circuit: { ...circuit, rxCapacitance: 2.2e-10 } }));
    expect(created).toMatchObject({
      transmitterCoilId: txId, receiverCoilId: rxId, placement: { distance: 0.1, lateralOffset: 0, tiltDeg: 30 },
      circuit: { ...circuit, rxCapacitance: 2.2e-10 }, operatorPoint: null, view: null, notes: '',
    });
    expect('txCapacitance' in created.circuit).toBe(false);

    const view = { position: [0.3, -0.4, 0.25] as [number, number, number], target: [0, 0, 0.05] as [number, number, number] };
    expect((await updateSetup(researcher, padId, created.id, { view })).view).toEqual(view);
    await deleteSetup(researcher, padId, created.id);
    expect(await statusOf(() => getSetup(researcher, padId, created.id))).toBe(404);
    const actions = await db('audit_events').where({ target_table: 'setups', target_id: String(created.id) }).pluck('action');
    expect(actions).toEqual(['setup.create', 'setup.update', 'setup.delete']);
  });

  it('student and supervisor may read but not write (403); an outsider gets 404', async () => {
    const [student, supervisor, outsider] = await Promise.all([SEEDED.student, SEEDED.supervisor, SEEDED.otherResearcher].map(sessionUserByEmail));
    for (const reader of [student, supervisor]) {
      expect(await statusOf(() => listSetups(reader, padId))).toBe(200);
      expect(await statusOf(() => createSetup(reader, padId, input('Not allowed')))).toBe(403);
    }
    expect(await statusOf(() => listSetups(outsider, padId))).toBe(404);
    expect(await statusOf(() => createSetup(outsider, padId, input('Not allowed')))).toBe(404);
  });

  it('refuses a duplicate name (409), coils of another study and placements the solver cannot solve (422)', async () => {
    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const kofi = await sessionUserByEmail(SEEDED.otherResearcher);
    await createSetup(researcher, padId, input('Duplicate drill'));
    expect(await statusOf(() => createSetup(researcher, padId, input('Duplicate drill')))).toBe(409);

    const foreign = await createCoil(kofi, await studyIdByName(SEEDED.railStudy), coilCreateSchema.parse({ name: 'Rail loop', spec: probe }));
    expect(await issuePaths(() => createSetup(researcher, padId, input('Foreign coil', { receiverCoilId: foreign.id })))).toEqual(['receiverCoilId']);
    // The probe lying in the pad's plane, centred on its winding: the wires cross.
    const touching = { distance: 0, lateralOffset: 0.07, tiltDeg: 0 };
    expect(await issuePaths(() => createSetup(researcher, padId, input('Inside the pad', { placement: touching })))).toEqual(['placement']);
    const existing = await createSetup(researcher, padId, input('Moved later'));
    expect(await issuePaths(() => updateSetup(researcher, padId, existing.id, { placement: touching }))).toEqual(['placement']);
  });
});
