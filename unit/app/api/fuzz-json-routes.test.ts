/**
 * Hostile JSON at the account, study, coil, setup, membership and solve routes (property-based, fast-check):
 * malformed and truncated JSON, wrong types, NaN and 1e309 as JSON carries them, edge numbers, bodies
 * at and past the size limit, deep nesting, duplicate keys, RTL, emoji, NUL, lone surrogates and invalid
 * UTF-8. Every answer is below 500, a 4xx names what went wrong (a 422 each field), and a refused write
 * leaves every table unchanged. Replay a failure with FUZZ_SEED (in the test names) and FUZZ_RUNS.
 */
import type { SessionUser } from '@/lib/auth/session-user';
import { actAs } from '../../support/acting-user';
import { createAccount } from '@/lib/data/accounts';
import { DEFAULT_MAX_BODY_BYTES } from '@/lib/http/respond';
import type { SolverPool } from '@/lib/solver-pool/solver-pool';
import { MAX_SOLVE_BODY_BYTES } from '@/lib/validations/solve';
import * as accountRoute from '@/app/api/admin/accounts/[userId]/route';
import * as accountsRoute from '@/app/api/admin/accounts/route';
import * as solveRoute from '@/app/api/solve/route';
import * as coilRoute from '@/app/api/studies/[studyId]/coils/[coilId]/route';
import * as coilsRoute from '@/app/api/studies/[studyId]/coils/route';
import * as historyRoute from '@/app/api/studies/[studyId]/history/route';
import * as invitationsRoute from '@/app/api/studies/[studyId]/invitations/route';
import * as memberRoute from '@/app/api/studies/[studyId]/members/[userId]/route';
import * as setupRoute from '@/app/api/studies/[studyId]/setups/[setupId]/route';
import * as setupsRoute from '@/app/api/studies/[studyId]/setups/route';
import * as studiesRoute from '@/app/api/studies/route';
import { db, SEEDED, sessionUserByEmail } from '../../support/database';
import { awkwardTextBody, databaseState, FUZZ_SEED } from '../../support/fuzz-json';
import {
  callRoute, FUZZ_CIRCUIT, FUZZ_HELIX, fuzzIdParams, fuzzJsonRoute, fuzzQueryRoute, closeFuzzWorld, openFuzzWorld, type Baseline, type FuzzStudy, type JsonRouteCase,
} from '../../support/fuzz-fixtures';

jest.mock('@/lib/auth/session', () => jest.requireActual('../../support/acting-user').sessionStandIn);

// The server's pool starts its worker from a bundled chunk jest cannot load; solve on workers from the sources.
let mockSolvePool: SolverPool | null = null;
jest.mock('@/lib/solver-pool/server-pool', () => ({
  serverSolverPool: () => mockSolvePool,
  solveOnServer: (job: unknown) => mockSolvePool!.solve(job as never),
}));

describe(`JSON routes refuse hostile bodies with 4xx and field paths (FUZZ_SEED=${FUZZ_SEED})`, () => {
  let pool: SolverPool;
  let base: Baseline;
  let fx: FuzzStudy;
  let admin: SessionUser;
  let accountId: number;

  beforeAll(async () => {
    ({ pool, base, fx } = await openFuzzWorld('Fuzz routes'));
    mockSolvePool = pool;
    admin = await sessionUserByEmail(SEEDED.admin);
    accountId = (await createAccount(admin, { email: 'fuzz.account@couplet.test', name: 'Fuzz Account', siteRole: 'member', password: 'fuzz password 1' })).id;
  }, 120_000);

  afterAll(async () => {
    await closeFuzzWorld({ pool, base, fx });
    await db.destroy();
  });

  const coilBody = () => ({
    name: 'Fuzzed coil', spec: { ...FUZZ_HELIX, material: 'copper', temperatureC: 20, strands: 1 }, wireLabel: 'enamelled 1 mm',
    measured: { inductance: 1e-5, resistance: 0.1, qualityFactor: 50, frequencyHz: 1e5 }, notes: 'fuzz',
  });
  const setupBody = () => ({
    name: 'Fuzzed setup', transmitterCoilId: fx.coilIds[0], receiverCoilId: fx.coilIds[1], placement: { distance: 0.1, lateralOffset: 0.01, tiltDeg: 5 },
    circuit: { ...FUZZ_CIRCUIT, txCapacitance: 1e-9, rxCapacitance: null }, operatorPoint: [0.3, 0, 0.1], view: { position: [1, 1, 1], target: [0, 0, 0] }, notes: '',
  });

  const cases = (): JsonRouteCase[] => [
    { name: 'POST /api/studies', handler: studiesRoute.POST, method: 'POST', url: '/api/studies', params: {}, actor: fx.researcher, limit: DEFAULT_MAX_BODY_BYTES,
      valid: { name: 'Fuzz-made study', summary: 'made by a fuzzer', frequencyHz: 1e6 } },
    { name: 'POST /api/admin/accounts', handler: accountsRoute.POST, method: 'POST', url: '/api/admin/accounts', params: {}, actor: admin, limit: DEFAULT_MAX_BODY_BYTES,
      valid: { email: 'fuzz.made@couplet.test', name: 'Fuzz Made', siteRole: 'member', password: 'correct horse battery' } },
    { name: 'PATCH /api/admin/accounts/{userId}', handler: accountRoute.PATCH, method: 'PATCH', url: `/api/admin/accounts/${accountId}`, params: { userId: String(accountId) },
      actor: admin, limit: DEFAULT_MAX_BODY_BYTES, valid: { name: 'Fuzz Renamed', siteRole: 'member', disabled: false } },
    { name: 'POST /api/solve', handler: solveRoute.POST, method: 'POST', url: '/api/solve', params: {}, actor: fx.student, limit: MAX_SOLVE_BODY_BYTES,
      valid: {
        transmitter: { kind: 'loop', radius: 0.05, wireDiameter: 0.001 }, receiver: { kind: 'loop', radius: 0.04, wireDiameter: 0.001 }, placement: { distance: 0.1 },
        circuit: FUZZ_CIRCUIT, tolerance: 1e-4, fieldPoints: [[0, 0, 0.05]], band: { startHz: 6e6, stopHz: 7e6, points: 3 },
      } },
    { name: 'POST /api/studies/{studyId}/coils', handler: coilsRoute.POST, method: 'POST', url: `/api/studies/${fx.studyId}/coils`, params: { studyId: String(fx.studyId) },
      actor: fx.researcher, limit: DEFAULT_MAX_BODY_BYTES, valid: coilBody() },
    { name: 'PATCH /api/studies/{studyId}/coils/{coilId}', handler: coilRoute.PATCH, method: 'PATCH', url: `/api/studies/${fx.studyId}/coils/${fx.coilIds[0]}`,
      params: { studyId: String(fx.studyId), coilId: String(fx.coilIds[0]) }, actor: fx.researcher, limit: DEFAULT_MAX_BODY_BYTES, valid: coilBody() },
    { name: 'POST /api/studies/{studyId}/setups', handler: setupsRoute.POST, method: 'POST', url: `/api/studies/${fx.studyId}/setups`, params: { studyId: String(fx.studyId) },
      actor: fx.researcher, limit: DEFAULT_MAX_BODY_BYTES, valid: setupBody() },
    { name: 'PATCH /api/studies/{studyId}/setups/{setupId}', handler: setupRoute.PATCH, method: 'PATCH', url: `/api/studies/${fx.studyId}/setups/${fx.setupId}`,
      params: { studyId: String(fx.studyId), setupId: String(fx.setupId) }, actor: fx.researcher, limit: DEFAULT_MAX_BODY_BYTES, valid: setupBody() },
    { name: 'POST /api/studies/{studyId}/invitations', handler: invitationsRoute.POST, method: 'POST', url: `/api/studies/${fx.studyId}/invitations`,
      params: { studyId: String(fx.studyId) }, actor: fx.researcher, limit: DEFAULT_MAX_BODY_BYTES, valid: { email: 'fuzz.invitee@couplet.test', role: 'student' } },
    { name: 'PATCH /api/studies/{studyId}/members/{userId}', handler: memberRoute.PATCH, method: 'PATCH', url: `/api/studies/${fx.studyId}/members/${fx.student.id}`,
      params: { studyId: String(fx.studyId), userId: String(fx.student.id) }, actor: fx.researcher, limit: DEFAULT_MAX_BODY_BYTES, valid: { role: 'supervisor' } },
  ];

  const NAMES = [
    'POST /api/studies', 'POST /api/admin/accounts', 'PATCH /api/admin/accounts/{userId}', 'POST /api/solve', 'POST /api/studies/{studyId}/coils',
    'PATCH /api/studies/{studyId}/coils/{coilId}', 'POST /api/studies/{studyId}/setups', 'PATCH /api/studies/{studyId}/setups/{setupId}',
    'POST /api/studies/{studyId}/invitations', 'PATCH /api/studies/{studyId}/members/{userId}',
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

  test.each([
    ['PATCH /api/studies/{studyId}/coils/{coilId}', ['studyId', 'coilId']],
    ['PATCH /api/studies/{studyId}/setups/{setupId}', ['studyId', 'setupId']],
    ['PATCH /api/studies/{studyId}/members/{userId}', ['studyId', 'userId']],
    ['PATCH /api/admin/accounts/{userId}', ['userId']],
  ])('%s with hostile path ids', async (name, keys) => {
    await fuzzIdParams(cases().find((x) => x.name === name)!, keys, actAs);
  });

  // JSON may write half a surrogate pair ("\ud800"); MariaDB's JSON columns (the audit trail) cannot hold it, so the body is refused at the field.
  test.each([
    ['POST /api/studies', ['name']],
    ['PATCH /api/admin/accounts/{userId}', ['name']],
    ['POST /api/studies/{studyId}/coils', ['name'], ['notes']],
    ['PATCH /api/studies/{studyId}/setups/{setupId}', ['name']],
  ] as [string, ...string[][]][])('%s refuses a lone surrogate with 422 at its field and writes nothing', async (name, ...paths) => {
    const c = cases().find((x) => x.name === name)!;
    actAs(c.actor);
    for (const [field] of paths) {
      const before = await databaseState();
      const body = JSON.stringify({ ...c.valid, [field]: 'x\ud800y' });
      expect(body).toContain('\\ud800');
      const answer = await callRoute(c.handler, { method: c.method, url: c.url, body, params: c.params });
      expect(answer).toEqual({ status: 422, body: { error: expect.any(String), issues: [{ path: field, message: expect.stringMatching(/half of a character/) }] } });
      expect(await databaseState()).toEqual(before);
    }
  });

  test('a lone surrogate in a key or deep in a list is named by its path', async () => {
    const c = cases().find((x) => x.name === 'POST /api/solve')!;
    actAs(c.actor);
    const answer = await callRoute(c.handler, { method: 'POST', url: c.url, params: {}, body: '{"fieldPoints":[[0,"\\udc00",0]],"\\ud83d":1}' });
    expect(answer.status).toBe(422);
    expect((answer.body.issues as { path: string }[]).map((i) => i.path).sort()).toEqual(['fieldPoints.0.1', '\ud83d']);
  });

  test('JSON nested 100,000 deep is a 422, not a stack overflow', async () => {
    const c = cases().find((x) => x.name === 'POST /api/studies')!;
    actAs(c.actor);
    for (const body of [`${'['.repeat(100_000)}${']'.repeat(100_000)}`, `{"name":${'['.repeat(100_000)}"\\ud800"${']'.repeat(100_000)}}`, `${'{"a":'.repeat(40_000)}1${'}'.repeat(40_000)}`]) {
      const answer = await callRoute(c.handler, { method: 'POST', url: c.url, params: {}, body });
      expect(answer.status).toBe(422);
      expect((answer.body.issues as unknown[]).length).toBeGreaterThan(0);
    }
  });

  test('GET /api/studies/{studyId}/history reads any query string without a 5xx', async () => {
    await fuzzQueryRoute({
      name: 'history', handler: historyRoute.GET, url: `/api/studies/${fx.studyId}/history`, params: { studyId: String(fx.studyId) }, actor: fx.researcher,
      keys: ['before', 'limit', 'planId', 'actorId', 'category'],
    }, actAs);
  });
});
