import { requireUser } from '@/lib/auth/session';
import { listPlanPoints, runSheetCsv } from '@/lib/data/plan-points';
import { route } from '@/lib/http/respond';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** The run sheet as CSV (SI, units in the column names); the dictionary is dictionary.csv beside it. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  const csv = runSheetCsv(await listPlanPoints(user, studyId, planId));
  return new Response(csv, {
    headers: { 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': `attachment; filename="plan-${planId}-points.csv"` },
  });
});
