import { expect, test, type APIRequestContext, type APIResponse, type PlaywrightWorkerArgs } from '@playwright/test';
import fs from 'node:fs';
import path from 'node:path';
import { apiSignIn, DEMO, PAD_STUDY } from './support/accounts';
import { FaultInstance } from './support/fault-instance';

/**
 * The services failing under the app, on an instance of their own (e2e/support/fault-instance.ts), so the
 * other specs keep theirs: MariaDB killed (SIGKILL, no shutdown) inside a CSV import's transaction, and the
 * S3 stand-in killed before an upload. Nothing may be half stored, the person gets a plain 503, and the
 * same app process (never restarted) serves again once the service is back.
 */

/** Distances per plan x repeats: 2,000 points, so the import writes 2,000 readings in two INSERT batches. */
const DISTANCES = 100;
const REPEATS = 20;
const ROWS = DISTANCES * REPEATS;
/** The answer while MariaDB is down (src/lib/http/errors.ts), and the file store's (src/lib/storage/object-store.ts). */
const DATABASE_DOWN = 'The database is not reachable; try again shortly.';
const STORAGE_DOWN = 'File storage is not reachable; try again shortly.';
/** What an answer must not show a person: SQL, table names, driver codes, stack frames, source paths. */
const INTERNALS = /insert|select|readings|audit_events|knex|mysql|ECONN|PROTOCOL_|\bat \S+ \(|\.tsx?\b|\.js\b|node_modules/i;

/** Helpful when it fails: each step's time goes to the test's output. */
const log = (message: string) => console.log(`[faults] ${message}`);

let faults: FaultInstance | null = null;

test.beforeAll(async () => {
  test.setTimeout(120_000);
  faults = await FaultInstance.start();
});

test.afterAll(async () => {
  test.setTimeout(90_000);
  await faults?.stop();
  faults = null;
});

function instance(): FaultInstance {
  if (!faults) throw new Error('the faults instance did not start');
  return faults;
}

async function signedIn(playwright: PlaywrightWorkerArgs['playwright'], account: { email: string; password: string }): Promise<APIRequestContext> {
  const api = await playwright.request.newContext({ baseURL: instance().appUrl });
  await apiSignIn(api, account);
  return api;
}

async function json(response: APIResponse, status: number) {
  expect(response.status(), await response.text()).toBe(status);
  return response.json();
}

/** A plan of the pad study on the bench, with its cautions acknowledged by the student who will log on it. */
async function benchPlan(researcher: APIRequestContext, student: APIRequestContext, studyId: number, name: string, distances = DISTANCES, repeats = REPEATS): Promise<number> {
  const { setups } = await json(await researcher.get(`/api/studies/${studyId}/setups`), 200);
  const { plan } = await json(
    await researcher.post(`/api/studies/${studyId}/plans`, {
      data: {
        name, setupId: setups[0].id, minutesPerPoint: 1, repeats,
        axes: [{ quantity: 'distance', displayUnit: 'cm', mode: 'count', start: 0.04, stop: 0.139, count: distances, spacing: 'linear' }],
      },
    }),
    201,
  );
  await expect
    .poll(async () => (await json(await researcher.get(`/api/studies/${studyId}/plans/${plan.id}/progress`), 200)).status, { timeout: 30_000 })
    .toBe('done');
  await json(await researcher.post(`/api/studies/${studyId}/plans/${plan.id}/transition`, { data: { to: 'on_bench' } }), 200);
  const { acknowledgement } = await json(await student.get(`/api/studies/${studyId}/plans/${plan.id}/cautions`), 200);
  await json(await student.post(`/api/studies/${studyId}/plans/${plan.id}/cautions`, { data: { version: acknowledgement.version, acknowledged: true } }), 200);
  return plan.id;
}

/** Every point read by open-circuit voltage: V2 = omega |M| I1 with the predicted M (Keysight Impedance Measurement Handbook). */
async function importBody(student: APIRequestContext, studyId: number, planId: number) {
  const { points } = await json(await student.get(`/api/studies/${studyId}/plans/${planId}/points`), 200);
  expect(points).toHaveLength(ROWS);
  const frequency = 6.78e6;
  const current = 0.25;
  const lines = ['seq,repeat,frequency_Hz,I1_mA,V2_V'];
  for (const p of points as { seq: number; repeatIndex: number; predicted: { mutualInductance: number } }[]) {
    const voltage = 2 * Math.PI * frequency * Math.abs(p.predicted.mutualInductance) * current * (1 + 0.01 * Math.sin(p.seq));
    lines.push(`${p.seq},${p.repeatIndex},${frequency},${current * 1e3},${voltage.toPrecision(6)}`);
  }
  return {
    csv: lines.join('\n'), fileName: `fault-${planId}.csv`, commit: true,
    mapping: {
      seqColumn: 'seq', repeatColumn: 'repeat', method: 'open_circuit', methodColumn: null,
      fields: { frequency: { column: 'frequency_Hz', unit: 'Hz' }, txCurrent: { column: 'I1_mA', unit: 'mA' }, rxVoltage: { column: 'V2_V', unit: 'V' } },
      circumstances: { instrument: null, calibration: null, temperatureC: null, setupNotes: null, accuracy: { relative: 0.005, phaseDeg: 1 } },
    },
  };
}

/** What the import writes, counted by root on the server itself: its readings and its audit row. */
async function stored(planId: number): Promise<{ readings: number; audits: number }> {
  const [{ n: readings }] = await instance().sql<{ n: number }>('SELECT COUNT(*) AS n FROM readings WHERE plan_id = ?', [planId]);
  const [{ n: audits }] = await instance().sql<{ n: number }>("SELECT COUNT(*) AS n FROM audit_events WHERE action = 'readings.import' AND target_id = ?", [String(planId)]);
  return { readings: Number(readings), audits: Number(audits) };
}

/** The import's transaction as the server sees it: rows it changed and what its connection waits for. */
async function importTransaction(): Promise<{ modified: number; state: string } | null> {
  const rows = await instance().sql<{ modified: number; state: string | null }>(
    `SELECT t.trx_rows_modified AS modified, p.STATE AS state
       FROM information_schema.INNODB_TRX t JOIN information_schema.PROCESSLIST p ON p.ID = t.trx_mysql_thread_id
      WHERE p.USER = 'couplet'`,
  );
  if (rows.length === 0) return null;
  const busiest = rows.reduce((a, b) => (Number(b.modified) > Number(a.modified) ? b : a));
  return { modified: Number(busiest.modified), state: busiest.state ?? '' };
}

/** A plain 503: the message the person reads, a Retry-After, and nothing of the internals. */
async function expectPlain503(response: APIResponse, message: string): Promise<void> {
  const text = await response.text();
  expect(response.status(), text).toBe(503);
  expect(JSON.parse(text)).toEqual({ error: message, issues: [] });
  expect(text).not.toMatch(INTERNALS);
  expect(Number(response.headers()['retry-after'])).toBeGreaterThan(0);
}

/** Polls `probe` until it is true; the time it took [ms]. */
async function until(what: string, probe: () => Promise<boolean>, timeoutMs = 20_000, intervalMs = 100): Promise<number> {
  const started = Date.now();
  while (Date.now() - started < timeoutMs) {
    if (await probe().catch(() => false)) return Date.now() - started;
    await new Promise((resolve) => setTimeout(resolve, intervalMs));
  }
  throw new Error(`${what}: not within ${timeoutMs / 1000} s`);
}

/** MariaDB back on the same datadir; then the app, never restarted, answers a read again. */
async function restartAndRecover(student: APIRequestContext, readPath: string): Promise<void> {
  const f = instance();
  let t = Date.now();
  await f.startMariaDb();
  log(`MariaDB restarted with crash recovery in ${Date.now() - t} ms`);
  t = Date.now();
  const waited = await until('the app reading from MariaDB again', async () => (await student.get(readPath)).status() === 200);
  log(`the same app process served ${readPath} again ${waited} ms after MariaDB was up (${Date.now() - t} ms)`);
}

test('MariaDB killed inside a CSV import: nothing of it is stored, the answer is a plain 503, and the app serves again once MariaDB is back', async ({ playwright }) => {
  test.setTimeout(90_000);
  const f = instance();
  const researcher = await signedIn(playwright, DEMO.researcher);
  const student = await signedIn(playwright, DEMO.student);
  const { studies } = await json(await researcher.get('/api/studies'), 200);
  const studyId: number = studies.find((s: { name: string }) => s.name === PAD_STUDY).id;
  const tag = Date.now();
  const [held, racing] = await Promise.all([benchPlan(researcher, student, studyId, `Fault held ${tag}`), benchPlan(researcher, student, studyId, `Fault racing ${tag}`)]);
  const importPath = (planId: number) => `/api/studies/${studyId}/plans/${planId}/readings/import`;
  const readPath = (planId: number) => `/api/studies/${studyId}/plans/${planId}/readings`;

  // 1. Deterministic: the import is held inside its transaction, after every reading is written and
  //    before its audit row, by a root session's lock on the audit table; then the server is killed.
  const body = await importBody(student, studyId, held);
  expect(await stored(held)).toEqual({ readings: 0, audits: 0 });
  const locker = await f.rootSession();
  let answer: Promise<APIResponse>;
  let killedAt: number;
  try {
    await locker.query('LOCK TABLES audit_events WRITE');
    answer = student.post(importPath(held), { data: body, timeout: 60_000 });
    await until('the import waiting for the audit table inside its transaction', async () => /metadata lock/i.test((await importTransaction())?.state ?? ''));
    const inside = await importTransaction();
    log(`import held inside its transaction: ${inside?.modified} rows changed, "${inside?.state}"; killing MariaDB`);
    // every reading written and not committed: the most there is for crash recovery to undo
    expect.soft(inside?.modified, 'rows the import changed inside its transaction before the kill').toBeGreaterThanOrEqual(ROWS);
    killedAt = Date.now();
    await f.killMariaDb();
  } finally {
    // the lock goes with the server: released before the kill, it would let the import commit
    locker.destroy();
  }
  const refused = await answer;
  log(`the import answered ${refused.status()} ${Date.now() - killedAt} ms after the kill: ${await refused.text()}`);
  await expectPlain503(refused, DATABASE_DOWN);
  // while MariaDB is down a read is refused the same way
  await expectPlain503(await student.get(readPath(held)), DATABASE_DOWN);

  await restartAndRecover(student, readPath(held));
  expect(await stored(held), 'after crash recovery the import is wholly absent').toEqual({ readings: 0, audits: 0 });
  expect((await json(await student.get(readPath(held)), 200)).readings).toEqual([]);
  const errorLog = fs.readFileSync(path.join(f.inst.logsDir, 'mariadb-error.log'), 'utf8').split('\n');
  log(`MariaDB's recovery: ${errorLog.filter((l) => /roll(ed|ing)? ?back/i.test(l)).slice(-3).join(' | ') || '(no rollback lines logged)'}`);

  // the same import again, on the same app process: wholly stored
  const t = Date.now();
  const { import: done } = await json(await student.post(importPath(held), { data: body, timeout: 60_000 }), 201);
  log(`the same import re-run: 201 in ${Date.now() - t} ms`);
  expect(done.count).toBe(ROWS);
  expect(await stored(held)).toEqual({ readings: ROWS, audits: 1 });

  // 2. Unplanned: the kill lands while the import's first INSERT of readings runs, wherever that is
  //    (or, if the poll misses it, after the import answered). Either outcome must be whole: nothing
  //    and no audit row, or every reading and one audit row.
  const racingBody = await importBody(student, studyId, racing);
  let answered = false;
  const racingAnswer = student.post(importPath(racing), { data: racingBody, timeout: 60_000 }).finally(() => (answered = true));
  let inserting = false;
  await until('the second import inserting readings, or answering', async () => {
    inserting = (await f.sql<{ n: number }>("SELECT COUNT(*) AS n FROM information_schema.PROCESSLIST WHERE USER = 'couplet' AND INFO LIKE 'insert into `readings`%'"))[0].n > 0;
    return inserting || answered;
  }, 20_000, 1);
  await f.killMariaDb();
  const racingResponse = await racingAnswer;
  log(`second import killed ${inserting ? 'while inserting readings' : 'after it answered'}: answered ${racingResponse.status()}`);
  await restartAndRecover(student, readPath(racing));
  const after = await stored(racing);
  log(`second import after recovery: ${after.readings} readings, ${after.audits} audit rows`);
  expect([{ readings: 0, audits: 0 }, { readings: ROWS, audits: 1 }]).toContainEqual(after);
  if (racingResponse.status() === 201) expect(after).toEqual({ readings: ROWS, audits: 1 });
  else await expectPlain503(racingResponse, DATABASE_DOWN);

  await researcher.dispose();
  await student.dispose();
});

test('the file store killed before an upload: a 503 naming file storage and no row; once it is back, an upload is stored and reads back', async ({ playwright }) => {
  const f = instance();
  const researcher = await signedIn(playwright, DEMO.researcher);
  const student = await signedIn(playwright, DEMO.student);
  const { studies } = await json(await researcher.get('/api/studies'), 200);
  const studyId: number = studies.find((s: { name: string }) => s.name === PAD_STUDY).id;
  const planId = await benchPlan(researcher, student, studyId, `Fault upload ${Date.now()}`, 1, 1);
  const uploadPath = `/api/studies/${studyId}/plans/${planId}/attachments`;
  const sweep = (n: number) => Buffer.from(['freq_Hz,S21_dB', ...Array.from({ length: 200 }, (_, i) => `${6.7e6 + i * 1e3},${(-12 - n - i / 100).toFixed(2)}`)].join('\n'));
  const upload = (bytes: Buffer) =>
    student.post(uploadPath, { multipart: { kind: 'instrument', caption: 'VNA sweep', file: { name: 'sweep.csv', mimeType: 'text/csv', buffer: bytes } }, timeout: 30_000 });
  const rows = async () => {
    const [{ n }] = await f.sql<{ n: number }>('SELECT COUNT(*) AS n FROM attachments WHERE plan_id = ?', [planId]);
    const [{ a }] = await f.sql<{ a: number }>("SELECT COUNT(*) AS a FROM audit_events WHERE action = 'attachment.create'");
    return { attachments: Number(n), audits: Number(a) };
  };
  const before = await rows();

  await f.killS3();
  let t = Date.now();
  const refused = await upload(sweep(1));
  log(`upload with the file store down answered ${refused.status()} in ${Date.now() - t} ms: ${await refused.text()}`);
  await expectPlain503(refused, STORAGE_DOWN);
  expect(await rows(), 'no attachment row (nor its audit row) for a file that was never stored').toEqual(before);

  await f.startS3();
  t = Date.now();
  const { attachment } = await json(await upload(sweep(2)), 201);
  log(`upload with the file store back: 201 in ${Date.now() - t} ms`);
  expect(await rows()).toEqual({ attachments: before.attachments + 1, audits: before.audits + 1 });
  // the member's link leads to the same bytes
  const opened = await student.get(`/api/studies/${studyId}/attachments/${attachment.id}`);
  expect(opened.status()).toBe(200);
  expect(Buffer.compare(await opened.body(), sweep(2))).toBe(0);
  // no row anywhere points at a missing object
  const keys = await f.sql<{ object_key: string }>('SELECT object_key FROM attachments');
  for (const { object_key: key } of keys) {
    expect((await student.get(`${f.s3BucketUrl}/${key}`)).status(), `object ${key} of an attachments row`).toBe(200);
  }

  await researcher.dispose();
  await student.dispose();
});
