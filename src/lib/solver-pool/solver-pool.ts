/**
 * A bounded pool of solver worker threads: at most `size` jobs run at once (one per worker), at most
 * `queueLimit` wait; beyond that a job is refused at once with SolverBusyError (503 + Retry-After) instead
 * of piling up. Jobs may name an owner (a person, a plan run): one owner holds at most `perOwnerLimit`
 * jobs running or waiting (SolverQuotaError, 429, beyond that), and a free worker takes the waiting job
 * of the owner with the fewest jobs running, so one busy client cannot starve the others. A waiting job
 * whose request was abandoned (its AbortSignal fired) leaves the queue. A job running past `timeoutMs` has its worker terminated (the only way to stop synchronous
 * work) and replaced. The clock starts when the worker has loaded its code (it posts `{ ready: true }`), so
 * a slow thread start-up is not charged to the first job. Workers start on first use and are unref'd while idle, so an idle pool never keeps a
 * process (jest, the benchmark, `next build`) alive.
 */
import type { Worker } from 'node:worker_threads';
import { abandoned, unprocessable } from '../http/errors';
import { SolverBusyError, SolverClosedError, SolverFailedError, SolverQuotaError, SolverTimeoutError } from './errors';
import type { SolveJob, SolveJobOutcome, SolveJobResult } from './job';

export interface SolverPoolOptions {
  /** worker threads */
  size: number;
  /** jobs allowed to wait for a worker */
  queueLimit: number;
  /** jobs one owner may have running or waiting (unlimited when absent) */
  perOwnerLimit?: number;
  /** longest run of one job [ms] */
  timeoutMs: number;
  /** starts a worker running solve-worker.ts (bundled in production, from sources in jest and the bench) */
  createWorker: () => Worker;
}

/** Who a job is for, and a way to give up on it while it still waits. */
export interface SolveOptions {
  /** Jobs of one owner share the per-owner limit; jobs without an owner share none. */
  owner?: string;
  /** Aborting removes the job from the queue (a running job finishes; its answer is dropped). */
  signal?: AbortSignal;
}

interface Job {
  id: number;
  job: SolveJob;
  owner: string | undefined;
  resolve: (result: SolveJobResult) => void;
  reject: (error: Error) => void;
  /** Detaches the abort listener once the job has left the queue. */
  detach: () => void;
}

interface Slot {
  worker: Worker;
  /** the worker has loaded its code and posted `{ ready: true }` */
  ready: boolean;
  current: Job | null;
  timer: ReturnType<typeof setTimeout> | null;
  startedAt: number;
}

type WorkerMessage = { ready: true } | ({ id: number } & SolveJobOutcome);

/** Time a new worker may take to load its code before its first job's clock starts anyway [ms]. */
const START_UP_ALLOWANCE_MS = 30_000;
/** Weight of the newest run in the average run time that Retry-After is estimated from. */
const RUN_TIME_SMOOTHING = 0.2;

function outcomeError(error: Extract<SolveJobOutcome, { ok: false }>['error']): Error {
  if (error.kind === 'input') {
    return unprocessable('Some fields need attention.', error.issues.map((i) => ({
      path: i.path.length === 0 ? '(body)' : i.path.join('.'), message: i.message,
    })));
  }
  console.error('Solver worker failed on a job:', error.message); // the person sees only a plain message
  return new SolverFailedError(error.message);
}

/** Jobs without an owner take turns together under "", which no real owner name is; they have no limit. */
const ownerKey = (owner: string | undefined) => owner ?? '';

/** What a queued job rejects with when its request was abandoned. */
const abortError = () => abandoned('The solve was abandoned before it started.');

export class SolverPool {
  private readonly slots = new Set<Slot>();
  private readonly queue: Job[] = [];
  private nextId = 1;
  private closed = false;
  private averageRunMs = 0;
  /** When each owner with jobs last had one dispatched (a dispatch count), for taking turns. */
  private readonly lastServed = new Map<string, number>();
  private dispatches = 0;

  constructor(private readonly options: SolverPoolOptions) {
    if (!(options.size >= 1) || !(options.queueLimit >= 0) || !(options.timeoutMs > 0)) {
      throw new Error('SolverPool needs size >= 1, queueLimit >= 0 and timeoutMs > 0');
    }
  }

  /** Runs a job on a free worker, queues it, or refuses it when the queue or the owner's share is full. */
  solve(job: SolveJob, { owner, signal }: SolveOptions = {}): Promise<SolveJobResult> {
    if (signal?.aborted) return Promise.reject(abortError());
    const refused = this.refusal(owner);
    if (refused) return Promise.reject(refused);
    return new Promise<SolveJobResult>((resolve, reject) => {
      const entry: Job = {
        id: this.nextId++,
        job,
        owner,
        resolve: (result) => this.settle(entry, () => resolve(result)),
        reject: (error) => this.settle(entry, () => reject(error)),
        detach: () => {},
      };
      const slot = this.freeSlot();
      if (slot) this.dispatch(slot, entry);
      else this.enqueue(entry, signal);
    });
  }

  /**
   * Why a job of `owner` would be refused now (closed pool, the owner's share taken, every worker busy
   * and the queue full), or null when it would run or wait. Callers may ask before doing the work of
   * reading a request, so a flood is turned away cheaply; solve() asks again.
   */
  refusal(owner?: string): Error | null {
    if (this.closed) return new SolverClosedError();
    const limit = this.options.perOwnerLimit;
    if (owner !== undefined && limit !== undefined && this.jobsOf(owner) >= limit) {
      return new SolverQuotaError(this.retryAfterSeconds(), limit);
    }
    const idle = [...this.slots].some((s) => !s.current) || this.slots.size < this.options.size;
    if (!idle && this.queue.length >= this.options.queueLimit) return new SolverBusyError(this.retryAfterSeconds());
    return null;
  }

  /** Jobs running and waiting, for monitoring and tests. */
  stats(): { workers: number; running: number; queued: number } {
    let running = 0;
    for (const s of this.slots) if (s.current) running++;
    return { workers: this.slots.size, running, queued: this.queue.length };
  }

  /** Refuses new jobs, fails the waiting ones and stops every worker. */
  async close(): Promise<void> {
    this.closed = true;
    for (const entry of this.queue.splice(0)) entry.reject(new SolverClosedError());
    const stopping = [...this.slots].map((slot) => {
      this.retire(slot, new SolverClosedError());
      return slot.worker.terminate();
    });
    await Promise.all(stopping);
  }

  private enqueue(entry: Job, signal: AbortSignal | undefined): void {
    this.queue.push(entry);
    if (!signal) return;
    const onAbort = () => {
      const at = this.queue.indexOf(entry);
      if (at < 0) return;
      this.queue.splice(at, 1);
      entry.reject(abortError());
    };
    signal.addEventListener('abort', onAbort, { once: true });
    entry.detach = () => signal.removeEventListener('abort', onAbort);
  }

  /**
   * Once a job has an answer or an error (it has left its worker or the queue by then): an owner with
   * nothing left is forgotten, so lastServed holds only owners with jobs; then the caller's callback.
   */
  private settle(entry: Job, then: () => void): void {
    entry.detach();
    if (this.jobsOf(entry.owner) === 0) this.lastServed.delete(ownerKey(entry.owner));
    then();
  }

  /** Jobs of `owner` on a worker now. */
  private runningOf(owner: string | undefined): number {
    let n = 0;
    for (const s of this.slots) if (s.current && ownerKey(s.current.owner) === ownerKey(owner)) n++;
    return n;
  }

  /** Jobs of `owner` running or waiting. */
  private jobsOf(owner: string | undefined): number {
    let n = this.runningOf(owner);
    for (const entry of this.queue) if (ownerKey(entry.owner) === ownerKey(owner)) n++;
    return n;
  }

  /**
   * The next waiting job: its owner has the fewest jobs running, and among equals was served longest
   * ago (or never), so owners take turns; among one owner's jobs, the oldest.
   */
  private takeNext(): Job {
    const running = new Map<string, number>();
    for (const s of this.slots) if (s.current) running.set(ownerKey(s.current.owner), (running.get(ownerKey(s.current.owner)) ?? 0) + 1);
    let best = 0;
    let bestRunning = Infinity;
    let bestServed = Infinity;
    for (let i = 0; i < this.queue.length; i++) {
      const key = ownerKey(this.queue[i].owner);
      const ownerRunning = running.get(key) ?? 0;
      const served = this.lastServed.get(key) ?? -1;
      if (ownerRunning < bestRunning || (ownerRunning === bestRunning && served < bestServed)) {
        best = i;
        bestRunning = ownerRunning;
        bestServed = served;
      }
    }
    const [entry] = this.queue.splice(best, 1);
    entry.detach();
    return entry;
  }

  /**
   * Seconds until a place in the queue is likely free (the queue drained at the average run time), plus
   * a random part of up to half that again, so clients refused in the same moment do not all come back
   * in the same moment.
   */
  private retryAfterSeconds(): number {
    const seconds = Math.max(1, Math.ceil(((this.queue.length + 1) * this.averageRunMs) / this.options.size / 1000));
    return seconds + Math.floor(Math.random() * (Math.ceil(seconds / 2) + 1));
  }

  private freeSlot(): Slot | null {
    for (const s of this.slots) if (!s.current) return s;
    return this.slots.size < this.options.size ? this.startWorker() : null;
  }

  private startWorker(): Slot {
    const worker = this.options.createWorker();
    const slot: Slot = { worker, ready: false, current: null, timer: null, startedAt: 0 };
    worker.on('message', (message: WorkerMessage) => {
      if ('ready' in message) {
        slot.ready = true;
        if (slot.current) this.startClock(slot, this.options.timeoutMs);
      } else this.finish(slot, message);
    });
    // an uncaught exception in the thread (it then exits) or a thread that could not start at all
    worker.on('error', (error) => {
      console.error('Solver worker failed', error);
      this.retire(slot, new SolverFailedError(error.message));
    });
    worker.on('exit', (code) => this.retire(slot, new SolverFailedError(`worker exited with code ${code}`)));
    worker.unref();
    this.slots.add(slot);
    return slot;
  }

  private dispatch(slot: Slot, entry: Job): void {
    slot.current = entry;
    this.lastServed.set(ownerKey(entry.owner), this.dispatches++);
    slot.worker.ref(); // a running job keeps the process alive until it answers
    // a starting worker receives the job once it listens; its clock starts with the ready message
    this.startClock(slot, this.options.timeoutMs + (slot.ready ? 0 : START_UP_ALLOWANCE_MS));
    slot.worker.postMessage({ id: entry.id, job: entry.job });
  }

  private startClock(slot: Slot, ms: number): void {
    if (slot.timer) clearTimeout(slot.timer);
    slot.startedAt = performance.now();
    slot.timer = setTimeout(() => {
      this.retire(slot, new SolverTimeoutError(this.options.timeoutMs));
      void slot.worker.terminate();
    }, ms);
  }

  private finish(slot: Slot, message: { id: number } & SolveJobOutcome): void {
    const entry = slot.current;
    if (!entry || entry.id !== message.id) return; // an answer after a timeout: its job was already failed
    this.release(slot);
    const ms = performance.now() - slot.startedAt;
    this.averageRunMs = this.averageRunMs === 0 ? ms : this.averageRunMs + RUN_TIME_SMOOTHING * (ms - this.averageRunMs);
    if (message.ok) entry.resolve(message.result);
    else entry.reject(outcomeError(message.error));
    this.pump();
  }

  private release(slot: Slot): void {
    if (slot.timer) clearTimeout(slot.timer);
    slot.timer = null;
    slot.current = null;
    slot.worker.unref();
  }

  /** Takes a worker out of the pool (failed, timed out, exited), failing its job; the queue moves on. */
  private retire(slot: Slot, error: Error): void {
    if (!this.slots.delete(slot)) return;
    const entry = slot.current;
    this.release(slot);
    entry?.reject(error);
    this.pump();
  }

  private pump(): void {
    while (!this.closed && this.queue.length > 0) {
      const slot = this.freeSlot();
      if (!slot) return;
      this.dispatch(slot, this.takeNext());
    }
  }
}
