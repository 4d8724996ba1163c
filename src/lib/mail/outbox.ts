import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { sendMail, type OutgoingMail } from './transport';

/**
 * The transactional outbox for e-mail. A business write calls enqueueMail inside its own
 * transaction, so the mail is stored exactly when the write commits; the dispatcher sends it after
 * the commit and keeps retrying while the relay is down. Nobody waits on the relay and no committed
 * notification is lost.
 *
 * Delivery is at least once: a row is claimed with a lease (its next_attempt_at pushed ahead) in a
 * short SELECT ... FOR UPDATE SKIP LOCKED transaction (MariaDB 10.6+), so concurrent dispatchers never
 * pick the same row. Only a process dying between the relay's "250 OK" and the sent_at update sends a
 * row twice, after its lease ran out. All times are the database's UTC clock, so several servers with
 * unequal clocks agree on what is due.
 */

export type MailKind = 'invitation' | 'plan.submitted' | 'plan.decision';

/** How long a claim keeps a row from other dispatchers. */
const LEASE_MS = 10 * 60_000;
/** A send starts only while this much of the lease is left: the transport gives up well within it. */
const SEND_BUDGET_MS = 60_000;
const FIRST_RETRY_MS = 5_000;
const MAX_RETRY_MS = 10 * 60_000;
const MAX_ERROR_LENGTH = 200;
const DISPATCH_INTERVAL_MS = 5_000;
const DISPATCH_BATCH = 20;

const NOW = 'UTC_TIMESTAMP(3)';
const nowPlus = (knex: Knex | Knex.Transaction, ms: number) => knex.raw(`${NOW} + INTERVAL ? MICROSECOND`, [Math.round(ms * 1000)]);

/** Stores a mail in the caller's transaction; it goes out after the commit (see kickOutbox). */
export async function enqueueMail(
  trx: Knex.Transaction,
  mail: OutgoingMail,
  meta: { kind: MailKind; studyId: number | null },
): Promise<number> {
  const [id] = await trx('mail_outbox').insert({
    to_address: mail.to,
    subject: mail.subject,
    text_body: mail.text,
    html_body: mail.html,
    kind: meta.kind,
    study_id: meta.studyId,
    created_at: trx.raw(NOW),
    next_attempt_at: trx.raw(NOW),
  });
  return id as number;
}

/** Delay before the next try after `failures` failed ones: 5 s, 10 s, 20 s, … at most 10 min. */
export function retryDelayMs(failures: number): number {
  return Math.min(FIRST_RETRY_MS * 2 ** Math.max(0, failures - 1), MAX_RETRY_MS);
}

/** One line for the row and the log: the error's code and first line, never a stack. */
export function shortError(error: unknown): string {
  const { code, message } = (error ?? {}) as { code?: unknown; message?: unknown };
  const firstLine = (typeof message === 'string' ? message : String(error)).split('\n')[0].trim();
  const prefix = typeof code === 'string' && !firstLine.includes(code) ? `${code}: ` : '';
  return `${prefix}${firstLine}`.slice(0, MAX_ERROR_LENGTH);
}

interface OutboxRow {
  id: number;
  to_address: string;
  subject: string;
  text_body: string;
  html_body: string;
  kind: MailKind;
  attempts: number;
}

async function claimDue(limit: number): Promise<OutboxRow[]> {
  // READ COMMITTED: the locking read takes no gap locks, so enqueueing writers are never held up.
  return db.transaction(async (trx) => {
    const rows: OutboxRow[] = await trx('mail_outbox')
      .whereNull('sent_at')
      .where('next_attempt_at', '<=', trx.raw(NOW))
      .orderBy([{ column: 'next_attempt_at' }, { column: 'id' }])
      .limit(limit)
      .forUpdate()
      .skipLocked()
      .select('id', 'to_address', 'subject', 'text_body', 'html_body', 'kind', 'attempts');
    if (rows.length > 0) {
      await trx('mail_outbox').whereIn('id', rows.map((row) => row.id)).update({ next_attempt_at: nowPlus(trx, LEASE_MS) });
    }
    return rows;
  }, { isolationLevel: 'read committed' });
}

export interface DeliveryReport {
  claimed: number;
  /** outbox ids handed to the relay */
  sent: number[];
  /** ids that failed and wait for their retry */
  failed: number[];
  /** ids claimed but not tried (the lease ran short); due again at once */
  deferred: number[];
}

/** Sends up to `limit` due mails, oldest first; failures are recorded and retried later, never dropped. */
export async function deliverPending(options: { limit?: number } = {}): Promise<DeliveryReport> {
  const claimedAt = Date.now();
  const rows = await claimDue(options.limit ?? DISPATCH_BATCH);
  const report: DeliveryReport = { claimed: rows.length, sent: [], failed: [], deferred: [] };
  for (const row of rows) {
    if (Date.now() - claimedAt > LEASE_MS - SEND_BUDGET_MS) {
      report.deferred.push(row.id);
      continue;
    }
    try {
      await sendMail({ to: row.to_address, subject: row.subject, text: row.text_body, html: row.html_body });
    } catch (error) {
      const failures = row.attempts + 1;
      const delay = retryDelayMs(failures);
      const reason = shortError(error);
      await db('mail_outbox').where({ id: row.id }).update({ attempts: failures, last_error: reason, next_attempt_at: nowPlus(db, delay) });
      console.warn(`Mail outbox: ${row.kind} mail #${row.id} not sent (attempt ${failures}, next try in ${delay / 1000} s): ${reason}`);
      report.failed.push(row.id);
      continue;
    }
    await db('mail_outbox').where({ id: row.id }).whereNull('sent_at').update({ sent_at: db.raw(NOW), attempts: row.attempts + 1 });
    report.sent.push(row.id);
  }
  if (report.deferred.length > 0) {
    await db('mail_outbox').whereIn('id', report.deferred).whereNull('sent_at').update({ next_attempt_at: db.raw(NOW) });
  }
  return report;
}

interface Dispatcher {
  kick(): void;
  stop(): Promise<void>;
}

// On globalThis: instrumentation.ts and the route handlers are separate bundles with their own copy
// of this module, and `next dev` reloads modules; all of them must find the one dispatcher.
const holder = globalThis as typeof globalThis & { coupletMailOutbox?: Dispatcher };

/**
 * Sends due mail every few seconds in this server process, and at once when kicked. Starting twice
 * keeps the first. The timer is unref'd: it never keeps a process alive on its own.
 */
export function startOutboxDispatcher(options: { intervalMs?: number } = {}): void {
  if (holder.coupletMailOutbox) return;
  const intervalMs = options.intervalMs ?? DISPATCH_INTERVAL_MS;
  let running = false;
  let again = false;
  let stopped = false;
  let inFlight: Promise<void> = Promise.resolve();

  // `running` is set and cleared without an await in between, so a kick during a round is never lost.
  async function drain(): Promise<void> {
    running = true;
    try {
      do {
        again = false;
        try {
          const report = await deliverPending({ limit: DISPATCH_BATCH });
          if (report.claimed === DISPATCH_BATCH) again = true; // a full batch: more may be due
        } catch (error) {
          console.warn(`Mail outbox: delivery round failed, next in ${intervalMs / 1000} s: ${shortError(error)}`);
        }
      } while (again && !stopped);
    } finally {
      running = false;
    }
  }

  function kick(): void {
    if (stopped) return;
    if (running) {
      again = true;
      return;
    }
    inFlight = drain();
  }

  const timer = setInterval(kick, intervalMs);
  timer.unref();
  holder.coupletMailOutbox = {
    kick,
    async stop() {
      stopped = true;
      clearInterval(timer);
      await inFlight;
    },
  };
  kick(); // mail left waiting before this process started
}

/** Stops the dispatcher and waits for its round in progress (tests). */
export async function stopOutboxDispatcher(): Promise<void> {
  const dispatcher = holder.coupletMailOutbox;
  holder.coupletMailOutbox = undefined;
  await dispatcher?.stop();
}

/**
 * Call after a transaction that enqueued mail has committed: the dispatcher sends at once instead of
 * on its next tick. Never waits and never throws. Without a running dispatcher (jest, scripts) it does
 * nothing; the mail waits for deliverPending.
 */
export function kickOutbox(): void {
  holder.coupletMailOutbox?.kick();
}
