import type { Metadata } from 'next';
import { PlanView } from '@/components/plans/plan-view';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { loadPlanPage, loadStudyPage } from '@/lib/auth/study-page';
import { listSetups } from '@/lib/data/setups';

type Params = Promise<{ studyId: string; planId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `Plan · ${study.name}` };
}

/**
 * One sweep plan. The study and the plan are checked here, so a plan that is not on this study is the
 * app's real 404; the page's data then loads through the plans API (SWR), which checks again.
 */
export default async function PlanPage({ params }: { params: Params }) {
  const { studyId, planId } = await params;
  const { study, user, plan } = await loadPlanPage(studyId, planId);
  const setups = await listSetups(user, study.id);
  return (
    <StudyPageFrame
      study={study}
      page="Plans"
    >
      <PlanView studyId={study.id} planId={plan.id} allowedActions={study.allowedActions} initialSetups={setups} initialPlan={plan} />
    </StudyPageFrame>
  );
}
