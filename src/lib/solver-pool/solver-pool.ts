/**
 * A bounded pool of solver worker threads: at most `size` jobs run at once (one per worker), at most
 * `queueLimit` wait; beyond that a job is refused at once with SolverBusyError (503 + Retry-After) instead
 * of piling up. A job running past `timeoutMs` has its worker terminated (the only way to stop synchronous
 * work) and replaced. The clock starts when the worker has loaded its code (it posts `{ ready: true }`), so
 * a slow thread start-up is not charged to the first job. Workers start on first use and are unref'd while idle, so an idle pool never keeps a
 * process (jest, the benchmark, `next build`) alive.
 */
import type { Worker } from 'node:worker_threads';
import { unprocessable } from '../http/errors';
import { SolverBusyError, SolverClosedError, SolverFailedError, SolverTimeoutError } from './errors';
import type { SolveJob, SolveJobOutcome, SolveJobResult } from './job';

export interface SolverPoolOptions {
  /** worker threads */
  size: number;
  /** jobs allowed to wait for a worker */
  queueLimit: number;
  /** longest run of one job [ms] */
  timeoutMs: number;
  /** starts a worker running solve-worker.ts (bundled in production, from sources in jest and the bench) */
  createWorker: () => Worker;
}

interface Job {
  id: number;
  job: SolveJob;
  resolve: (result: SolveJobResult) => void;
  reject: (error: Error) => void;
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

export class SolverPool {
  private readonly slots = new Set<Slot>();
  private readonly queue: Job[] = [];
  private nextId = 1;
  private closed = false;
  private averageRunMs = 0;

  constructor(private readonly options: SolverPoolOptions) {
    if (!(options.size >= 1) || !(options.queueLimit >= 0) || !(options.timeoutMs > 0)) {
      throw new Error('SolverPool needs size >= 1, queueLimit >= 0 and timeoutMs > 0');
    }
  }

  /** Runs a job on a free worker, queues it, or refuses it when the queue is full. */
  solve(job: SolveJob): Promise<SolveJobResult> {
    if (this.closed) return Promise.reject(new SolverClosedError());
    return new Promise<SolveJobResult>((resolve, reject) => {
      const entry: Job = { id: this.nextId++, job, resolve, reject };
      const slot = this.freeSlot();
      if (slot) this.dispatch(slot, entry);
      else if (this.queue.length < this.options.queueLimit) this.queue.push(entry);
      else reject(new SolverBusyError(this.retryAfterSeconds()));
    });
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

  /** Seconds until a place in the queue is likely free: the queue drained at the average run time. */
  private retryAfterSeconds(): number {
    const seconds = ((this.queue.length + 1) * this.averageRunMs) / this.options.size / 1000;
    return Math.max(1, Math.ceil(seconds));
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
      this.dispatch(slot, this.queue.shift()!);
    }
  }
}
