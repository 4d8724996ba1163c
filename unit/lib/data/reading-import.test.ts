import { transitionPlan } from '../../../src/lib/data/plans';
import { RUN_SHEET_COLUMNS, type PlanPoint } from '../../../src/lib/data/plan-points';
import { setPlanSolverPool } from '../../../src/lib/data/plan-predictions';
import { getColumnMap } from '../../../src/lib/data/reading-column-maps';
import { commitReadingImport, previewReadingImport, ReadingImportRefused, REPORTED_PROBLEM_ROWS } from '../../../src/lib/data/reading-import';
import { acknowledgeCautions, listReadings } from '../../../src/lib/data/readings';
import { BENCH_CAUTIONS_VERSION } from '../../../src/lib/readings/bench-cautions';
import { guessMapping, type CsvColumnMap } from '../../../src/lib/readings/csv-mapping';
import { createSourceWorker } from '../../../src/lib/solver-pool/source-worker';
import { SolverPool } from '../../../src/lib/solver-pool/solver-pool';
import { csvColumnMapSchema } from '../../../src/lib/validations/reading-import';
import { db, SEEDED, sessionUserByEmail, statusOf, studyIdByName } from '../../support/database';
import { createPredictedPlan } from '../../support/predicted-plan';

/** M = |V2| / (ω |I1|) (Keysight Impedance Measurement Handbook, mutual inductance): same formula, same doubles. */
const SAME_FORMULA_TOLERANCE = 1e-12;
const FREQUENCY_HZ = 6.78e6;
const TX_CURRENT_A = 0.25;

/** The refusal an import throws, or null when it went through. */
async function refusalOf(action: () => Promise<unknown>): Promise<ReadingImportRefused | null> {
  try {
    await action();
    return null;
  } catch (error) {
    if (error instanceof ReadingImportRefused) return error;
    throw error;
  }
}

describe('CSV import of readings', () => {
  let pool: SolverPool;
  let padId: number;
  let planId: number;
  let points: PlanPoint[];
  let mapping: CsvColumnMap;
  const count = async () => Number((await db('readings').where({ plan_id: planId }).count({ n: '*' }).first())!.n);

  /** An open-circuit row of a point, V2 in mV from its predicted M unless given (a cell as typed). */
  const openCircuitLine = (p: PlanPoint, rxVoltage: number | string = 2 * Math.PI * FREQUENCY_HZ * Math.abs(p.predicted!.mutualInductance) * TX_CURRENT_A) =>
    `${p.seq},${p.repeatIndex},open_circuit,${FREQUENCY_HZ / 1e6},${TX_CURRENT_A * 1e3},${typeof rxVoltage === 'number' ? Number((rxVoltage * 1e3).toPrecision(6)) : rxVoltage}`;
  const HEADER = 'seq,repeat,method,f_MHz,I1_mA,V2_mV,Pin_W,Pout_W';

  beforeAll(async () => {
    pool = new SolverPool({ size: 1, queueLimit: 64, timeoutMs: 60_000, createWorker: () => createSourceWorker() });
    setPlanSolverPool(pool);
    ({ padId, planId, points } = await createPredictedPlan({
      name: 'CSV import drill', repeats: 2, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null, notes: '',
      axes: [
        { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'list', values: [0, 30] },
        { quantity: 'distance', displayUnit: 'cm', mode: 'list', values: [0.05, 0.1] },
      ],
    }));
    await transitionPlan(await sessionUserByEmail(SEEDED.researcher), padId, planId, { to: 'on_bench' });
    mapping = csvColumnMapSchema.parse(guessMapping(HEADER.split(',')));
  });

  afterAll(async () => {
    await db('readings').where({ plan_id: planId }).del();
    await db('sweep_plans').where({ id: planId }).del();
    await db('reading_column_maps').where({ study_id: padId }).del();
    setPlanSolverPool(null);
    await pool.close();
    await db.destroy();
  });

  it('guesses this file’s mapping: a method column and the units in the names', () => {
    expect(points.map((p) => [p.seq, p.repeatIndex])).toEqual([[1, 1], [2, 2], [3, 1], [4, 2], [5, 1], [6, 2], [7, 1], [8, 2]]);
    expect(mapping).toMatchObject({
      seqColumn: 'seq', repeatColumn: 'repeat', method: null, methodColumn: 'method',
      fields: { frequency: { column: 'f_MHz', unit: 'MHz' }, txCurrent: { column: 'I1_mA', unit: 'mA' }, rxVoltage: { column: 'V2_mV', unit: 'mV' }, inputPower: { column: 'Pin_W', unit: 'W' }, outputPower: { column: 'Pout_W', unit: 'W' } },
    });
  });

  it('asks for the bench cautions before the first import, and keeps supervisors (403) and outsiders (404) out', async () => {
    const [student, supervisor, outsider] = await Promise.all([SEEDED.student, SEEDED.supervisor, SEEDED.otherResearcher].map(sessionUserByEmail));
    const csv = `${HEADER}\n${openCircuitLine(points[0])}\n`;
    expect(await statusOf(() => previewReadingImport(student, padId, planId, { csv, mapping }))).toBe(409);
    await acknowledgeCautions(student, padId, planId, BENCH_CAUTIONS_VERSION);
    expect(await statusOf(() => previewReadingImport(student, padId, planId, { csv, mapping }))).toBe(200);
    expect(await statusOf(() => previewReadingImport(supervisor, padId, planId, { csv, mapping }))).toBe(403);
    expect(await statusOf(() => commitReadingImport(supervisor, padId, planId, { csv, mapping }))).toBe(403);
    expect(await statusOf(() => previewReadingImport(outsider, padId, planId, { csv, mapping }))).toBe(404);
    expect(await statusOf(() => commitReadingImport(outsider, padId, planId, { csv, mapping }))).toBe(404);
    expect(await count()).toBe(0);
  });

  it('stores nothing from a file with one bad row and reports the row; fixed, it imports every row', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const lines = points.map((p) => openCircuitLine(p));
    lines[3] = openCircuitLine(points[3], '12 kg');
    const bad = `${HEADER}\n${lines.join('\n')}\n`;

    const preview = await previewReadingImport(student, padId, planId, { csv: bad, mapping });
    expect(preview).toMatchObject({ total: 8, withProblems: 1, fileProblems: [] });
    expect(preview.rows.find((r) => r.problems.length > 0)).toEqual({
      line: 5, seq: 4, method: 'open_circuit', derived: null,
      problems: [{ field: 'raw.rxVoltage', column: 'V2_mV', message: expect.stringContaining('"12 kg" is not a voltage') }],
    });
    const good = preview.rows.find((r) => r.seq === 1)!;
    expect(good.derived!.mutualInductance! / points[0].predicted!.mutualInductance - 1).toBeLessThan(1e-5);

    const refusal = await refusalOf(() => commitReadingImport(student, padId, planId, { csv: bad, mapping, fileName: 'bench-day-1.csv' }));
    expect(refusal?.status).toBe(422);
    expect(refusal?.issues).toEqual([{ path: 'rows.5.raw.rxVoltage', message: expect.stringContaining('not a voltage') }]);
    expect(refusal?.report.withProblems).toBe(1);
    expect(await count()).toBe(0);
    expect(await db('reading_column_maps').where({ study_id: padId }).first()).toBeUndefined();
    expect(await db('audit_events').where({ action: 'readings.import', target_id: String(planId) }).first()).toBeUndefined();

    lines[3] = openCircuitLine(points[3]);
    const result = await commitReadingImport(student, padId, planId, { csv: `${HEADER}\n${lines.join('\n')}\n`, mapping, fileName: 'bench-day-1.csv' });
    expect(result.count).toBe(8);
    const readings = await listReadings(student, padId, planId);
    expect(readings).toHaveLength(8);
    for (const [i, reading] of readings.entries()) {
      expect(reading).toMatchObject({ pointSeq: i + 1, version: 1, method: 'open_circuit', source: 'csv', importId: result.importId, createdBy: { id: student.id } });
      const expected = reading.raw.rxVoltage / (2 * Math.PI * reading.raw.frequency * reading.raw.txCurrent);
      expect(Math.abs(reading.derived.mutualInductance!.value / expected - 1)).toBeLessThan(SAME_FORMULA_TOLERANCE);
    }
    const audit = await db('audit_events').where({ action: 'readings.import', target_id: String(planId) }).first('details', 'actor_id');
    expect(audit.actor_id).toBe(student.id);
    expect(typeof audit.details === 'string' ? JSON.parse(audit.details) : audit.details).toEqual({ plan: 'CSV import drill', count: 8, importId: result.importId, fileName: 'bench-day-1.csv' });
  });

  it('reports duplicates in the file, points already read, unknown points, a wrong repeat and a value no formula can use', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const rows = [
      '1,1,direct_power,,,,1.2,0.9', // line 2
      '1,1,Direct power,,,,1.1,0.8', // line 3: point 1 by direct power again
      openCircuitLine(points[1]), // line 4: point 2 was imported above
      '99,1,direct_power,,,,1.2,0.9', // line 5
      '3,2,direct_power,,,,1.2,0.9', // line 6: point 3 is repeat 1
      '5,1,direct_power,,,,0,0', // line 7: no power into the transmitter
    ];
    const csv = `${HEADER}\n${rows.join('\n')}\n`;
    const preview = await previewReadingImport(student, padId, planId, { csv, mapping });
    expect(preview).toMatchObject({ total: 6, withProblems: 5 });
    const byLine = new Map(preview.rows.map((r) => [r.line, r.problems.map((p) => `${p.field}: ${p.message}`)]));
    expect(byLine.get(2)).toEqual([]);
    expect(byLine.get(3)).toEqual(['seq: Point 1 has a reading by direct power on line 2 already; keep one per point and method.']);
    expect(byLine.get(4)).toEqual([expect.stringMatching(/^seq: Point 2 already has a reading by open-circuit voltage; correct it/)]);
    expect(byLine.get(5)).toEqual(['seq: This plan has no point 99; its points are 1 to 8.']);
    expect(byLine.get(6)).toEqual(['repeat: Point 3 is repeat 1 on the run sheet, not 2; check the seq.']);
    expect(byLine.get(7)).toEqual([expect.stringMatching(/^raw\.inputPower: /)]);

    const refusal = await refusalOf(() => commitReadingImport(student, padId, planId, { csv, mapping }));
    expect(refusal?.issues.map((i) => i.path)).toEqual(['rows.3.seq', 'rows.4.seq', 'rows.5.seq', 'rows.6.repeat', 'rows.7.raw.inputPower']);
    expect(await count()).toBe(8);
  });

  it('lists the rows with problems up to its cap and the first good rows, and counts every row', async () => {
    const student = await sessionUserByEmail(SEEDED.student);
    const good = points.map((p) => `${p.seq},${p.repeatIndex},direct_power,,,,1.2,0.9`);
    const unknown = Array.from({ length: REPORTED_PROBLEM_ROWS + 100 }, (_, i) => `${1000 + i},1,direct_power,,,,1.2,0.9`);
    const preview = await previewReadingImport(student, padId, planId, { csv: `${HEADER}\n${[...good, ...unknown].join('\n')}\n`, mapping });
    expect(preview).toMatchObject({ total: 8 + REPORTED_PROBLEM_ROWS + 100, withProblems: REPORTED_PROBLEM_ROWS + 100, unlistedProblemRows: 100 });
    expect(preview.rows).toHaveLength(8 + REPORTED_PROBLEM_ROWS);
    expect(preview.rows.slice(0, 8).map((r) => r.derived?.efficiency)).toEqual(Array(8).fill(0.75));
  });

  it('remembers the mapping of the last import for everyone on the study', async () => {
    const [student, supervisor, outsider] = await Promise.all([SEEDED.student, SEEDED.supervisor, SEEDED.otherResearcher].map(sessionUserByEmail));
    expect((await getColumnMap(student, padId))?.mapping).toEqual(mapping);
    expect((await getColumnMap(supervisor, padId))?.mapping).toEqual(mapping);
    expect(await statusOf(() => getColumnMap(outsider, padId))).toBe(404);
    expect(await getColumnMap(outsider, await studyIdByName(SEEDED.railStudy))).toBeNull();
    // a later file with other names for some columns keeps the remembered ones it still has
    const remembered = (await getColumnMap(student, padId))!.mapping;
    expect(guessMapping(['seq', 'method', 'f_MHz', 'Itx (mA)', 'V2_mV'], remembered).fields.txCurrent).toEqual({ column: 'Itx (mA)', unit: 'mA' });
  });

  it('never guesses the run sheet’s own planned and predicted columns as readings', () => {
    const names = RUN_SHEET_COLUMNS.map((c) => c.name);
    const guess = guessMapping(names);
    expect(guess).toMatchObject({ seqColumn: 'seq', repeatColumn: 'repeat', fields: {} });
    expect(Object.values(guess.circumstances).filter((v) => typeof v === 'string')).toEqual([]);
  });
});
