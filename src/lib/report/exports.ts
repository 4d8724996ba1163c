import 'server-only';
import type { SessionUser } from '../auth/session-user';
import { loadPlanReport } from './load';
import { fileStem } from './notes';
import { drawPlanPdf } from './pdf-thread';
import { buildPlanZip } from './zip';

/** A plan's report as a file to download, for anyone who can see the study (404 otherwise). */
export interface ReportFile {
  body: Buffer;
  contentType: string;
  /** ASCII letters, digits, dashes and a dot only: safe in Content-Disposition unquoted or quoted */
  fileName: string;
}

export async function planReportPdf(viewer: SessionUser, studyId: number, planId: number): Promise<ReportFile> {
  const report = await loadPlanReport(viewer, studyId, planId);
  return { body: await drawPlanPdf(report), contentType: 'application/pdf', fileName: `${fileStem(report.plan.name, planId)}-report.pdf` };
}

export async function planReportZip(viewer: SessionUser, studyId: number, planId: number): Promise<ReportFile> {
  const report = await loadPlanReport(viewer, studyId, planId);
  return { body: await buildPlanZip(report), contentType: 'application/zip', fileName: `${fileStem(report.plan.name, planId)}-data.zip` };
}

/** The download's response: an attachment, never cached (it carries study data and changes with it). */
export function reportResponse(file: ReportFile): Response {
  // a copy on its own ArrayBuffer, the body type fetch's Response accepts
  return new Response(new Uint8Array(file.body), {
    headers: {
      'Content-Type': file.contentType,
      'Content-Length': String(file.body.byteLength),
      'Content-Disposition': `attachment; filename="${file.fileName}"`,
      'Cache-Control': 'no-store',
    },
  });
}
