import fs from 'node:fs';
import path from 'node:path';
import { expect, test, type APIRequestContext, type APIResponse } from '@playwright/test';
import { allowedStudyActions, canSeeStudy } from '../src/lib/auth/permissions';
import { apiSignIn, PAD_STUDY, RAIL_STUDY } from './support/accounts';
import { BASE_URL } from './support/bench-plan';
import { inviteLinkIn, waitForMessageTo } from './support/inbox';
import {
  CALLER_ACCOUNTS, CALLER_ACTORS, CALLERS, callersWith, CIRCUIT, crossStudyStatus, expectedStatus, LOOP_RX, LOOP_TX, PNG_1X1, ROUTE_MATRIX, SERVER_ACTIONS,
  OUTSIDER_ON_OWN_STUDY, SIGNED_IN_CALLERS, SPLIT_PEAKS, TOUCHSTONE_S2P, transitionAction,
  type ByCaller, type Caller, type Fixtures, type Method, type PointRef, type RequestSpec, type RouteCase, type RouteRow, type SignedInCaller,
} from './support/route-matrix';

/**
 * Every route handler called by every kind of caller (e2e/support/route-matrix.ts holds the table and
 * how each status follows from src/lib/auth/permissions.ts), against the built app. The fixtures are the
 * run's own coils, setups and plans in the pad study, so the writes disturb no other spec. Every error
 * body is checked for internals: stack traces, source paths, SQL.
 */

const ROOT = path.resolve(__dirname, '..');
/** A study id no study has: an outsider's 404 must read exactly like this one's. */
const MISSING_STUDY = 2_000_000_000;
const HANDLER_METHODS = ['GET', 'POST', 'PUT', 'PATCH', 'DELETE'] as const;
/**
 * A connection the server closed as idle while a request was already on its way shows up as
 * ECONNRESET before any answer; Playwright retries only that.
 */
const RETRY = { maxRetries: 2 } as const;

// ---------------------------------------------------------------------------------------------
// the source tree

function filesUnder(dir: string, keep: (file: string) => boolean): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return filesUnder(full, keep);
    return keep(full) ? [full] : [];
  });
}

/** "METHOD /api/..." for every handler exported by src/app/api/**\/route.ts. */
function routeHandlers(): string[] {
  const appDir = path.join(ROOT, 'src', 'app');
  return filesUnder(path.join(appDir, 'api'), (file) => /^route\.(ts|js)$/.test(path.basename(file))).flatMap((file) => {
    const route = `/${path.relative(appDir, path.dirname(file)).split(path.sep).join('/')}`;
    const source = fs.readFileSync(file, 'utf8');
    const methods = new Set<string>();
    for (const m of source.matchAll(/export\s+(?:const|let|var)\s+(GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS)\b/g)) methods.add(m[1]);
    for (const m of source.matchAll(/export\s+(?:async\s+)?function\s+(GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS)\b/g)) methods.add(m[1]);
    for (const m of source.matchAll(/export\s*\{([^}]*)\}/g)) {
      for (const name of m[1].matchAll(/(?:\bas\s+|^|,)\s*(GET|POST|PUT|PATCH|DELETE|HEAD|OPTIONS)\s*(?=,|$)/g)) methods.add(name[1]);
    }
    return [...methods].map((method) => `${method} ${route}`);
  });
}

/** "file#name" for every exported async function of a file that starts with 'use server'. */
function serverActions(): string[] {
  return filesUnder(path.join(ROOT, 'src'), (file) => /\.(ts|tsx)$/.test(file)).flatMap((file) => {
    const source = fs.readFileSync(file, 'utf8');
    if (!/^(?:\s*(?:\/\/[^\n]*|\/\*[\s\S]*?\*\/))*\s*['"]use server['"]/.test(source)) return [];
    const relative = path.relative(ROOT, file).split(path.sep).join('/');
    const names = [
      ...[...source.matchAll(/export\s+async\s+function\s+(\w+)/g)].map((m) => m[1]),
      ...[...source.matchAll(/export\s+const\s+(\w+)\s*=\s*async\b/g)].map((m) => m[1]),
    ];
    return names.map((name) => `${relative}#${name}`);
  });
}

test.describe('the route matrix covers the app', () => {
  test('every route handler has a row, and every row a handler', () => {
    const handlers = routeHandlers();
    const rows = ROUTE_MATRIX.map((r) => `${r.method} ${r.route}`);
    expect(handlers.length, 'route handlers found under src/app/api').toBeGreaterThan(40);
    expect(handlers.filter((h) => !rows.includes(h)), 'handlers with no row in e2e/support/route-matrix.ts').toEqual([]);
    expect(rows.filter((r) => !handlers.includes(r)), 'rows whose handler no longer exists').toEqual([]);
    expect(rows.filter((r, i) => rows.indexOf(r) !== i), 'rows listed twice').toEqual([]);
    expect(ROUTE_MATRIX.filter((r) => r.cases.length === 0).map((r) => `${r.method} ${r.route}`), 'rows without a case').toEqual([]);
    expect(ROUTE_MATRIX.filter((r) => !(HANDLER_METHODS as readonly string[]).includes(r.method)).length).toBe(0);
  });

  test('every case that is not a success says why', () => {
    const unexplained = ROUTE_MATRIX.flatMap((r) => r.cases.filter((c) => c.allowed >= 400 && !c.why).map((c) => `${r.method} ${r.route} ${c.label ?? ''}`));
    expect(unexplained).toEqual([]);
  });

  test('every server action is in the table, with a test that calls it', () => {
    const actions = serverActions();
    const listed = SERVER_ACTIONS.map((a) => `${a.file}#${a.name}`);
    expect(actions.length, "server actions found ('use server' files)").toBeGreaterThan(0);
    expect(actions.filter((a) => !listed.includes(a)), 'server actions with no row in SERVER_ACTIONS').toEqual([]);
    expect(listed.filter((a) => !actions.includes(a)), 'SERVER_ACTIONS rows whose action no longer exists').toEqual([]);
    for (const action of SERVER_ACTIONS) {
      const testFile = path.join(ROOT, action.coveredBy);
      expect(fs.existsSync(testFile), `${action.coveredBy} exists`).toBe(true);
      expect(fs.readFileSync(testFile, 'utf8'), `${action.coveredBy} calls ${action.name}`).toMatch(new RegExp(`\\b${action.name}\\(`));
    }
  });
});

// ---------------------------------------------------------------------------------------------
// error bodies

const INTERNALS: [RegExp, string][] = [
  [/\n\s*at\s/, 'a stack trace line'],
  [/\bat\s+\S+\s+\([^)]*:\d+:\d+\)/, 'a stack frame'],
  [/\.(?:ts|tsx|js|mjs|cjs):/, 'a source file position'],
  [/\/work\/|\/tmp\/|\/home\/|node_modules|webpack|turbopack/i, 'a file path'],
  [/\b(?:SELECT|INSERT|UPDATE|DELETE FROM|WHERE)\s/, 'SQL'],
  [/\bER_[A-Z_]+/, 'a MariaDB error code'],
  [/sql/i, 'SQL'],
];

/** Problems with a non-2xx answer's body: internals anywhere, keys outside the error envelope. */
function errorBodyProblems(routeCase: RouteCase, status: number, contentType: string, text: string): string[] {
  if (status < 400) return [];
  const problems = INTERNALS.filter(([pattern]) => pattern.test(text)).map(([, what]) => `holds ${what}`);
  if (!contentType.includes('application/json')) return [...problems, `is ${contentType || 'untyped'}, not JSON`];
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    return [...problems, 'is not valid JSON'];
  }
  if (typeof body !== 'object' || body === null || Array.isArray(body)) return [...problems, 'is not a JSON object'];
  const record = body as Record<string, unknown>;
  const allowedKeys = ['error', 'issues', ...(routeCase.errorKeys ?? [])];
  const extra = Object.keys(record).filter((key) => !allowedKeys.includes(key));
  if (extra.length > 0) problems.push(`has keys beyond the envelope: ${extra.join(', ')}`);
  if (!routeCase.foreignErrorBody) {
    if (typeof record.error !== 'string' || record.error.length === 0) problems.push('has no error message');
    const issues = record.issues;
    const wellFormed = Array.isArray(issues) && issues.every((i) => typeof i?.path === 'string' && typeof i?.message === 'string');
    if (!wellFormed) problems.push('has no list of { path, message } issues');
  }
  return problems;
}

// ---------------------------------------------------------------------------------------------
// callers and fixtures

type Contexts = Record<Caller, APIRequestContext>;

async function expectStatus(response: APIResponse, status: number, what: string): Promise<any> {
  const text = await response.text();
  expect(response.status(), `${what}: ${text.slice(0, 500)}`).toBe(status);
  return text ? JSON.parse(text) : null;
}

/**
 * One write after the other: the fixtures are many writes to one study, and the app answers writes
 * racing on the same tables with deadlocks that are not what this spec is about.
 */
async function inOrder<T, R>(items: readonly T[], write: (item: T, index: number) => Promise<R>): Promise<R[]> {
  const results: R[] = [];
  for (const [index, item] of items.entries()) results.push(await write(item, index));
  return results;
}

function byCaller<T>(callers: readonly SignedInCaller[], values: T[]): ByCaller<T> {
  return Object.fromEntries(callers.map((caller, i) => [caller, values[i]]));
}

async function makeFixtures(api: Contexts): Promise<Fixtures> {
  const tag = Date.now().toString(36);
  const researcher = api.researcher;
  const { studies } = await expectStatus(await researcher.get('/api/studies', RETRY), 200, 'the researcher\u2019s studies');
  const studyId: number = studies.find((s: { name: string }) => s.name === PAD_STUDY).id;
  const base = `/api/studies/${studyId}`;
  const outsiderStudies = (await expectStatus(await api.outsider.get('/api/studies', RETRY), 200, 'the outsider\u2019s studies')).studies;
  const otherStudyId: number = outsiderStudies.find((s: { name: string }) => s.name === RAIL_STUDY).id;
  const { accounts } = await expectStatus(await api.admin.get('/api/admin/accounts', RETRY), 200, 'the accounts');
  const userIds = Object.fromEntries(
    SIGNED_IN_CALLERS.map((c) => [c, accounts.find((a: { email: string }) => a.email === CALLER_ACCOUNTS[c].email).id]),
  ) as Record<SignedInCaller, number>;

  const editors = callersWith('study.edit');
  const loggers = callersWith('readings.log');
  const analysts = callersWith('review.analyse');
  const managers = callersWith('members.manage');
  const openers = callersWith(transitionAction('draft', 'on_bench'));
  const senders = callersWith(transitionAction('on_bench', 'in_review'));
  const acceptors = callersWith(transitionAction('in_review', 'accepted'));
  const returners = callersWith(transitionAction('in_review', 'on_bench'));
  const firstLogger = loggers[0];

  const post = async (who: APIRequestContext, url: string, data: unknown, status: number, what: string) =>
    expectStatus(await who.post(url, { data, ...RETRY }), status, what);

  // invitations first, so the e-mail with the token is out by the time the rest is made
  const invite = async (email: string) => (await post(researcher, `${base}/invitations`, { email, role: 'student' }, 201, `invite ${email}`)).invitation.id as number;
  const tokenAddress = `rm-${tag}-token@couplet.test`;
  await invite(tokenAddress);
  const invitationsToRevoke = await inOrder(managers, (c) => invite(`rm-${tag}-to-withdraw-${c}@couplet.test`));
  const { account } = await post(api.admin, '/api/admin/accounts', {
    email: `rm-${tag}-account@couplet.test`, name: 'Route Matrix Account', siteRole: 'member', password: 'route-matrix-pass-2026',
  }, 201, 'a throwaway account');

  // coils and setups: a pair for the plans, one to read and change, one for each editor to delete
  const coil = async (name: string, spec: unknown) => (await post(researcher, `${base}/coils`, { name: `${name} ${tag}`, spec }, 201, name)).coil.id as number;
  const tx = await coil('RM transmitter loop', LOOP_TX);
  const rx = await coil('RM receiver loop', LOOP_RX);
  const sharedCoil = await coil('RM shared loop', LOOP_RX);
  const coilsToDelete = await inOrder(editors, (c) => coil(`RM loop for ${c} to delete`, LOOP_RX));
  const setup = async (name: string) =>
    (await post(researcher, `${base}/setups`, { name: `${name} ${tag}`, transmitterCoilId: tx, receiverCoilId: rx, placement: { distance: 0.1 }, circuit: CIRCUIT }, 201, name)).setup.id as number;
  const forPlans = await setup('RM setup for plans');
  const sharedSetup = await setup('RM shared setup');
  const setupsToDelete = await inOrder(editors, (c) => setup(`RM setup for ${c} to delete`));

  // plans: distances in metres; the bench plan has a point for every use below
  const benchPointCount = 5 * loggers.length + 2 + 2 * analysts.length;
  const plan = async (name: string, distances: number[]) =>
    (await post(researcher, `${base}/plans`, {
      name: `${name} ${tag}`, setupId: forPlans, minutesPerPoint: 1,
      axes: [{ quantity: 'distance', displayUnit: 'cm', mode: 'list', values: distances }],
    }, 201, name)).plan.id as number;
  const one = [0.1];
  const draft = await plan('RM draft', one);
  const benchPlan = await plan('RM bench', Array.from({ length: benchPointCount }, (_, i) => Number((0.05 + 0.01 * i).toFixed(3))));
  const toDelete = await inOrder(editors, (c) => plan(`RM draft for ${c} to delete`, one));
  const toOpen = await inOrder(openers, (c) => plan(`RM draft for ${c} to open`, one));
  const toSend = await inOrder(senders, (c) => plan(`RM plan for ${c} to send`, one));
  const toAccept = await inOrder(acceptors, (c) => plan(`RM plan for ${c} to accept`, one));
  const toReturn = await inOrder(returners, (c) => plan(`RM plan for ${c} to return`, one));
  const report = await plan('RM plan to report', one);
  const allPlans = [draft, benchPlan, report, ...toDelete, ...toOpen, ...toSend, ...toAccept, ...toReturn];
  await Promise.all(allPlans.map((id) =>
    expect.poll(async () => (await (await researcher.get(`${base}/plans/${id}/progress`, RETRY)).json()).status, { timeout: 60_000 }).toBe('done')));

  const benchPlans = [benchPlan, report, ...toSend, ...toAccept, ...toReturn];
  await inOrder(benchPlans, (id) => post(researcher, `${base}/plans/${id}/transition`, { to: 'on_bench' }, 200, 'open a plan for the bench'));
  const { acknowledgement } = await expectStatus(await researcher.get(`${base}/plans/${benchPlan}/cautions`, RETRY), 200, 'the cautions');
  const cautionsVersion: string = acknowledgement.version;
  const acknowledge = (who: SignedInCaller, planId: number) =>
    post(api[who], `${base}/plans/${planId}/cautions`, { version: cautionsVersion, acknowledged: true }, 200, `${who} acknowledges the cautions`);
  const firstPoint = async (planId: number) => (await expectStatus(await researcher.get(`${base}/plans/${planId}/points`, RETRY), 200, 'points')).points[0].id as number;
  const logSplitPeaks = async (who: SignedInCaller, planId: number, pointId: number) =>
    (await post(api[who], `${base}/plans/${planId}/readings`, { pointId, ...SPLIT_PEAKS }, 201, `${who} logs a reading`)).reading.id as number;

  // the bench plan's points, dealt out in order
  const { points } = await expectStatus(await researcher.get(`${base}/plans/${benchPlan}/points`, RETRY), 200, 'bench points');
  const queue: { id: number; seq: number; predicted: { efficiency: number } }[] = [...points].sort((a, b) => a.seq - b.seq);
  const take = () => {
    const next = queue.shift();
    if (!next) throw new Error('The bench plan has too few points for the fixtures.');
    return next;
  };
  const deal = (callers: SignedInCaller[]): ByCaller<PointRef> => byCaller(callers, callers.map(() => {
    const { id, seq } = take();
    return { id, seq };
  }));
  const formPoints = deal(loggers);
  const touchstonePoints = deal(loggers);
  const csvPoints = deal(loggers);
  const ownPoints = deal(loggers);
  const othersPoints = deal(loggers);
  const fitPoints = [take(), take()];
  const pointsToMark = deal(analysts);
  const markedPoints = deal(analysts);

  await inOrder(loggers, (c) => acknowledge(c, benchPlan));
  const ownReadings = await inOrder(loggers, (c) => logSplitPeaks(c, benchPlan, ownPoints[c]!.id));
  const othersReadings = await inOrder(loggers, (c) => logSplitPeaks(c, benchPlan, othersPoints[c]!.id));
  // measured efficiency 10 % and 15 % under the prediction, for the extra-resistance fit
  await inOrder(fitPoints, (p, i) => post(api[firstLogger], `${base}/plans/${benchPlan}/readings`, {
    pointId: p.id, method: 'direct_power', raw: { inputPower: 1, outputPower: Number((p.predicted.efficiency * (0.9 - 0.05 * i)).toPrecision(6)) },
  }, 201, 'an efficiency reading'));
  await inOrder(analysts, (c) => post(api[c], `${base}/plans/${benchPlan}/review/marks`, { pointId: markedPoints[c]!.id, reason: 'Set aside in advance.' }, 201, `${c} sets a point aside`));
  const upload = async (kind: string, file: { name: string; mimeType: string; buffer: Buffer }) =>
    (await expectStatus(await api[firstLogger].post(`${base}/plans/${benchPlan}/attachments`, { multipart: { kind, file }, ...RETRY }), 201, `upload ${file.name}`)).attachment.id as number;
  const photo = await upload('photo', { name: 'rm-bench.png', mimeType: 'image/png', buffer: PNG_1X1 });
  const touchstone = await upload('instrument', { name: 'rm-vna.s2p', mimeType: 'text/plain', buffer: TOUCHSTONE_S2P });

  // plans to send: a reading by their sender; plans to decide or report on: a reading, then sent for review
  await inOrder(senders, async (c, i) => {
    await acknowledge(c, toSend[i]);
    await logSplitPeaks(c, toSend[i], await firstPoint(toSend[i]));
  });
  await inOrder([report, ...toAccept, ...toReturn], async (planId) => {
    await acknowledge(firstLogger, planId);
    await logSplitPeaks(firstLogger, planId, await firstPoint(planId));
    await post(api[firstLogger], `${base}/plans/${planId}/transition`, { to: 'in_review' }, 200, 'send a plan for review');
  });

  const invitationToken = inviteLinkIn(await waitForMessageTo(tokenAddress, { timeoutMs: 30_000 })).split('/invite/')[1];

  return {
    tag, studyId, otherStudyId, userIds, invitationToken, invitationsToRevoke: byCaller(managers, invitationsToRevoke), account: account.id,
    coils: { tx, rx, shared: sharedCoil, toDelete: byCaller(editors, coilsToDelete) },
    setups: { forPlans, shared: sharedSetup, toDelete: byCaller(editors, setupsToDelete) },
    plans: {
      draft, report, toDelete: byCaller(editors, toDelete), toOpen: byCaller(openers, toOpen), toSend: byCaller(senders, toSend),
      toAccept: byCaller(acceptors, toAccept), toReturn: byCaller(returners, toReturn),
    },
    bench: {
      planId: benchPlan, cautionsVersion, formPoints, touchstonePoints, csvPoints,
      ownReadings: byCaller(loggers, ownReadings), othersReadings: byCaller(loggers, othersReadings),
      pointsToMark: Object.fromEntries(Object.entries(pointsToMark).map(([c, p]) => [c, p!.id])),
      markedPoints: Object.fromEntries(Object.entries(markedPoints).map(([c, p]) => [c, p!.id])),
      photo, touchstone,
    },
  };
}

/** Deletes what the run made and can be deleted (drafts, unused setups and coils); the rest stays, named with the tag. */
async function cleanUp(researcher: APIRequestContext, f: Fixtures): Promise<void> {
  const base = `/api/studies/${f.studyId}`;
  const named = async (what: string) =>
    ((await (await researcher.get(`${base}/${what}`, RETRY)).json())[what] as { id: number; name: string }[]).filter((x) => x.name.includes(f.tag));
  for (const what of ['plans', 'setups', 'coils']) {
    // a plan that left draft, and a setup or coil still in use, answer 409 and stay
    await inOrder(await named(what), (x) => researcher.delete(`${base}/${what}/${x.id}`, RETRY));
  }
}

// ---------------------------------------------------------------------------------------------
// the matrix

interface Answer {
  status: number;
  contentType: string;
  text: string;
}

async function send(api: APIRequestContext, method: Method, spec: RequestSpec): Promise<Answer> {
  const response = await api.fetch(spec.path, {
    method,
    data: spec.data,
    // a string body is sent as it is: the probe of a body the route cannot read
    headers: typeof spec.data === 'string' ? { 'Content-Type': 'application/json' } : undefined,
    form: spec.form,
    multipart: spec.multipart,
    maxRedirects: 0,
    failOnStatusCode: false,
    timeout: 60_000,
    ...RETRY,
  });
  const status = response.status();
  return { status, contentType: response.headers()['content-type'] ?? '', text: status === 302 ? '' : await response.text() };
}

const isRefusal = (status: number) => status >= 400;
const caseName = (r: RouteRow, c: RouteCase) => `${r.method} ${r.route}${c.label ? ` (${c.label})` : ''}`;

test.describe('role x route matrix', () => {
  let api: Contexts;
  let fixtures: Fixtures;

  test.beforeAll(async ({ playwright }) => {
    test.setTimeout(180_000);
    const contexts = await Promise.all(CALLERS.map(async (caller) => {
      const context = await playwright.request.newContext({ baseURL: BASE_URL });
      if (caller !== 'anonymous') await apiSignIn(context, CALLER_ACCOUNTS[caller]);
      return [caller, context] as const;
    }));
    api = Object.fromEntries(contexts) as Contexts;
    fixtures = await makeFixtures(api);
  });

  test.afterAll(async () => {
    if (api && fixtures) await cleanUp(api.researcher, fixtures);
    await Promise.all(Object.values(api ?? {}).map((context) => context.dispose()));
  });

  test('the callers hold the roles the table assumes', async () => {
    for (const caller of SIGNED_IN_CALLERS) {
      const actor = CALLER_ACTORS[caller];
      const session = await expectStatus(await api[caller].get('/api/auth/session', RETRY), 200, `${caller}'s session`);
      expect(session.user.siteRole, `${caller}'s site role`).toBe(actor.siteRole);
      const response = await api[caller].get(`/api/studies/${fixtures.studyId}`, RETRY);
      if (!canSeeStudy(actor)) {
        expect(response.status(), `${caller} does not see the study`).toBe(404);
        continue;
      }
      const { study } = await expectStatus(response, 200, `${caller} sees the study`);
      expect(study.myRole, `${caller}'s role on the study`).toBe(actor.studyRole);
      expect([...study.allowedActions].sort(), `what the server lets ${caller} do`).toEqual([...allowedStudyActions(actor)].sort());
    }
    const { study: own } = await expectStatus(await api.outsider.get(`/api/studies/${fixtures.otherStudyId}`, RETRY), 200, 'the outsider\u2019s own study');
    expect(own.myRole, 'the outsider\u2019s role on his own study').toBe(OUTSIDER_ON_OWN_STUDY.studyRole);
    expect((await api.anonymous.get('/api/auth/session', RETRY)).status()).toBe(200);
  });

  for (const routeRow of ROUTE_MATRIX) {
    for (const routeCase of routeRow.cases) {
      test(caseName(routeRow, routeCase), async () => {
        const expected = Object.fromEntries(CALLERS.map((c) => [c, expectedStatus(routeCase, c)])) as Record<Caller, number>;
        const answers = {} as Record<Caller, Answer>;
        const ask = async (caller: Caller) => {
          answers[caller] = await send(api[caller], routeRow.method, await routeCase.request(fixtures, caller, api[caller]));
        };
        // those refused first, all at once: they change nothing, so the targets are still as made;
        // then those let through, one by one, as their writes would otherwise race each other
        await Promise.all(CALLERS.filter((c) => isRefusal(expected[c])).map(ask));
        for (const caller of CALLERS.filter((c) => !isRefusal(expected[c]))) await ask(caller);

        const actual = Object.fromEntries(CALLERS.map((c) => [c, answers[c].status]));
        const mismatches = CALLERS.filter((c) => actual[c] !== expected[c]).map((c) => `${c}: ${answers[c].status} ${answers[c].text.slice(0, 300)}`);
        expect(actual, `statuses by caller${routeCase.why ? ` (${routeCase.why})` : ''}\n${mismatches.join('\n')}`).toEqual(expected);

        const leaks = CALLERS.flatMap((c) => errorBodyProblems(routeCase, answers[c].status, answers[c].contentType, answers[c].text)
          .map((problem) => `${c}'s ${answers[c].status} body ${problem}: ${answers[c].text.slice(0, 300)}`));
        expect(leaks, 'error bodies').toEqual([]);

        const sample = await routeCase.request(fixtures, 'researcher', api.researcher);
        if (sample.data !== undefined || sample.multipart !== undefined) {
          // a body the route cannot read is refused before anything else is looked at, and says why plainly
          const unreadable = await send(api.researcher, routeRow.method, { path: sample.path, data: '{"unfinished": ' });
          expect(unreadable.status, `an unreadable body: ${unreadable.text.slice(0, 300)}`).toBe(sample.multipart ? 415 : 422);
          expect(errorBodyProblems(routeCase, unreadable.status, unreadable.contentType, unreadable.text), 'its error body').toEqual([]);
        }

        if (routeCase.access.kind !== 'study') return;
        const spec = await routeCase.request(fixtures, 'outsider', api.outsider);
        const prefix = `/api/studies/${fixtures.studyId}`;
        expect(spec.path.startsWith(`${prefix}/`) || spec.path === prefix, `${spec.path} is a path of the study`).toBe(true);
        const inStudy = spec.path.slice(prefix.length);
        if (expected.outsider === 404) {
          // the same request on a study that does not exist reads exactly the same: nothing is disclosed
          const missing = await send(api.outsider, routeRow.method, { ...spec, path: `/api/studies/${MISSING_STUDY}${inStudy}` });
          expect({ status: missing.status, body: missing.text }, 'a study the outsider may not see answers like one that does not exist')
            .toEqual({ status: answers.outsider.status, body: answers.outsider.text });
        }
        const crossStudy = crossStudyStatus(routeCase, inStudy);
        if (crossStudy !== null) {
          // the pad study's ids sent through the study the outsider runs reach nothing of the pad study
          const through = await send(api.outsider, routeRow.method, { ...spec, path: `/api/studies/${fixtures.otherStudyId}${inStudy}` });
          expect(through.status, `the pad study's ids through the outsider's own study: ${through.text.slice(0, 300)}`).toBe(crossStudy);
          expect(errorBodyProblems(routeCase, through.status, through.contentType, through.text), 'its error body').toEqual([]);
        }
      });
    }
  }
});
