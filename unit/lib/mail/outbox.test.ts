import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { createInvitation } from '../../../src/lib/data/invitations';
import { setPlanSolverPool } from '../../../src/lib/data/plan-predictions';
import { transitionPlan } from '../../../src/lib/data/plans';
import { acknowledgeCautions, createReading } from '../../../src/lib/data/readings';
import {
  deliverPending,
  enqueueMail,
  retryDelayMs,
  shortError,
  startOutboxDispatcher,
  stopOutboxDispatcher,
} from '../../../src/lib/mail/outbox';
import { setMailTransportConfig } from '../../../src/lib/mail/transport';
import { BENCH_CAUTIONS_VERSION } from '../../../src/lib/readings/bench-cautions';
import { createSourceWorker } from '../../../src/lib/solver-pool/source-worker';
import { SolverPool } from '../../../src/lib/solver-pool/solver-pool';
import { readingCreateSchema } from '../../../src/lib/validations/reading';
import { db, SEEDED, sessionUserByEmail, studyIdByName } from '../../support/database';
import { messagesTo, type InboxMessage } from '../../support/inbox';
import { createPredictedPlan } from '../../support/predicted-plan';

/**
 * The mail outbox against real SMTP: a port nothing listens on (a relay that is down) and the
 * project's own SMTP stand-in (scripts/mail-server.mjs), started and stopped by this file on ports of
 * its own, so its inbox holds only what these tests sent.
 */

/** The database and this process share one clock; a query's round trip is well under this. */
const CLOCK_TOLERANCE_MS = 1_000;
/** kickOutbox sends right after the commit; a loopback relay answers in milliseconds. */
const KICK_DELIVERY_MS = 2_000;
const MAX_ERROR_LENGTH = 200;

const MAIL_SERVER = path.resolve(__dirname, '../../../scripts/mail-server.mjs');
const run = Date.now().toString(36);

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

async function waitUntil(check: () => Promise<boolean>, timeoutMs: number, what: string): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await check().catch(() => false)) return;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
  throw new Error(`${what} within ${timeoutMs} ms`);
}

/** The SMTP stand-in as `npm test` runs it (scripts/lib/mail.mjs), on this file's own ports and folder. */
class StandIn {
  private child: ChildProcess | null = null;
  constructor(readonly smtpPort: number, readonly httpPort: number, readonly dir: string) {}

  async start(): Promise<void> {
    this.child = spawn(process.execPath, [MAIL_SERVER, '--smtp-port', String(this.smtpPort), '--http-port', String(this.httpPort), '--dir', this.dir, '--host', '127.0.0.1'], { stdio: 'ignore' });
    await waitUntil(async () => (await fetch(`http://127.0.0.1:${this.httpPort}/api/health`)).ok, 15_000, 'the SMTP stand-in did not start');
  }

  async stop(): Promise<void> {
    const child = this.child;
    this.child = null;
    if (!child || child.exitCode !== null) return;
    const exited = new Promise((resolve) => child.once('exit', resolve));
    child.kill('SIGTERM');
    await exited;
  }

  async messagesTo(address: string): Promise<InboxMessage[]> {
    const response = await fetch(`http://127.0.0.1:${this.httpPort}/api/messages?to=${encodeURIComponent(address)}`);
    return response.json();
  }
}

/** Milliseconds from the database's now to each row's next attempt. */
async function msUntilNextAttempt(ids: number[]): Promise<number[]> {
  const rows = await db('mail_outbox')
    .whereIn('id', ids)
    .orderBy('id')
    .select(db.raw('TIMESTAMPDIFF(MICROSECOND, UTC_TIMESTAMP(3), next_attempt_at) AS us'));
  return rows.map((row: { us: number | string }) => Number(row.us) / 1000);
}

async function enqueueTo(addresses: string[], padId: number): Promise<number[]> {
  return db.transaction(async (trx) => {
    const ids: number[] = [];
    for (const to of addresses) {
      ids.push(await enqueueMail(trx, { to, subject: `Outbox drill for ${to}`, text: `Hello ${to}`, html: `<p>Hello ${to}</p>` }, { kind: 'invitation', studyId: padId }));
    }
    return ids;
  });
}

describe('mail outbox', () => {
  let pool: SolverPool;
  let padId: number;
  let standIn: StandIn;
  let warn: jest.SpyInstance;
  let tmpDir: string;

  beforeAll(async () => {
    pool = new SolverPool({ size: 1, queueLimit: 16, timeoutMs: 60_000, createWorker: () => createSourceWorker() });
    setPlanSolverPool(pool);
    padId = await studyIdByName(SEEDED.padStudy);
    tmpDir = fs.mkdtempSync(path.join(os.tmpdir(), 'couplet-outbox-'));
    standIn = new StandIn(await freePort(), await freePort(), tmpDir);
    warn = jest.spyOn(console, 'warn').mockImplementation(() => {});
  });
  afterAll(async () => {
    warn.mockRestore();
    await stopOutboxDispatcher();
    setMailTransportConfig(null);
    await standIn.stop();
    fs.rmSync(tmpDir, { recursive: true, force: true });
    setPlanSolverPool(null);
    await pool.close();
    await db.destroy();
  });

  it('waits 5 s after the first failure, doubling to at most 10 min (this project’s policy, capped exponential backoff as is common practice)', () => {
    expect([1, 2, 3, 4, 5, 6, 7, 8, 20].map(retryDelayMs)).toEqual([5_000, 10_000, 20_000, 40_000, 80_000, 160_000, 320_000, 600_000, 600_000]);
  });

  it('keeps one short line of an error: its code and first line, never the stack', () => {
    const error = Object.assign(new Error(`connect ECONNREFUSED 127.0.0.1:1\n${'detail '.repeat(80)}`), { code: 'ESOCKET' });
    expect(shortError(error)).toBe('ESOCKET: connect ECONNREFUSED 127.0.0.1:1');
    expect(shortError(new Error('x'.repeat(500)))).toHaveLength(MAX_ERROR_LENGTH);
  });

  it('with the relay down, an invitation and a submission succeed and their mail waits, retried later', async () => {
    setMailTransportConfig({ host: '127.0.0.1', port: await freePort() }); // nothing listens there
    const [researcher, student, supervisor] = await Promise.all([SEEDED.researcher, SEEDED.student, SEEDED.supervisor].map(sessionUserByEmail));

    const invitee = `outage.${run}@lab.test`;
    const invitation = await createInvitation(researcher, padId, { email: invitee, role: 'student' });
    expect(invitation).toMatchObject({ email: invitee, mailStatus: 'queued' });
    expect(await db('invitations').where({ email: invitee })).toHaveLength(1);

    const planName = `Outage drill ${run}`;
    const { planId, points } = await createPredictedPlan({
      name: planName, repeats: 1, referenceEvery: null, orderMode: 'as_listed', shuffleSeed: null, notes: '',
      axes: [{ quantity: 'tiltDeg', displayUnit: 'deg', mode: 'list', values: [0] }],
    });
    await transitionPlan(researcher, padId, planId, { to: 'on_bench' });
    await acknowledgeCautions(student, padId, planId, BENCH_CAUTIONS_VERSION);
    await createReading(student, padId, planId, readingCreateSchema.parse({ pointId: points[0].id, method: 'split_peaks', raw: { lowPeak: 6.6e6, highPeak: 6.9e6 } }));
    expect((await transitionPlan(student, padId, planId, { to: 'in_review' })).state).toBe('in_review');

    const queued = await db('mail_outbox')
      .where({ to_address: invitee, kind: 'invitation' })
      .orWhere((q) => q.where({ to_address: supervisor.email, kind: 'plan.submitted' }).where('subject', 'like', `%${planName}%`))
      .orderBy('id')
      .select('id', 'kind', 'study_id', 'attempts', 'sent_at');
    expect(queued.map((row) => [row.kind, row.study_id, row.attempts, row.sent_at])).toEqual([['invitation', padId, 0, null], ['plan.submitted', padId, 0, null]]);
    const ids = queued.map((row) => row.id as number);

    const report = await deliverPending({ limit: 100 });
    expect(report.failed).toEqual(expect.arrayContaining(ids));
    expect(report.sent.filter((id) => ids.includes(id))).toEqual([]);
    const after = await db('mail_outbox').whereIn('id', ids).orderBy('id').select('attempts', 'last_error', 'sent_at');
    for (const row of after) {
      expect(row).toMatchObject({ attempts: 1, sent_at: null });
      expect(row.last_error).toMatch(/ECONNREFUSED/);
      expect(row.last_error.length).toBeLessThanOrEqual(MAX_ERROR_LENGTH);
      expect(row.last_error).not.toMatch(/\n|\bat .+\(/);
    }
    for (const ms of await msUntilNextAttempt(ids)) expect(Math.abs(ms - retryDelayMs(1))).toBeLessThan(CLOCK_TOLERANCE_MS);
    expect(warn).toHaveBeenCalledWith(expect.stringMatching(new RegExp(`^Mail outbox: invitation mail #${ids[0]} not sent \\(attempt 1, next try in 5 s\\): .*ECONNREFUSED`)));

    // not due again before the backoff, and nothing reached anybody
    const again = await deliverPending({ limit: 100 });
    expect([...again.sent, ...again.failed].filter((id) => ids.includes(id))).toEqual([]);
    expect(await messagesTo(invitee)).toHaveLength(0);
  });

  it('keeps mail while the relay is stopped and sends each exactly once when it is back', async () => {
    setMailTransportConfig({ host: '127.0.0.1', port: standIn.smtpPort });
    const addresses = [1, 2, 3].map((i) => `relay.${i}.${run}@lab.test`);
    const ids = await enqueueTo(addresses, padId);

    const whileDown = await deliverPending({ limit: 100 });
    expect(whileDown.failed).toEqual(expect.arrayContaining(ids));
    expect(await db('mail_outbox').whereIn('id', ids).whereNull('sent_at').where({ attempts: 1 })).toHaveLength(3);

    await standIn.start();
    // the 5 s backoff, fast-forwarded
    await db('mail_outbox').whereIn('id', ids).update({ next_attempt_at: db.raw('UTC_TIMESTAMP(3)') });
    const whenUp = await deliverPending({ limit: 100 });
    expect(whenUp.sent).toEqual(expect.arrayContaining(ids));
    const rows = await db('mail_outbox').whereIn('id', ids).select('attempts', 'sent_at');
    expect(rows.every((row) => row.sent_at instanceof Date && row.attempts === 2)).toBe(true);
    for (const address of addresses) {
      const received = await standIn.messagesTo(address);
      expect(received.map((m) => [m.subject, m.text.trim()])).toEqual([[`Outbox drill for ${address}`, `Hello ${address}`]]);
    }

    const second = await deliverPending({ limit: 100 });
    expect(second.sent.filter((id) => ids.includes(id))).toEqual([]);
    for (const address of addresses) expect(await standIn.messagesTo(address)).toHaveLength(1);
  });

  it('two dispatchers working at once never send a row twice', async () => {
    setMailTransportConfig({ host: '127.0.0.1', port: standIn.smtpPort });
    const addresses = Array.from({ length: 12 }, (_, i) => `race.${i}.${run}@lab.test`);
    const ids = await enqueueTo(addresses, padId);

    // small batches, so both keep claiming while the other is sending
    async function drain(): Promise<number[]> {
      const sent: number[] = [];
      for (;;) {
        const report = await deliverPending({ limit: 3 });
        sent.push(...report.sent);
        if (report.claimed === 0) return sent;
      }
    }
    const [a, b] = await Promise.all([drain(), drain()]);
    const ours = (list: number[]) => list.filter((id) => ids.includes(id));
    expect(ours(a).filter((id) => b.includes(id))).toEqual([]);
    expect([...ours(a), ...ours(b)].sort((x, y) => x - y)).toEqual([...ids].sort((x, y) => x - y));
    for (const address of addresses) expect(await standIn.messagesTo(address)).toHaveLength(1);
  });

  it('the dispatcher sends at once when a write kicks it, and starting it twice keeps one', async () => {
    setMailTransportConfig({ host: '127.0.0.1', port: standIn.smtpPort });
    const holder = globalThis as { coupletMailOutbox?: unknown };
    // a long interval: only the kick can deliver within the wait below
    startOutboxDispatcher({ intervalMs: 600_000 });
    const first = holder.coupletMailOutbox;
    startOutboxDispatcher({ intervalMs: 600_000 });
    expect(holder.coupletMailOutbox).toBe(first);

    const researcher = await sessionUserByEmail(SEEDED.researcher);
    const invitee = `kicked.${run}@lab.test`;
    await createInvitation(researcher, padId, { email: invitee, role: 'supervisor' });
    await waitUntil(async () => (await standIn.messagesTo(invitee)).length === 1, KICK_DELIVERY_MS, 'the kicked mail did not arrive');
    await stopOutboxDispatcher();
    expect(holder.coupletMailOutbox).toBeUndefined();
  });
});
