/**
 * Hostile JSON at the plan, reading and review routes (property-based, fast-check), as in
 * fuzz-json-routes.test.ts: every answer is below 500, a 4xx names what went wrong (a 422 each field),
 * and a refused write leaves every table unchanged. Replay a failure with FUZZ_SEED and FUZZ_RUNS.
 */
import fc from 'fast-check';
import { actAs } from '../../support/acting-user';
import { DEFAULT_MAX_BODY_BYTES } from '@/lib/http/respond';
import { MEASUREMENT_METHODS, METHOD_SPECS } from '@/physics/measurement/methods';
import { BENCH_CAUTIONS_VERSION } from '@/lib/readings/bench-cautions';
import type { SolverPool } from '@/lib/solver-pool/solver-pool';
import { CSV_MAX_BYTES } from '@/lib/validations/reading-import';
import * as planRoute from '@/app/api/studies/[studyId]/plans/[planId]/route';
import * as cautionsRoute from '@/app/api/studies/[studyId]/plans/[planId]/cautions/route';
import * as commentsRoute from '@/app/api/studies/[studyId]/plans/[planId]/comments/route';
import * as correctionsRoute from '@/app/api/studies/[studyId]/plans/[planId]/readings/[readingId]/corrections/route';
import * as touchstoneRoute from '@/app/api/studies/[studyId]/plans/[planId]/readings/from-touchstone/route';
import * as importRoute from '@/app/api/studies/[studyId]/plans/[planId]/readings/import/route';
import * as readingsRoute from '@/app/api/studies/[studyId]/plans/[planId]/readings/route';
import * as fitsRoute from '@/app/api/studies/[studyId]/plans/[planId]/review/fits/route';
import * as marksRoute from '@/app/api/studies/[studyId]/plans/[planId]/review/marks/route';
import * as reviewRoute from '@/app/api/studies/[studyId]/plans/[planId]/review/route';
import * as toleranceRoute from '@/app/api/studies/[studyId]/plans/[planId]/review/tolerance/route';
import * as transitionRoute from '@/app/api/studies/[studyId]/plans/[planId]/transition/route';
import * as plansRoute from '@/app/api/studies/[studyId]/plans/route';
import { db } from '../../support/database';
import { awkwardTextBody, FUZZ_SEED } from '../../support/fuzz-json';
import { fuzzIdParams, fuzzJsonRoute, fuzzQueryRoute, closeFuzzWorld, openFuzzWorld, type Baseline, type FuzzStudy, type JsonRouteCase } from '../../support/fuzz-fixtures';

jest.mock('@/lib/auth/session', () => jest.requireActual('../../support/acting-user').sessionStandIn);

/** The import reads the file's text inside JSON: room for the file, its escaping and the mapping. */
const IMPORT_MAX_BODY_BYTES = CSV_MAX_BYTES + 1024 * 1024;

describe(`plan routes refuse hostile bodies with 4xx and field paths (FUZZ_SEED=${FUZZ_SEED})`, () => {
  let pool: SolverPool;
  let base: Baseline;
  let fx: FuzzStudy;

  beforeAll(async () => {
    ({ pool, base, fx } = await openFuzzWorld('Fuzz plans'));
  }, 120_000);

  afterAll(async () => {
    await closeFuzzWorld({ pool, base, fx });
    await db.destroy();
  });

  const circumstances = () => ({
    accuracy: { relative: 0.01, phaseDeg: 1 }, achievedPose: { distance: 0.1, lateralOffset: 0, tiltDeg: 0 }, instrument: 'Scope "A" \u2014 bench 2',
    calibration: 'in_date', temperatureC: 21, setupNotes: '',
  });
  const reading = () => ({ method: 'open_circuit', raw: { frequency: 6.78e6, txCurrent: 0.25, rxVoltage: 0.5, phaseDeg: 90, txVoltage: null }, ...circumstances() });
  const design = () => ({
    name: 'Fuzzed plan', setupId: fx.setupId,
    axes: [
      { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.05, stop: 0.1, step: 0.05 },
      { quantity: 'tiltDeg', displayUnit: 'deg', mode: 'count', start: 0, stop: 30, count: 2, spacing: 'linear' },
    ],
    repeats: 1, referenceEvery: 2, orderMode: 'shuffled', shuffleSeed: 7, minutesPerPoint: 2, notes: '',
  });
  const planCase = (name: string, handler: unknown, method: string, planId: number, tail: string, valid: Record<string, unknown>, extra: Record<string, string> = {}, limit = DEFAULT_MAX_BODY_BYTES): JsonRouteCase => ({
    name, handler, method, url: `/api/studies/${fx.studyId}/plans/${planId}${tail}`, params: { studyId: String(fx.studyId), planId: String(planId), ...extra },
    actor: fx.researcher, valid, limit,
  });

  const cases = (): JsonRouteCase[] => [
    { name: 'POST plans', handler: plansRoute.POST, method: 'POST', url: `/api/studies/${fx.studyId}/plans`, params: { studyId: String(fx.studyId) }, actor: fx.researcher,
      valid: design(), limit: DEFAULT_MAX_BODY_BYTES },
    planCase('PATCH plan (draft)', planRoute.PATCH, 'PATCH', fx.draftPlanId, '', design()),
    planCase('POST transition', transitionRoute.POST, 'POST', fx.statePlanId, '/transition', { to: 'on_bench', reason: 'Ready for the bench' }),
    planCase('POST cautions', cautionsRoute.POST, 'POST', fx.benchPlanId, '/cautions', { version: BENCH_CAUTIONS_VERSION, acknowledged: true }),
    planCase('POST comments', commentsRoute.POST, 'POST', fx.benchPlanId, '/comments', { pointId: fx.pointIds[0], body: 'The probe moved \u2014 "again"' }),
    planCase('POST readings', readingsRoute.POST, 'POST', fx.benchPlanId, '/readings', { pointId: fx.pointIds[1], ...reading() }),
    planCase('POST corrections', correctionsRoute.POST, 'POST', fx.benchPlanId, `/readings/${fx.readingId}/corrections`, { ...reading(), reason: 'Wrong range on the meter' }, { readingId: String(fx.readingId) }),
    planCase('POST readings/from-touchstone', touchstoneRoute.POST, 'POST', fx.benchPlanId, '/readings/from-touchstone', { pointId: fx.pointIds[1], attachmentId: 1, frequency: null, ...circumstances() }),
    planCase('POST readings/import', importRoute.POST, 'POST', fx.benchPlanId, '/readings/import', {
      csv: 'seq,repeat,method,f_MHz,I1_mA,V2_mV\n2,1,open_circuit,6.78,250,500\n', fileName: 'bench.csv', commit: false,
      mapping: {
        seqColumn: 'seq', repeatColumn: 'repeat', method: null, methodColumn: 'method',
        fields: { frequency: { column: 'f_MHz', unit: 'MHz' }, txCurrent: { column: 'I1_mA', unit: 'mA' }, rxVoltage: { column: 'V2_mV', unit: 'mV' } },
        circumstances: { instrument: null, calibration: null, temperatureC: null, setupNotes: null, accuracy: { relative: 0.01, phaseDeg: 1 } },
      },
    }, {}, IMPORT_MAX_BODY_BYTES),
    planCase('PUT review/tolerance', toleranceRoute.PUT, 'PUT', fx.benchPlanId, '/review/tolerance', { tolerance: 0.05 }),
    planCase('POST review/marks', marksRoute.POST, 'POST', fx.benchPlanId, '/review/marks', { pointId: fx.pointIds[0], reason: 'The jig slipped' }),
    planCase('POST review/fits', fitsRoute.POST, 'POST', fx.benchPlanId, '/review/fits', { model: 'tilt_offset', quantity: 'coupling' }),
  ];

  const NAMES = [
    'POST plans', 'PATCH plan (draft)', 'POST cautions', 'POST comments', 'POST readings', 'POST corrections', 'POST readings/from-touchstone',
    'POST readings/import', 'PUT review/tolerance', 'POST review/marks', 'POST review/fits',
    // Last: a body that is valid moves the plan on, which the other routes do not use.
    'POST transition',
  ];

  test.each(NAMES)('%s', async (name) => {
    const c = cases().find((x) => x.name === name)!;
    const { statuses } = await fuzzJsonRoute(c, base, actAs);
    if (process.env.FUZZ_VERBOSE) console.log(name, statuses);
  });

  test.each(NAMES)('%s with awkward text in one field', async (name) => {
    const c = cases().find((x) => x.name === name)!;
    const { statuses } = await fuzzJsonRoute(c, base, actAs, awkwardTextBody(c.valid));
    if (process.env.FUZZ_VERBOSE) console.log(name, 'text', statuses);
  });

  test('POST readings/import reads hostile CSV text (quotes, separators, line ends, NUL, huge cells) without a 5xx', async () => {
    const c = cases().find((x) => x.name === 'POST readings/import')!;
    const cell = fc.oneof(
      fc.constantFrom('2', '1', 'open_circuit', 'two_port', '6.78', '250', '500', '1e309', 'NaN', '-0', '', '"', '""', '"a,b"', '"unterminated', '\u0000', '\ud800', '\u202e', ';', '\t', '=1+1', '1,5', ' 2 '),
      fc.string({ unit: 'binary', maxLength: 8 }),
      fc.double().map(String),
    );
    const row = fc.array(cell, { minLength: 0, maxLength: 9 }).map((cells) => cells.join(','));
    const csv = fc.tuple(
      fc.constantFrom('seq,repeat,method,f_MHz,I1_mA,V2_mV', 'seq;repeat;method', '\ufeffseq,repeat,method,f_MHz,I1_mA,V2_mV', 'seq,seq,method,f_MHz,I1_mA,V2_mV', ''),
      fc.array(row, { maxLength: 20 }),
      fc.constantFrom('\n', '\r\n', '\r'),
      fc.boolean(),
    ).map(([header, rows, eol, commit]) => JSON.stringify({ ...c.valid, csv: [header, ...rows].join(eol), commit }));
    await fuzzJsonRoute(c, base, actAs, csv);
  });

  test('POST readings/import derives every method from in-range, edge and extreme numbers without a 5xx', async () => {
    const c = cases().find((x) => x.name === 'POST readings/import')!;
    const keys = [...new Set(MEASUREMENT_METHODS.flatMap((m) => METHOD_SPECS[m].fields.map((f) => f.key)))];
    const number = fc.oneof(
      fc.constantFrom('', '0', '-0', '1e-320', '1e-300', '5e-324', '1e5', '1e11', '-180', '180', '90', '-90', '0.25', '6.78e6', '1e308'),
      fc.double({ min: -1e12, max: 1e12, noNaN: true }).map(String),
      fc.tuple(fc.double({ min: 0.1, max: 10, noNaN: true }), fc.integer({ min: -320, max: 12 })).map(([m, e]) => String(m * 10 ** e)),
    );
    const row = fc.tuple(fc.constantFrom('1', '2'), fc.constantFrom(...MEASUREMENT_METHODS), fc.array(number, { minLength: keys.length, maxLength: keys.length }))
      .map(([seq, method, cells]) => [seq, '1', method, ...cells].join(','));
    const mapping = { ...(c.valid.mapping as object), fields: Object.fromEntries(keys.map((key) => [key, { column: key, unit: '' }])) };
    const bodies = fc.tuple(fc.array(row, { minLength: 1, maxLength: 6 }), fc.boolean()).map(([rows, commit]) =>
      JSON.stringify({ ...c.valid, mapping, commit: commit && rows.length === 1, csv: [['seq', 'repeat', 'method', ...keys].join(','), ...rows].join('\n') }),
    );
    const { statuses } = await fuzzJsonRoute(c, base, actAs, bodies);
    if (process.env.FUZZ_VERBOSE) console.log('import derivations', statuses);
  });

  test.each([
    ['POST readings', ['studyId', 'planId']],
    ['POST corrections', ['studyId', 'planId', 'readingId']],
    ['POST review/marks', ['planId']],
  ])('%s with hostile path ids', async (name, keys) => {
    await fuzzIdParams(cases().find((x) => x.name === name)!, keys, actAs);
  });

  test('GET review reads any query string without a 5xx', async () => {
    await fuzzQueryRoute({
      name: 'review', handler: reviewRoute.GET, url: `/api/studies/${fx.studyId}/plans/${fx.benchPlanId}/review`,
      params: { studyId: String(fx.studyId), planId: String(fx.benchPlanId) }, actor: fx.researcher, keys: ['quantity'],
    }, actAs);
  });
});
