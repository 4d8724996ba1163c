import { requireUser } from '@/lib/auth/session';
import { getPlan } from '@/lib/data/plans';
import { runSheetDictionaryCsv } from '@/lib/data/plan-points';
import { route } from '@/lib/http/respond';
import { planIds, type PlanContext } from '../ids';

export const dynamic = 'force-dynamic';

/** The data dictionary of points.csv: column, unit, meaning. */
export const GET = route(async (_request: Request, { params }: PlanContext) => {
  const { studyId, planId } = await planIds(params);
  const user = await requireUser();
  await getPlan(user, studyId, planId);
  return new Response(runSheetDictionaryCsv(), {
    headers: { 'Content-Type': 'text/csv; charset=utf-8', 'Content-Disposition': `attachment; filename="plan-${planId}-dictionary.csv"` },
  });
});
