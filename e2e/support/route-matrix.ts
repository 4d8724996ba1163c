import type { APIRequestContext } from '@playwright/test';
import { canCreateStudy, canManageAccounts, canOnStudy, canSeeStudy, type Actor, type StudyAction } from '../../src/lib/auth/permissions';
import { findTransition, type PlanState } from '../../src/lib/plans/states';
import { DEMO } from './accounts';

/**
 * Who may call which route handler: one row per (method, route) of src/app/api/**\/route.ts, each with
 * the access rule it needs and a way to build a valid request from fixture ids. The status each of the
 * six callers must get is derived from the rule through src/lib/auth/permissions.ts (the product's role
 * table), so the expectations follow that table: anonymous 401 except on public routes, 404 for the
 * outsider on the study's routes (its existence is not disclosed), 403 for a member or admin without the
 * action, and for those with it the row's `allowed` status: a success, or a domain refusal with its reason.
 * e2e/route-matrix.spec.ts runs it and fails on a handler without a row or a row without a handler.
 */

export const CALLERS = ['anonymous', 'outsider', 'student', 'researcher', 'supervisor', 'admin'] as const;
export type Caller = (typeof CALLERS)[number];
export type SignedInCaller = Exclude<Caller, 'anonymous'>;
export const SIGNED_IN_CALLERS = CALLERS.filter((c): c is SignedInCaller => c !== 'anonymous');

/** The demo accounts (database/seeds/01_demo_lab.ts). Kofi runs his own study and is on no other. */
export const CALLER_ACCOUNTS: Record<SignedInCaller, { email: string; password: string }> = {
  outsider: DEMO.otherResearcher,
  student: DEMO.student,
  researcher: DEMO.researcher,
  supervisor: DEMO.supervisor,
  admin: DEMO.admin,
};

/** Each caller's site role and role on the pad study as the seed makes them; the spec checks both against the server first. */
export const CALLER_ACTORS: Record<SignedInCaller, Actor> = {
  outsider: { siteRole: 'researcher', studyRole: null },
  student: { siteRole: 'member', studyRole: 'student' },
  researcher: { siteRole: 'researcher', studyRole: 'researcher' },
  supervisor: { siteRole: 'member', studyRole: 'supervisor' },
  admin: { siteRole: 'admin', studyRole: null },
};

/** The outsider's roles on the study he runs himself (the seed's rail study); the spec checks them too. */
export const OUTSIDER_ON_OWN_STUDY: Actor = { siteRole: 'researcher', studyRole: 'researcher' };

export type Access =
  /** anyone, signed in or not */
  | { kind: 'public' }
  /** anyone holding the invitation's token: the token is the credential */
  | { kind: 'invitation-token' }
  /** any session */
  | { kind: 'signed-in' }
  /** a site-level right: researcher accounts and admins (canCreateStudy) */
  | { kind: 'create-study' }
  /** a site-level right: admins (canManageAccounts) */
  | { kind: 'admin-only' }
  /** a study action of permissions.ts, on the pad study */
  | { kind: 'study'; action: StudyAction };

const PUBLIC: Access = { kind: 'public' };
const SIGNED_IN: Access = { kind: 'signed-in' };
const ADMIN_ONLY: Access = { kind: 'admin-only' };
const study = (action: StudyAction): Access => ({ kind: 'study', action });

/** The status the access rule gives the caller before the route does anything, or null when it lets the caller through. */
export function accessStatus(access: Access, caller: Caller): number | null {
  if (access.kind === 'public' || access.kind === 'invitation-token') return null;
  if (caller === 'anonymous') return 401;
  const actor = CALLER_ACTORS[caller];
  switch (access.kind) {
    case 'signed-in':
      return null;
    case 'create-study':
      return canCreateStudy(actor.siteRole) ? null : 403;
    case 'admin-only':
      return canManageAccounts(actor.siteRole) ? null : 403;
    case 'study':
      if (!canSeeStudy(actor)) return 404;
      return canOnStudy(actor, access.action) ? null : 403;
  }
}

/** The caller's expected status for a case: the access rule's refusal, else the case's own answer. */
export function expectedStatus(routeCase: RouteCase, caller: Caller): number {
  return accessStatus(routeCase.access, caller) ?? routeCase.allowed;
}

/**
 * What the outsider gets when he sends the case's request to his own study with the pad study's ids
 * everywhere else, or null when that request names none of them (it would only act on his own study).
 * Rows of one study must never be reached through another: 404, or 403 first when his role there
 * lacks the action and the route checks it before looking the row up.
 */
export function crossStudyStatus(routeCase: RouteCase, pathInStudy: string): number | null {
  if (routeCase.access.kind !== 'study') return null;
  if (routeCase.crossStudy !== undefined) return routeCase.crossStudy;
  if (!/^\/[^/?]+\/\d+/.test(pathInStudy)) return null;
  return canOnStudy(OUTSIDER_ON_OWN_STUDY, routeCase.access.action) ? 404 : 403;
}

/** The signed-in callers the product table lets take `action` on the pad study (fixtures are made for them). */
export function callersWith(action: StudyAction): SignedInCaller[] {
  return SIGNED_IN_CALLERS.filter((c) => accessStatus(study(action), c) === null);
}

/** The study action a plan's step needs, from src/lib/plans/states.ts. */
export function transitionAction(from: PlanState, to: PlanState): StudyAction {
  const step = findTransition(from, to);
  if (!step) throw new Error(`Plans have no step ${from} -> ${to}`);
  return step.action;
}

export type ByCaller<T> = Partial<Record<SignedInCaller, T>>;

/**
 * The caller's own target, or for a caller the table refuses the first one made: refused callers are
 * sent first and change nothing, so the target is still as the fixture left it.
 */
export function targetFor<T>(targets: ByCaller<T>, caller: Caller): T {
  const own = caller === 'anonymous' ? undefined : targets[caller];
  if (own !== undefined) return own;
  const first = Object.values(targets)[0];
  if (first === undefined) throw new Error('No fixture was made for this case: no caller may take its action.');
  return first as T;
}

export interface PointRef {
  id: number;
  seq: number;
}

/** Ids the spec creates in its beforeAll, in the pad study (the seeded demo plans are not touched). */
export interface Fixtures {
  /** unique per run, in every name the fixtures and the rows create */
  tag: string;
  studyId: number;
  /** the outsider's own study */
  otherStudyId: number;
  userIds: Record<SignedInCaller, number>;
  invitationToken: string;
  invitationsToRevoke: ByCaller<number>;
  /** a throwaway account, for the admin's PATCH */
  account: number;
  coils: { tx: number; rx: number; shared: number; toDelete: ByCaller<number> };
  setups: { forPlans: number; shared: number; toDelete: ByCaller<number> };
  plans: {
    /** a draft nobody moves: read, changed, recomputed */
    draft: number;
    /** one point with a reading, in review, never changed: a quick report */
    report: number;
    toDelete: ByCaller<number>;
    toOpen: ByCaller<number>;
    /** on the bench with a reading */
    toSend: ByCaller<number>;
    /** in review */
    toAccept: ByCaller<number>;
    toReturn: ByCaller<number>;
  };
  /** a plan on the bench with its predictions done, cautions acknowledged by everyone who logs */
  bench: {
    planId: number;
    cautionsVersion: string;
    formPoints: ByCaller<PointRef>;
    touchstonePoints: ByCaller<PointRef>;
    csvPoints: ByCaller<PointRef>;
    /** a current first version each logger logged, to correct */
    ownReadings: ByCaller<number>;
    /** another current reading of each logger (key: who logged it), for the others to try */
    othersReadings: ByCaller<number>;
    pointsToMark: ByCaller<number>;
    /** set aside in advance, one for each analyst to restore */
    markedPoints: ByCaller<number>;
    photo: number;
    touchstone: number;
  };
}

export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export interface RequestSpec {
  path: string;
  data?: unknown;
  form?: Record<string, string>;
  multipart?: Record<string, string | { name: string; mimeType: string; buffer: Buffer }>;
}

export interface RouteCase {
  /** for a row with several cases */
  label?: string;
  access: Access;
  /** what a caller the access rule lets through gets */
  allowed: number;
  /** why `allowed` is not a success, when it is not */
  why?: string;
  request: (f: Fixtures, caller: Caller, api: APIRequestContext) => RequestSpec | Promise<RequestSpec>;
  /** crossStudyStatus's answer, where the route's order of checks or a body's ids decide it */
  crossStudy?: number;
  /** keys an error body may carry beside `error` and `issues` */
  errorKeys?: readonly string[];
  /** why this route's error bodies are not the app's { error, issues } envelope */
  foreignErrorBody?: string;
}

export interface RouteRow {
  method: Method;
  /** the route's folder under src/app, as the file tree names it */
  route: string;
  cases: RouteCase[];
}

const row = (method: Method, route: string, ...cases: RouteCase[]): RouteRow => ({ method, route, cases });

// ---------------------------------------------------------------------------------------------
// bodies

export const LOOP_TX = { kind: 'loop', radius: 0.05, wireDiameter: 0.001 } as const;
export const LOOP_RX = { kind: 'loop', radius: 0.02, wireDiameter: 0.001 } as const;
export const CIRCUIT = { frequency: 1e6, topology: 'SS', sourceVoltage: 1, sourceResistance: 0.5, loadResistance: 10 } as const;

/** A split-peak reading near k = 0.1 at the circuit's 1 MHz. */
export const SPLIT_PEAKS = { method: 'split_peaks', raw: { lowPeak: 0.95e6, highPeak: 1.05e6 } } as const;

/** A complete 1x1 PNG (signature, IHDR, IDAT, IEND), the common smallest-PNG example. */
export const PNG_1X1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');

/** A Touchstone v1 two-port file of Z-parameters at the circuit's 1 MHz: option line, then f and N11 N21 N12 N22 as pairs. */
export const TOUCHSTONE_S2P = Buffer.from('! route matrix\n# MHz Z RI R 1\n1 0.1 2.0 0.01 0.1 0.01 0.1 0.05 0.5\n');

const ONE_POINT_AXIS = [{ quantity: 'distance', displayUnit: 'cm', mode: 'list', values: [0.1] }];

const studyPath = (f: Fixtures) => `/api/studies/${f.studyId}`;
const planPath = (f: Fixtures, planId: number) => `${studyPath(f)}/plans/${planId}`;
const bench = (f: Fixtures) => planPath(f, f.bench.planId);

/** The current reading of a logger other than `caller` (any logger's, for a caller who may not log). */
function someoneElsesReading(f: Fixtures, caller: Caller): number {
  const others = Object.entries(f.bench.othersReadings).filter(([who]) => who !== caller);
  if (others.length === 0) throw new Error('Only one person may log readings: there is nobody else to correct.');
  return others[0][1] as number;
}

function csvImport(f: Fixtures, caller: Caller) {
  const { seq } = targetFor(f.bench.csvPoints, caller);
  return {
    csv: `seq,repeat,frequency_Hz,I1_mA,V2_V\n${seq},1,1000000,250,0.5\n`,
    fileName: `route-matrix-${caller}.csv`,
    commit: true,
    mapping: {
      seqColumn: 'seq', repeatColumn: 'repeat', method: 'open_circuit', methodColumn: null,
      fields: { frequency: { column: 'frequency_Hz', unit: 'Hz' }, txCurrent: { column: 'I1_mA', unit: 'mA' }, rxVoltage: { column: 'V2_V', unit: 'V' } },
    },
  };
}

// ---------------------------------------------------------------------------------------------
// the table

export const ROUTE_MATRIX: RouteRow[] = [
  row('GET', '/api/health', { access: PUBLIC, allowed: 200, request: () => ({ path: '/api/health' }) }),
  row('GET', '/api/auth/[...nextauth]', { access: PUBLIC, allowed: 200, request: () => ({ path: '/api/auth/session' }) }),
  row('POST', '/api/auth/[...nextauth]', {
    access: PUBLIC,
    allowed: 401,
    why: 'a sign-in with an address that has no account',
    errorKeys: ['url'],
    foreignErrorBody: 'next-auth answers a failed sign-in with { url } naming its error page',
    request: async (f, caller, api) => {
      const { csrfToken } = await (await api.get('/api/auth/csrf')).json();
      return {
        path: '/api/auth/callback/credentials',
        form: { csrfToken, email: `nobody-${f.tag}-${caller}@couplet.test`, password: 'not-the-password-1', json: 'true' },
      };
    },
  }),
  row(
    'GET',
    '/api/invitations/[token]',
    { label: 'a token that was sent', access: { kind: 'invitation-token' }, allowed: 200, request: (f) => ({ path: `/api/invitations/${f.invitationToken}` }) },
    { label: 'a token nobody was sent', access: { kind: 'invitation-token' }, allowed: 404, why: 'an unknown token names no invitation', request: () => ({ path: `/api/invitations/${'A'.repeat(43)}` }) },
  ),
  row('POST', '/api/solve', {
    access: SIGNED_IN,
    allowed: 200,
    request: () => ({ path: '/api/solve', data: { transmitter: LOOP_TX, receiver: LOOP_RX, placement: { distance: 0.1 }, circuit: CIRCUIT, tolerance: 1e-6 } }),
  }),

  row('POST', '/api/account/password', {
    access: SIGNED_IN,
    allowed: 422,
    why: 'a new password too short to accept: a change would end the demo accounts\' other sessions (e2e/sessions.spec.ts changes a throwaway account\'s)',
    request: (f, caller) => ({ path: '/api/account/password', data: { currentPassword: caller === 'anonymous' ? 'no-session' : CALLER_ACCOUNTS[caller].password, newPassword: 'short' } }),
  }),

  // studies and accounts
  row('GET', '/api/studies', { access: SIGNED_IN, allowed: 200, request: () => ({ path: '/api/studies' }) }),
  row('POST', '/api/studies', {
    access: { kind: 'create-study' },
    allowed: 201,
    request: (f, caller) => ({ path: '/api/studies', data: { name: `Route matrix ${f.tag} by ${caller}`, frequencyHz: 1e6 } }),
  }),
  row('GET', '/api/admin/accounts', { access: ADMIN_ONLY, allowed: 200, request: () => ({ path: '/api/admin/accounts' }) }),
  row('POST', '/api/admin/accounts', {
    access: ADMIN_ONLY,
    allowed: 201,
    request: (f, caller) => ({
      path: '/api/admin/accounts',
      data: { email: `rm-${f.tag}-${caller}@couplet.test`, name: `Route Matrix ${caller}`, siteRole: 'member', password: 'route-matrix-pass-2026' },
    }),
  }),
  row('PATCH', '/api/admin/accounts/[userId]', {
    access: ADMIN_ONLY,
    allowed: 200,
    request: (f, caller) => ({ path: `/api/admin/accounts/${f.account}`, data: { name: `Renamed by ${caller}` } }),
  }),
  row('GET', '/api/studies/[studyId]', { access: study('study.view'), allowed: 200, request: (f) => ({ path: studyPath(f) }) }),
  row('GET', '/api/studies/[studyId]/history', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/history?limit=5` }) }),
  row('GET', '/api/studies/[studyId]/reading-column-map', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/reading-column-map` }) }),

  // members and invitations
  row('GET', '/api/studies/[studyId]/members', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/members` }) }),
  row('PATCH', '/api/studies/[studyId]/members/[userId]', {
    access: study('members.manage'),
    allowed: 200,
    // the student's own role again: a valid change that leaves the seeded membership as it is
    request: (f) => ({ path: `${studyPath(f)}/members/${f.userIds.student}`, data: { role: 'student' } }),
  }),
  row('GET', '/api/studies/[studyId]/invitations', { access: study('members.manage'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/invitations` }) }),
  row('POST', '/api/studies/[studyId]/invitations', {
    access: study('members.manage'),
    allowed: 201,
    request: (f, caller) => ({ path: `${studyPath(f)}/invitations`, data: { email: `rm-${f.tag}-invited-by-${caller}@couplet.test`, role: 'student' } }),
  }),
  row('DELETE', '/api/studies/[studyId]/invitations/[invitationId]', {
    access: study('members.manage'),
    allowed: 204,
    request: (f, caller) => ({ path: `${studyPath(f)}/invitations/${targetFor(f.invitationsToRevoke, caller)}` }),
  }),

  // coils and setups
  row('GET', '/api/studies/[studyId]/coils', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/coils` }) }),
  row('POST', '/api/studies/[studyId]/coils', {
    access: study('study.edit'),
    allowed: 201,
    request: (f, caller) => ({ path: `${studyPath(f)}/coils`, data: { name: `RM coil ${f.tag} by ${caller}`, spec: LOOP_RX } }),
  }),
  row('GET', '/api/studies/[studyId]/coils/[coilId]', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/coils/${f.coils.shared}` }) }),
  row('PATCH', '/api/studies/[studyId]/coils/[coilId]', {
    access: study('study.edit'),
    allowed: 200,
    request: (f, caller) => ({ path: `${studyPath(f)}/coils/${f.coils.shared}`, data: { notes: `Checked by the route matrix (${caller}).` } }),
  }),
  row('DELETE', '/api/studies/[studyId]/coils/[coilId]', {
    access: study('study.edit'),
    allowed: 204,
    request: (f, caller) => ({ path: `${studyPath(f)}/coils/${targetFor(f.coils.toDelete, caller)}` }),
  }),
  row('GET', '/api/studies/[studyId]/setups', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/setups` }) }),
  row('POST', '/api/studies/[studyId]/setups', {
    access: study('study.edit'),
    allowed: 201,
    crossStudy: 422,
    request: (f, caller) => ({
      path: `${studyPath(f)}/setups`,
      data: { name: `RM setup ${f.tag} by ${caller}`, transmitterCoilId: f.coils.tx, receiverCoilId: f.coils.rx, placement: { distance: 0.1 }, circuit: CIRCUIT },
    }),
  }),
  row('GET', '/api/studies/[studyId]/setups/[setupId]', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/setups/${f.setups.shared}` }) }),
  row('PATCH', '/api/studies/[studyId]/setups/[setupId]', {
    access: study('study.edit'),
    allowed: 200,
    request: (f, caller) => ({ path: `${studyPath(f)}/setups/${f.setups.shared}`, data: { notes: `Checked by the route matrix (${caller}).` } }),
  }),
  row('DELETE', '/api/studies/[studyId]/setups/[setupId]', {
    access: study('study.edit'),
    allowed: 204,
    request: (f, caller) => ({ path: `${studyPath(f)}/setups/${targetFor(f.setups.toDelete, caller)}` }),
  }),

  // plans
  row('GET', '/api/studies/[studyId]/plans', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${studyPath(f)}/plans` }) }),
  row('POST', '/api/studies/[studyId]/plans', {
    access: study('study.edit'),
    allowed: 201,
    crossStudy: 422,
    request: (f, caller) => ({
      path: `${studyPath(f)}/plans`,
      data: { name: `RM plan ${f.tag} by ${caller}`, setupId: f.setups.forPlans, minutesPerPoint: 1, axes: ONE_POINT_AXIS },
    }),
  }),
  row('GET', '/api/studies/[studyId]/plans/[planId]', { access: study('study.view'), allowed: 200, request: (f) => ({ path: bench(f) }) }),
  row('PATCH', '/api/studies/[studyId]/plans/[planId]', {
    access: study('study.edit'),
    allowed: 200,
    request: (f, caller) => ({ path: planPath(f, f.plans.draft), data: { notes: `Checked by the route matrix (${caller}).` } }),
  }),
  row('DELETE', '/api/studies/[studyId]/plans/[planId]', {
    access: study('study.edit'),
    allowed: 204,
    request: (f, caller) => ({ path: planPath(f, targetFor(f.plans.toDelete, caller)) }),
  }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/points', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/points` }) }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/points.csv', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/points.csv` }) }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/dictionary.csv', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/dictionary.csv` }) }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/progress', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/progress` }) }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/predictions', {
    access: study('study.edit'),
    allowed: 202,
    request: (f) => ({ path: `${planPath(f, f.plans.draft)}/predictions` }),
  }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/predictions/cancel', {
    access: study('study.edit'),
    allowed: 409,
    why: 'the bench plan\u2019s predictions are done, so no computation runs to stop',
    request: (f) => ({ path: `${bench(f)}/predictions/cancel` }),
  }),
  row(
    'POST',
    '/api/studies/[studyId]/plans/[planId]/transition',
    {
      label: 'draft to the bench',
      access: study(transitionAction('draft', 'on_bench')),
      allowed: 200,
      request: (f, caller) => ({ path: `${planPath(f, targetFor(f.plans.toOpen, caller))}/transition`, data: { to: 'on_bench' } }),
    },
    {
      label: 'bench to review',
      access: study(transitionAction('on_bench', 'in_review')),
      allowed: 200,
      request: (f, caller) => ({ path: `${planPath(f, targetFor(f.plans.toSend, caller))}/transition`, data: { to: 'in_review' } }),
    },
    {
      label: 'accept',
      access: study(transitionAction('in_review', 'accepted')),
      allowed: 200,
      // the plan is looked up before the role: another study's plan is not there
      crossStudy: 404,
      request: (f, caller) => ({ path: `${planPath(f, targetFor(f.plans.toAccept, caller))}/transition`, data: { to: 'accepted' } }),
    },
    {
      label: 'return with a reason',
      access: study(transitionAction('in_review', 'on_bench')),
      allowed: 200,
      // the plan is looked up before the role: another study's plan is not there
      crossStudy: 404,
      request: (f, caller) => ({
        path: `${planPath(f, targetFor(f.plans.toReturn, caller))}/transition`,
        data: { to: 'on_bench', reason: `Returned by the route matrix (${caller}).` },
      }),
    },
    {
      label: 'a step the states do not allow',
      access: study('study.view'),
      allowed: 409,
      why: 'a draft cannot be accepted; the state is checked before the role',
      request: (f) => ({ path: `${planPath(f, f.plans.draft)}/transition`, data: { to: 'accepted' } }),
    },
  ),

  // the bench
  row('GET', '/api/studies/[studyId]/plans/[planId]/cautions', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/cautions` }) }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/cautions', {
    access: study('readings.log'),
    allowed: 200,
    // acknowledged in the fixtures already; a second acknowledgement changes nothing
    request: (f) => ({ path: `${bench(f)}/cautions`, data: { version: f.bench.cautionsVersion, acknowledged: true } }),
  }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/readings', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/readings` }) }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/readings', {
    access: study('readings.log'),
    allowed: 201,
    request: (f, caller) => ({ path: `${bench(f)}/readings`, data: { pointId: targetFor(f.bench.formPoints, caller).id, ...SPLIT_PEAKS } }),
  }),
  row(
    'POST',
    '/api/studies/[studyId]/plans/[planId]/readings/[readingId]/corrections',
    {
      label: 'their own reading',
      access: study('readings.log'),
      allowed: 201,
      request: (f, caller) => ({
        path: `${bench(f)}/readings/${targetFor(f.bench.ownReadings, caller)}/corrections`,
        data: { ...SPLIT_PEAKS, raw: { lowPeak: 0.96e6, highPeak: 1.05e6 }, reason: 'Read the lower peak again.' },
      }),
    },
    {
      label: 'someone else\u2019s reading',
      access: study('readings.log'),
      allowed: 403,
      why: 'only the person who logged a reading corrects it',
      request: (f, caller) => ({
        path: `${bench(f)}/readings/${someoneElsesReading(f, caller)}/corrections`,
        data: { ...SPLIT_PEAKS, raw: { lowPeak: 0.96e6, highPeak: 1.05e6 }, reason: 'Read the lower peak again.' },
      }),
    },
  ),
  row('POST', '/api/studies/[studyId]/plans/[planId]/readings/from-touchstone', {
    access: study('readings.log'),
    allowed: 201,
    request: (f, caller) => ({
      path: `${bench(f)}/readings/from-touchstone`,
      data: { pointId: targetFor(f.bench.touchstonePoints, caller).id, attachmentId: f.bench.touchstone },
    }),
  }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/readings/import', {
    access: study('readings.log'),
    allowed: 201,
    errorKeys: ['report'],
    request: (f, caller) => ({ path: `${bench(f)}/readings/import`, data: csvImport(f, caller) }),
  }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/attachments', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/attachments` }) }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/attachments', {
    access: study('readings.log'),
    allowed: 201,
    request: (f, caller) => ({
      path: `${bench(f)}/attachments`,
      multipart: { kind: 'photo', caption: `Bench photo by ${caller}`, file: { name: 'bench.png', mimeType: 'image/png', buffer: PNG_1X1 } },
    }),
  }),
  row('GET', '/api/studies/[studyId]/attachments/[attachmentId]', {
    access: study('study.view'),
    allowed: 302,
    request: (f) => ({ path: `${studyPath(f)}/attachments/${f.bench.photo}` }),
  }),

  // the review
  row('GET', '/api/studies/[studyId]/plans/[planId]/comments', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/comments` }) }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/comments', {
    access: study('comments.write'),
    allowed: 201,
    request: (f, caller) => ({ path: `${bench(f)}/comments`, data: { pointId: null, body: `A comment from the route matrix (${caller}).` } }),
  }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/review', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${bench(f)}/review?quantity=efficiency` }) }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/review/fits', {
    access: study('review.analyse'),
    allowed: 201,
    request: (f) => ({ path: `${bench(f)}/review/fits`, data: { model: 'extra_rx_resistance', quantity: 'efficiency' } }),
  }),
  row('POST', '/api/studies/[studyId]/plans/[planId]/review/marks', {
    access: study('review.analyse'),
    allowed: 201,
    request: (f, caller) => ({ path: `${bench(f)}/review/marks`, data: { pointId: targetFor(f.bench.pointsToMark, caller), reason: `Set aside by ${caller}.` } }),
  }),
  row('DELETE', '/api/studies/[studyId]/plans/[planId]/review/marks/[pointId]', {
    access: study('review.analyse'),
    allowed: 204,
    request: (f, caller) => ({ path: `${bench(f)}/review/marks/${targetFor(f.bench.markedPoints, caller)}` }),
  }),
  row('PUT', '/api/studies/[studyId]/plans/[planId]/review/tolerance', {
    access: study('review.analyse'),
    allowed: 200,
    request: (f) => ({ path: `${bench(f)}/review/tolerance`, data: { tolerance: 0.1 } }),
  }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/report.pdf', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${planPath(f, f.plans.report)}/report.pdf` }) }),
  row('GET', '/api/studies/[studyId]/plans/[planId]/report.zip', { access: study('study.view'), allowed: 200, request: (f) => ({ path: `${planPath(f, f.plans.report)}/report.zip` }) }),
];

/**
 * Server actions have no stable URL: a page's form calls them. Each is listed with the test that
 * calls it directly with the callers it must refuse and the ones it lets through.
 */
export interface ServerActionRow {
  /** the 'use server' file, from the repository root */
  file: string;
  name: string;
  access: Access['kind'];
  coveredBy: string;
  reason: string;
}

export const SERVER_ACTIONS: ServerActionRow[] = [
  {
    file: 'src/app/invite/[token]/actions.ts',
    name: 'acceptWithNewAccount',
    access: 'invitation-token',
    coveredBy: 'unit/lib/auth/server-actions-access.test.ts',
    reason: 'the invitation page\u2019s new-account form; the token is the credential, so the test tries unknown, used and valid tokens and an address that has an account',
  },
  {
    file: 'src/app/invite/[token]/actions.ts',
    name: 'joinAsSignedInUser',
    access: 'signed-in',
    coveredBy: 'unit/lib/auth/server-actions-access.test.ts',
    reason: 'the invitation page\u2019s join button; the test calls it signed out, as another account and as the invited one',
  },
];
