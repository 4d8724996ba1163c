import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { PlanDesigner } from '@/components/plans/plan-designer';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { PageHeader } from '@/components/ui/page-header';
import { loadStudyPage } from '@/lib/auth/study-page';
import { listSetups } from '@/lib/data/setups';

type Params = Promise<{ studyId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `New plan · ${study.name}` };
}

/** The plan designer for a new draft; only roles that may edit the study get here (others: 404). */
export default async function NewPlanPage({ params }: { params: Params }) {
  const { study, user } = await loadStudyPage((await params).studyId);
  if (!study.allowedActions.includes('study.edit')) notFound();
  const setups = await listSetups(user, study.id);
  return (
    <StudyPageFrame
      study={study}
      page="New plan"
      header={
        <PageHeader title="New sweep plan" description="Choose a saved setup, then the axes the receiver moves along." />
      }
    >
      <PlanDesigner studyId={study.id} initialSetups={setups} />
    </StudyPageFrame>
  );
}
