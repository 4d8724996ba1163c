import { idParam } from '@/lib/http/respond';

export type PlanContext = { params: Promise<{ studyId: string; planId: string }> };

/** The study and plan ids of a plan route (404 for anything that is not an id). */
export async function planIds(params: PlanContext['params']): Promise<{ studyId: number; planId: number }> {
  const { studyId, planId } = await params;
  return { studyId: idParam(studyId), planId: idParam(planId) };
}
