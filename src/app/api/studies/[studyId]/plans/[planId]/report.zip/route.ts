import { requireUser } from '@/lib/auth/session';
import { route } from '@/lib/http/respond';
import { planReportZip, reportResponse } from '@/lib/report/exports';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** The plan's data as a zip of CSV files with a data dictionary and a README. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  return reportResponse(await planReportZip(user, studyId, planId));
});
