import type { Metadata } from 'next';
import { PlanReview } from '@/components/review/plan-review';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { loadPlanPage, loadStudyPage } from '@/lib/auth/study-page';

type Params = Promise<{ studyId: string; planId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `Review · ${study.name}` };
}

/** The review of one plan: predicted against measured, comments and the decision; another study's plan is the app's real 404. */
export default async function PlanReviewPage({ params }: { params: Params }) {
  const { studyId, planId } = await params;
  const { study, plan } = await loadPlanPage(studyId, planId);
  return (
    <StudyPageFrame study={study} page="Plans">
      <PlanReview studyId={study.id} planId={plan.id} allowedActions={study.allowedActions} initialPlan={plan} />
    </StudyPageFrame>
  );
}
