/**
 * Entry of a report-drawing thread: one PlanReport in, `{ ok: true, pdf }` (the bytes, transferred) or
 * `{ ok: false, message }` out, then the thread is done. Drawing a report is seconds of synchronous
 * work for a large plan (ECharts and svg-to-pdfkit draw every point), so it runs here and never on the
 * server's own thread. The production build bundles this file as its own worker entry (Turbopack does
 * so for `new Worker(new URL('./pdf-worker.ts', import.meta.url))` in pdf-thread.ts); jest starts it from
 * the TypeScript sources.
 */
import { parentPort } from 'node:worker_threads';
import { lowerThisThreadsPriority } from '../workers/thread-priority';
import { renderPlanPdf } from './pdf';
import type { PlanReport } from './types';

if (!parentPort) throw new Error('pdf-worker.ts runs only as a worker thread');
const port = parentPort;

// reports take the CPU time the pages leave
lowerThisThreadsPriority();

port.once('message', async (report: PlanReport) => {
  try {
    const pdf = await renderPlanPdf(report);
    const bytes = new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength).slice();
    port.postMessage({ ok: true, pdf: bytes }, [bytes.buffer]);
  } catch (error) {
    port.postMessage({ ok: false, message: error instanceof Error ? error.message : String(error) });
  }
});
