import { requireUser } from '@/lib/auth/session';
import { route } from '@/lib/http/respond';
import { planReportPdf, reportResponse } from '@/lib/report/exports';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** The plan's report as a PDF: setup, plan, agreement with the prediction, fits, decisions, comments. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return reportResponse(await planReportPdf(user, studyId, planId));
});
