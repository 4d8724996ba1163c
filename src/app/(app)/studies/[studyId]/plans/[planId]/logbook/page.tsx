import type { Metadata } from 'next';
import { Logbook } from '@/components/readings/logbook';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { loadPlanPage, loadStudyPage } from '@/lib/auth/study-page';

type Params = Promise<{ studyId: string; planId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `Logbook · ${study.name}` };
}

/** The bench logbook of one plan; a plan of another study is the app's real 404. */
export default async function LogbookPage({ params }: { params: Params }) {
  const { studyId, planId } = await params;
  const { study, user, plan } = await loadPlanPage(studyId, planId);
  return (
    <StudyPageFrame study={study} page="Plans">
      <Logbook studyId={study.id} planId={plan.id} viewerId={user.id} allowedActions={study.allowedActions} initialPlan={plan} />
    </StudyPageFrame>
  );
}
