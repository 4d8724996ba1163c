import { join } from 'node:path';
import { drawPdfOnThreadsFrom } from '../../src/lib/report/pdf-thread';
import { createSourceWorker } from '../../src/lib/solver-pool/source-worker';

/** The report-drawing thread's entry in the source tree. */
export const PDF_WORKER_SOURCE = join(process.cwd(), 'src', 'lib', 'report', 'pdf-worker.ts');

/**
 * Report PDFs drawn on threads compiled from the sources: jest cannot load the worker bundle that the
 * production build makes (src/lib/report/pdf-thread.ts).
 */
export function drawPdfsFromSources(): void {
  drawPdfOnThreadsFrom(() => createSourceWorker(PDF_WORKER_SOURCE));
}
