/**
 * Reports are drawn off the server's thread (src/lib/report/pdf-thread.ts): while a large plan's PDF
 * is drawn, the thread that serves pages keeps answering, and the PDF is the one drawn in place.
 */
import { Worker } from 'node:worker_threads';
import { renderPlanPdf } from '../../../src/lib/report/pdf';
import { drawPdfOnThreadsFrom, drawPlanPdf } from '../../../src/lib/report/pdf-thread';
import type { PlanReport } from '../../../src/lib/report/types';
import { drawPdfsFromSources } from '../../support/source-pdf-threads';
import { reportFixture } from './report-fixture';

/**
 * The fixture's plan grown to `copies` times its poses (each copy 1 mm further out), with their
 * observations: enough points that drawing the charts takes a noticeable while.
 */
function largeReport(copies: number): PlanReport {
  const report = reportFixture();
  for (const review of Object.values(report.reviews)) {
    const poses = review.poses.flatMap((p) => Array.from({ length: copies }, (_, k) => {
      const pose = { ...p.pose, distance: p.pose.distance + k * 0.001 };
      return { ...p, pose, key: `${p.key}#${k}` };
    }));
    const observations = review.observations.flatMap((o) => Array.from({ length: copies }, (_, k) => ({ ...o, readingId: o.readingId + k * 10_000, poseKey: `${o.poseKey}#${k}` })));
    Object.assign(review, { poses, observations });
  }
  return report;
}

/** The longest the event loop went without running a 5 ms timer while `work` ran [ms]. */
async function longestStall(work: () => Promise<unknown>): Promise<number> {
  let longest = 0;
  let last = performance.now();
  const timer = setInterval(() => {
    const now = performance.now();
    longest = Math.max(longest, now - last);
    last = now;
  }, 5);
  try {
    await work();
  } finally {
    clearInterval(timer);
  }
  return Math.max(longest, performance.now() - last);
}

/** Normalises what differs between two drawings of one report: pdfkit's random document id. */
const comparable = (pdf: Buffer) => pdf.toString('latin1').replace(/\/ID \[<[0-9a-f]+> <[0-9a-f]+>\]/g, '');

describe('drawing a report off the thread', () => {
  beforeAll(() => drawPdfsFromSources());

  test('the thread that serves pages keeps running while a large report is drawn', async () => {
    const report = largeReport(50); // 300 poses
    const inPlace = await longestStall(() => renderPlanPdf(report));
    let pdf: Buffer | undefined;
    const offThread = await longestStall(async () => {
      pdf = await drawPlanPdf(report);
    });
    // drawn in place, the report holds the thread for all of its charts; off it, only copying costs
    expect(inPlace).toBeGreaterThan(300);
    expect(offThread).toBeLessThan(100);
    expect(pdf!.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(comparable(pdf!)).toBe(comparable(await renderPlanPdf(report)));
  }, 120_000);

  test('reports asked for together are each answered, one thread at a time', async () => {
    const report = reportFixture();
    const pdfs = await Promise.all([drawPlanPdf(report), drawPlanPdf(report)]);
    expect(pdfs.map((p) => p.subarray(0, 5).toString('latin1'))).toEqual(['%PDF-', '%PDF-']);
  }, 60_000);

  test('a thread that fails is a clear error, not a hang', async () => {
    drawPdfOnThreadsFrom(() => new Worker('throw new Error("no fonts here")', { eval: true }));
    try {
      await expect(drawPlanPdf(reportFixture())).rejects.toThrow(/no fonts here/);
    } finally {
      drawPdfsFromSources();
    }
  });
});
