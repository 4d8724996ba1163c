import fc from 'fast-check';
import type { SessionUser } from '../../src/lib/auth/session-user';
import { createCoil } from '../../src/lib/data/coils';
import { planPredictionRun, setPlanSolverPool } from '../../src/lib/data/plan-predictions';
import { listPlanPoints } from '../../src/lib/data/plan-points';
import { createPlan, transitionPlan } from '../../src/lib/data/plans';
import { acknowledgeCautions, createReading } from '../../src/lib/data/readings';
import { createSetup } from '../../src/lib/data/setups';
import { createStudy } from '../../src/lib/data/studies';
import { BENCH_CAUTIONS_VERSION } from '../../src/lib/readings/bench-cautions';
import { createSourceWorker } from '../../src/lib/solver-pool/source-worker';
import { SolverPool } from '../../src/lib/solver-pool/solver-pool';
import { coilCreateSchema } from '../../src/lib/validations/coil';
import { planCreateSchema } from '../../src/lib/validations/plan';
import { readingCreateSchema } from '../../src/lib/validations/reading';
import { setupCreateSchema } from '../../src/lib/validations/setup';
import { studyCreateSchema } from '../../src/lib/validations/study';
import { db, SEEDED, sessionUserByEmail } from './database';
import { databaseState, expectWellFormed, hostileBody, hostileQuery, readAnswer, showBody, type WireBody } from './fuzz-json';

/**
 * A throw-away study for the route fuzzing, so a hostile body that happens to be valid changes only
 * rows made for it: two coils, a setup, a draft plan, a plan on the bench (cautions acknowledged, one
 * reading) and a plan kept for state changes. Everything made after `baseline()` is removed again.
 */

export const FUZZ_HELIX = { kind: 'helix', radius: 0.05, turns: 10, length: 0.02, wireDiameter: 0.001 } as const;
export const FUZZ_CIRCUIT = { frequency: 6.78e6, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 } as const;
export const FUZZ_AXES = [{ quantity: 'distance', displayUnit: 'cm', mode: 'list', values: [0.05, 0.1] }] as const;

export interface Baseline {
  studies: number;
  users: number;
  audit: number;
  mail: number;
}

const maxId = async (table: string) => Number((await db(table).max({ id: 'id' }).first())?.id ?? 0);

export async function baseline(): Promise<Baseline> {
  return { studies: await maxId('studies'), users: await maxId('users'), audit: await maxId('audit_events'), mail: await maxId('mail_outbox') };
}

export interface FuzzStudy {
  researcher: SessionUser;
  student: SessionUser;
  studyId: number;
  coilIds: [number, number];
  setupId: number;
  draftPlanId: number;
  benchPlanId: number;
  statePlanId: number;
  pointIds: number[];
  readingId: number;
}

/** The fixture study; the caller has set a plan solver pool. */
export async function createFuzzStudy(label: string): Promise<FuzzStudy> {
  const researcher = await sessionUserByEmail(SEEDED.researcher);
  const student = await sessionUserByEmail(SEEDED.student);
  const study = await createStudy(researcher, studyCreateSchema.parse({ name: `${label} ${process.pid}-${Date.now()}`, frequencyHz: 6.78e6 }));
  const studyId = study.id;
  await db('study_members').insert({ study_id: studyId, user_id: student.id, role: 'student' });
  const coil = async (name: string) => (await createCoil(researcher, studyId, coilCreateSchema.parse({ name, spec: FUZZ_HELIX }))).id;
  const coilIds: [number, number] = [await coil('Fuzz helix A'), await coil('Fuzz helix B')];
  const setupId = (await createSetup(researcher, studyId, setupCreateSchema.parse({
    name: 'Fuzz helices', transmitterCoilId: coilIds[0], receiverCoilId: coilIds[1], placement: { distance: 0.1 }, circuit: FUZZ_CIRCUIT,
  }))).id;
  const plan = async (name: string) => {
    const created = await createPlan(researcher, studyId, planCreateSchema.parse({ name, setupId, axes: FUZZ_AXES, minutesPerPoint: 2 }));
    await planPredictionRun(created.id);
    return created.id;
  };
  const draftPlanId = await plan('Fuzz draft');
  const benchPlanId = await plan('Fuzz bench');
  const statePlanId = await plan('Fuzz states');
  await transitionPlan(researcher, studyId, benchPlanId, { to: 'on_bench' });
  await acknowledgeCautions(researcher, studyId, benchPlanId, BENCH_CAUTIONS_VERSION);
  const pointIds = (await listPlanPoints(researcher, studyId, benchPlanId)).map((p) => p.id);
  const reading = await createReading(researcher, studyId, benchPlanId, readingCreateSchema.parse({
    pointId: pointIds[0], method: 'open_circuit', raw: { frequency: 6.78e6, txCurrent: 0.25, rxVoltage: 0.5 },
  }));
  return { researcher, student, studyId, coilIds, setupId, draftPlanId, benchPlanId, statePlanId, pointIds, readingId: reading.id };
}

/** Waits for every prediction run of the studies made since `base`, so no background write lands mid-comparison. */
export async function settlePredictions(base: Baseline): Promise<void> {
  const plans = await db('sweep_plans').join('studies', 'studies.id', 'sweep_plans.study_id').where('studies.id', '>', base.studies).pluck('sweep_plans.id');
  await Promise.all(plans.map((id: number) => planPredictionRun(id)));
}

/** Removes every study, account, audit event and mail made since `base`, children first. */
export async function removeSince(base: Baseline): Promise<void> {
  await settlePredictions(base);
  const studies = db('studies').where('id', '>', base.studies).select('id');
  const plans = db('sweep_plans').whereIn('study_id', studies).select('id');
  // A correction refers to the version it supersedes: newest first, one at a time (knex drops ORDER BY from a delete).
  for (const id of await db('readings').whereIn('plan_id', plans).orderBy('id', 'desc').pluck('id')) await db('readings').where({ id }).del();
  await db('attachments').whereIn('study_id', studies).del();
  await db('sweep_plans').whereIn('study_id', studies).del();
  await db('setups').whereIn('study_id', studies).del();
  await db('coils').whereIn('study_id', studies).del();
  await db('studies').where('id', '>', base.studies).del();
  await db('audit_events').where('id', '>', base.audit).del();
  await db('mail_outbox').where('id', '>', base.mail).del();
  await db('users').where('id', '>', base.users).del();
}

type Handler = (request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>;

/** Calls a route handler as Next does: a real Request and the params promise. */
export async function callRoute(handler: unknown, options: { method: string; url: string; body?: WireBody; params?: Record<string, string> }) {
  const request = new Request(`http://127.0.0.1${options.url}`, {
    method: options.method,
    headers: options.body === undefined ? {} : { 'content-type': 'application/json' },
    body: options.body as BodyInit | undefined,
  });
  return readAnswer(await (handler as Handler)(request, { params: Promise.resolve(options.params ?? {}) }));
}

export interface JsonRouteCase {
  name: string;
  handler: unknown;
  method: string;
  url: string;
  params: Record<string, string>;
  actor: SessionUser;
  /** A body the route accepts; the hostile bodies are built around it. */
  valid: Record<string, unknown>;
  /** The route's body limit [bytes]. */
  limit: number;
}

/**
 * Sends hostile bodies to one route as `case.actor` (through `setActor`, the test's requireUser mock):
 * every answer is well formed, and a refused one left the database as it was. Bodies the route
 * accepts are allowed; their rows are removed with the fixture study.
 */
export async function fuzzJsonRoute(
  c: JsonRouteCase,
  base: Baseline,
  setActor: (user: SessionUser) => void,
  bodies: fc.Arbitrary<WireBody> = hostileBody(c.valid, c.limit),
): Promise<{ statuses: Record<number, number> }> {
  const statuses: Record<number, number> = {};
  await fc.assert(
    fc.asyncProperty(bodies, async (body) => {
      setActor(c.actor);
      const before = await databaseState();
      const answer = await callRoute(c.handler, { method: c.method, url: c.url, body, params: c.params });
      statuses[answer.status] = (statuses[answer.status] ?? 0) + 1;
      expectWellFormed(answer, `${c.method} ${c.url} ${showBody(body)}`);
      if (answer.status >= 300) expect(await databaseState()).toEqual(before);
      else await settlePredictions(base);
    }),
  );
  return { statuses };
}

/** The same for a GET route's query string; reading never writes. */
export async function fuzzQueryRoute(c: Omit<JsonRouteCase, 'valid' | 'limit' | 'method'> & { keys: string[] }, setActor: (user: SessionUser) => void): Promise<void> {
  await fc.assert(
    fc.asyncProperty(hostileQuery(c.keys), async (query) => {
      setActor(c.actor);
      const before = await databaseState();
      const answer = await callRoute(c.handler, { method: 'GET', url: `${c.url}?${query}`, params: c.params });
      expectWellFormed(answer, `GET ${c.url}?${query}`);
      expect(await databaseState()).toEqual(before);
    }),
  );
}

/**
 * Path ids as a URL may carry them: not numbers, zero, padded, signed, past 32 bits, other digits, and
 * well-formed ids no row has. Never a small id, which could name a seeded row and change it.
 */
const hostileId = fc.oneof(
  fc.constantFrom('0', '00', '01', '-1', '+1', '1e3', '1.0', ' 1', '1 ', '0x1', '9999999999', '99999999999', '4294967296', '4294967295', '2147483648', '2147483647', '\u0661', '1%00', '..', ''),
  fc.string({ unit: 'binary', maxLength: 12 }).filter((id) => !/^\d{1,9}$/.test(id)),
);

/** The route's valid body with hostile ids in the path: refused with a well-formed 4xx, and nothing written. */
export async function fuzzIdParams(c: JsonRouteCase, keys: string[], setActor: (user: SessionUser) => void): Promise<void> {
  await fc.assert(
    fc.asyncProperty(fc.constantFrom(...keys), hostileId, async (key, id) => {
      setActor(c.actor);
      const before = await databaseState();
      const answer = await callRoute(c.handler, { method: c.method, url: c.url, body: JSON.stringify(c.valid), params: { ...c.params, [key]: id } });
      expectWellFormed(answer, `${c.method} ${c.url} with ${key}=${JSON.stringify(id)}`);
      expect(answer.status).toBe(404);
      expect(await databaseState()).toEqual(before);
    }),
  );
}

/** What a fuzz suite runs in: a solver pool of its own for plan predictions, the database as it was, and a study. */
export interface FuzzWorld {
  pool: SolverPool;
  base: Baseline;
  fx: FuzzStudy;
}

/** Starts the suite's pool (one worker, room to queue), notes the database's state and makes the study. */
export async function openFuzzWorld(label: string): Promise<FuzzWorld> {
  const pool = new SolverPool({ size: 1, queueLimit: 64, timeoutMs: 60_000, createWorker: () => createSourceWorker() });
  setPlanSolverPool(pool);
  const base = await baseline();
  return { pool, base, fx: await createFuzzStudy(label) };
}

/** Removes what the suite wrote and stops its pool; parts never opened (a failed start) are skipped. */
export async function closeFuzzWorld({ pool, base }: Partial<FuzzWorld>): Promise<void> {
  if (base) await removeSince(base);
  setPlanSolverPool(null);
  await pool?.close();
}
