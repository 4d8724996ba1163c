import 'server-only';
import { Worker } from 'node:worker_threads';
import pLimit from 'p-limit';
import { HttpError } from '../http/errors';
import type { PlanReport } from './types';

/**
 * Draws a plan's PDF on a thread of its own (pdf-worker.ts), so the seconds a large plan takes (about
 * 10 s for 2,000 poses on the 2-core machine) never hold up anyone else's pages. One report is drawn
 * at a time; more wait their turn, each on a fresh thread that ends with it.
 */

/** Reports drawn at once: each keeps a core busy while it draws. */
const AT_ONCE = 1;
/** Longest a report may take to draw before its thread is stopped [ms]. */
const DRAW_TIMEOUT_MS = 120_000;

type WorkerFactory = () => Worker;

/**
 * Written exactly so for Turbopack, which bundles pdf-worker.ts as a worker entry only for this form
 * (see src/lib/solver-pool/server-pool.ts). Jest cannot load that bundle and sets a factory that
 * compiles the sources (drawPdfOnThreadsFrom).
 */
let createWorker: WorkerFactory = () => new Worker(new URL('./pdf-worker.ts', import.meta.url));

/** Starts report threads with `factory` from now on (tests: the worker compiled from its sources). */
export function drawPdfOnThreadsFrom(factory: WorkerFactory): void {
  createWorker = factory;
}

const turns = pLimit(AT_ONCE);

type WorkerAnswer = { ok: true; pdf: Uint8Array } | { ok: false; message: string };

export function drawPlanPdf(report: PlanReport): Promise<Buffer> {
  return turns(() => drawOnce(report));
}

function drawOnce(report: PlanReport): Promise<Buffer> {
  return new Promise<Buffer>((resolve, reject) => {
    const worker = createWorker();
    let settled = false;
    const settle = (outcome: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      void worker.terminate();
      outcome();
    };
    const timer = setTimeout(() => settle(() => reject(new HttpError(503, 'The report took too long to draw; try again later.', [], { 'Retry-After': '60' }))), DRAW_TIMEOUT_MS);
    worker.once('message', (answer: WorkerAnswer) => settle(() => {
      if (answer.ok) resolve(Buffer.from(answer.pdf.buffer, answer.pdf.byteOffset, answer.pdf.byteLength));
      else reject(new Error(`Drawing the report failed: ${answer.message}`));
    }));
    worker.once('error', (error) => settle(() => reject(error)));
    worker.once('exit', (code) => settle(() => reject(new Error(`The report thread stopped (exit code ${code}) before it answered.`))));
    worker.postMessage(report);
  });
}
