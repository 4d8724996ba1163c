import { transitionPlan } from '../../../src/lib/data/plans';
import { type PlanPoint } from '../../../src/lib/data/plan-points';
import { setPlanSolverPool } from '../../../src/lib/data/plan-predictions';
import { acknowledgeCautions, correctReading, createReading, getCautionAcknowledgement, listReadings } from '../../../src/lib/data/readings';
import { createAttachment } from '../../../src/lib/data/attachments';
import { createReadingFromTouchstone } from '../../../src/lib/data/readings-from-touchstone';
import { BENCH_CAUTIONS_VERSION } from '../../../src/lib/readings/bench-cautions';
import { createSourceWorker } from '../../../src/lib/solver-pool/source-worker';
import { SolverPool } from '../../../src/lib/solver-pool/solver-pool';
import { readingCorrectionSchema, readingCreateSchema, readingFromFileSchema } from '../../../src/lib/validations/reading';
import { db, SEEDED, sessionUserByEmail, statusOf } from '../../support/database';
import { createPredictedPlan } from '../../support/predicted-plan';

/**
 * Readings on a plan of this file's own, taken to the bench: who may log, the cautions gate, the
 * server's derivation, one current reading per point and method, and corrections as new versions.
 */
describe('readings data', () => {
  let padId: number;
  let planId: number;
  let points: PlanPoint[];
  let pool: SolverPool;
  const F = 6.78e6;
  const omega = 2 * Math.PI * F;
  const openCircuit = (pointId: number, rxVoltage: number, extra: object = {}) =>
    readingCreateSchema.parse({ pointId, method: 'open_circuit', raw: { frequency: F, txCurrent: 0.2, rxVoltage, phaseDeg: 89 }, accuracy: { relative: 0.01, phaseDeg: 1 }, ...extra });

  beforeAll(async () => {
    pool = new SolverPool({ size: 1, queueLimit: 64, timeoutMs: 60_000, createWorker: () => createSourceWorker() });
    setPlanSolverPool(pool);
    ({ padId, planId, points } = await createPredictedPlan({
      name: 'Readings drill', axes: [{ quantity: 'distance', displayUnit: 'cm', mode: 'list', values: [0.06, 0.1, 0.14] }],
    }));
  });
  afterAll(async () => {
    setPlanSolverPool(null);
    await pool.close();
    await db.destroy();
  });

  it('refuses readings on a draft, then asks for the cautions before the first reading', async () => {
    const [researcher, student] = await Promise.all([SEEDED.researcher, SEEDED.student].map(sessionUserByEmail));
    expect(await statusOf(() => createReading(student, padId, planId, openCircuit(points[0].id, 1)))).toBe(409);
    await transitionPlan(researcher, padId, planId, { to: 'on_bench' });
    // on the bench now, but the student has not acknowledged the cautions
    await expect(createReading(student, padId, planId, openCircuit(points[0].id, 1))).rejects.toMatchObject({ status: 409, issues: [{ path: 'cautions' }] });
    expect((await getCautionAcknowledgement(student, padId, planId)).acknowledgedAt).toBeNull();
    await acknowledgeCautions(student, padId, planId, BENCH_CAUTIONS_VERSION);
    await acknowledgeCautions(student, padId, planId, BENCH_CAUTIONS_VERSION); // twice is harmless
    expect((await getCautionAcknowledgement(student, padId, planId)).acknowledgedAt).not.toBeNull();
    expect(await db('caution_acknowledgements').where({ plan_id: planId }).count({ n: '*' }).first()).toEqual({ n: 1 });
    // a changed wording needs a new acknowledgement
    expect(await statusOf(() => acknowledgeCautions(student, padId, planId, 'older'))).toBe(409);
  });

  it('derives M on the server by the open-circuit formula and keeps the raw values', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const reading = await createReading(student, padId, planId, openCircuit(points[0].id, 0.5));
    // Keysight Impedance Measurement Handbook (mutual inductance): M = |V2| / (omega |I1|)
    expect(reading.derived.mutualInductance!.value).toBeCloseTo(0.5 / (omega * 0.2), 15);
    expect(reading.derived.mutualInductance!.uncertainty).toBeGreaterThan(0);
    expect(reading.derived.formula).toMatchObject({ id: expect.any(String), version: 1 });
    // with the predicted self-inductances of the point, k follows
    const predicted = points[0].predicted!;
    expect(reading.derived.coupling!.value).toBeCloseTo(reading.derived.mutualInductance!.value / Math.sqrt(predicted.txSelfInductance * predicted.rxSelfInductance), 12);
    expect(reading).toMatchObject({ version: 1, current: true, pointSeq: points[0].seq, raw: { rxVoltage: 0.5, txCurrent: 0.2 }, source: 'form', createdBy: { id: student.id } });
    const audit = await db('audit_events').where({ action: 'reading.create', target_id: String(reading.id) }).first();
    expect(audit).toBeDefined();
  });

  it('keeps one current reading per point and method: a second one is refused, another method is not', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    expect(await statusOf(() => createReading(student, padId, planId, openCircuit(points[0].id, 0.6)))).toBe(409);
    const power = await createReading(student, padId, planId, readingCreateSchema.parse({ pointId: points[0].id, method: 'direct_power', raw: { inputPower: 2, outputPower: 1.5 } }));
    // efficiency = Pout / Pin
    expect(power.derived.efficiency!.value).toBeCloseTo(0.75, 12);
  });

  it('corrects by adding a version with the reason; the earlier version stays', async () => {
    const [student, researcher] = await Promise.all([SEEDED.student, SEEDED.researcher].map(sessionUserByEmail));
    const [first] = (await listReadings(student, padId, planId)).filter((r) => r.method === 'open_circuit' && r.pointId === points[0].id);
    const correction = readingCorrectionSchema.parse({ ...openCircuit(points[0].id, 0.52), pointId: undefined, reason: 'Scope probe was on x1, not x10' });
    // only the person who logged it corrects it
    expect(await statusOf(() => correctReading(researcher, padId, planId, first.id, correction))).toBe(409); // the researcher has not acknowledged yet
    await acknowledgeCautions(researcher, padId, planId, BENCH_CAUTIONS_VERSION);
    expect(await statusOf(() => correctReading(researcher, padId, planId, first.id, correction))).toBe(403);
    const second = await correctReading(student, padId, planId, first.id, correction);
    expect(second).toMatchObject({ version: 2, supersedesId: first.id, correctionReason: 'Scope probe was on x1, not x10', current: true });
    expect(second.derived.mutualInductance!.value).toBeCloseTo(0.52 / (omega * 0.2), 15);
    // the superseded version can no longer be corrected, and a correction keeps the method
    expect(await statusOf(() => correctReading(student, padId, planId, first.id, correction))).toBe(409);
    const switched = readingCorrectionSchema.parse({ method: 'split_peaks', raw: { lowPeak: 6.5e6, highPeak: 7e6 }, reason: 'other method' });
    expect(await statusOf(() => correctReading(student, padId, planId, second.id, switched))).toBe(422);
    const history = (await listReadings(student, padId, planId)).filter((r) => r.method === 'open_circuit' && r.pointId === points[0].id);
    expect(history.map((r) => [r.version, r.current, r.raw.rxVoltage])).toEqual([[1, false, 0.5], [2, true, 0.52]]);
    const stored = await db('readings').where({ id: first.id }).first('raw');
    expect(JSON.parse(typeof stored.raw === 'string' ? stored.raw : JSON.stringify(stored.raw))).toMatchObject({ rxVoltage: 0.5 });
  });

  it('answers bad and impossible raw values with the field at fault', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const missing = readingCreateSchema.safeParse({ pointId: points[1].id, method: 'open_circuit', raw: { frequency: F, txCurrent: 0.1 } });
    expect(missing.success).toBe(false);
    expect(missing.error!.issues.map((i) => i.path.join('.'))).toEqual(['raw.rxVoltage']);
    const unknown = readingCreateSchema.safeParse({ pointId: points[1].id, method: 'open_circuit', raw: { frequency: F, txCurrent: 0.1, rxVoltage: 1, volts: 3 } });
    expect(unknown.error!.issues.map((i) => i.path.join('.'))).toEqual(['raw.volts']);
    const negative = readingCreateSchema.safeParse({ pointId: points[1].id, method: 'aiding_opposing', raw: { aidingInductance: -1e-6, opposingInductance: 1e-6 } });
    expect(negative.error!.issues.map((i) => i.path.join('.'))).toEqual(['raw.aidingInductance']);
    // short above open has no real k: the derivation refuses it at the field
    const shortAboveOpen = readingCreateSchema.parse({ pointId: points[1].id, method: 'short_open', raw: { shortInductance: 2e-6, openInductance: 1e-6 } });
    await expect(createReading(student, padId, planId, shortAboveOpen)).rejects.toMatchObject({ status: 422, issues: [{ path: 'raw.shortInductance' }] });
    const foreignPoint = openCircuit(999999999, 1);
    await expect(createReading(student, padId, planId, foreignPoint)).rejects.toMatchObject({ status: 422, issues: [{ path: 'pointId' }] });
  });

  it('reads a two-port reading from an attached Touchstone file and names the file', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    // Touchstone 1.0: Z parameters are normalised to R, so R 1 stores ohms as they are; 2-port data
    // lines are ordered N11 N21 N12 N22 (Touchstone File Format Specification 1.1).
    const file = ['! coupled coils, invented values', '# MHz Z RI R 1', '6.70 0.5 421 0.01 21.0 0.01 21.0 0.5 421', '6.78 0.5 426 0.01 21.3 0.01 21.3 0.5 426'].join('\n');
    const attachment = await createAttachment(student, padId, planId, { kind: 'instrument', pointId: points[1].id, fileName: 'vna-point2.s2p', caption: null, bytes: Buffer.from(file) });
    const reading = await createReadingFromTouchstone(student, padId, planId, readingFromFileSchema.parse({ pointId: points[1].id, attachmentId: attachment.id }));
    // Keysight Impedance Measurement Handbook: M = Im(Z21) / omega, k = Im Z21 / sqrt(Im Z11 Im Z22)
    expect(reading).toMatchObject({ method: 'two_port', source: 'touchstone', attachmentId: attachment.id, raw: { frequency: F, z21Im: 21.3 } });
    expect(reading.derived.mutualInductance!.value).toBeCloseTo(21.3 / omega, 15);
    expect(reading.derived.coupling!.value).toBeCloseTo(21.3 / 426, 12);
    // a frequency the file does not have: the nearest point is used, and the reading says so
    const nearest = await createReadingFromTouchstone(student, padId, planId, readingFromFileSchema.parse({ pointId: points[2].id, attachmentId: attachment.id, frequency: 6.6e6 }));
    expect(nearest.raw.frequency).toBe(6.7e6);
    expect(nearest.derived.warnings.join(' ')).toMatch(/no data at 6600000 Hz; the nearest point, 6700000 Hz/);
    const notTouchstone = await createAttachment(student, padId, planId, { kind: 'instrument', pointId: null, fileName: 'notes.s2p', caption: null, bytes: Buffer.from('# MHz Q XX R 50\n1 2 3') });
    await expect(createReadingFromTouchstone(student, padId, planId, readingFromFileSchema.parse({ pointId: points[1].id, attachmentId: notTouchstone.id })))
      .rejects.toMatchObject({ status: 422, issues: [{ path: 'attachmentId' }] });
  });

  it('lets students and researchers log; supervisors, admins and outsiders cannot', async () => {
    const [supervisor, admin, outsider] = await Promise.all([SEEDED.supervisor, SEEDED.admin, SEEDED.otherResearcher].map(sessionUserByEmail));
    expect(await statusOf(() => createReading(supervisor, padId, planId, openCircuit(points[2].id, 1)))).toBe(403);
    // the role is refused before the file is looked up, whatever file is named
    expect(await statusOf(() => createReadingFromTouchstone(supervisor, padId, planId, readingFromFileSchema.parse({ pointId: points[2].id, attachmentId: 999999999 })))).toBe(403);
    expect(await statusOf(() => acknowledgeCautions(supervisor, padId, planId, BENCH_CAUTIONS_VERSION))).toBe(403);
    expect(await statusOf(() => createReading(admin, padId, planId, openCircuit(points[2].id, 1)))).toBe(403);
    expect(await statusOf(() => createReading(outsider, padId, planId, openCircuit(points[2].id, 1)))).toBe(404);
    expect(await statusOf(() => listReadings(outsider, padId, planId))).toBe(404);
    expect(await statusOf(() => listReadings(supervisor, padId, planId))).toBe(200);
  });

  it('seeds the demo lab with derived readings on its bench plan', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const plan = await db('sweep_plans').where({ study_id: padId, name: 'Probe tilt x depth' }).first('id');
    const seeded = await listReadings(student, padId, plan.id);
    expect(seeded.length).toBeGreaterThan(0);
    expect(seeded.every((r) => r.derived.formula.id && (r.derived.mutualInductance ?? r.derived.efficiency))).toBe(true);
  });
});
