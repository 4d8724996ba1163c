import type { Metadata } from 'next';
import Link from 'next/link';
import { PlanList } from '@/components/plans/plan-list';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { buttonClasses } from '@/components/ui/button';
import { PageHeader } from '@/components/ui/page-header';
import { loadStudyPage } from '@/lib/auth/study-page';

type Params = Promise<{ studyId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `Plans · ${study.name}` };
}

/** A study's sweep plans; 404 for people not on the study, "New plan" only for roles that may edit. */
export default async function PlansPage({ params }: { params: Params }) {
  const { study } = await loadStudyPage((await params).studyId);
  const canEdit = study.allowedActions.includes('study.edit');
  return (
    <StudyPageFrame
      study={study}
      page="Plans"
      header={
        <PageHeader
          title="Sweep plans"
          description="The positions the bench measures, with every point's predicted values."
          actions={
            canEdit && (
              <Link href={`/studies/${study.id}/plans/new`} className={buttonClasses('primary')}>
                New plan
              </Link>
            )
          }
        />
      }
    >
      <PlanList studyId={study.id} />
    </StudyPageFrame>
  );
}
