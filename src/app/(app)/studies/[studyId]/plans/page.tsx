import type { Metadata } from 'next';
import Link from 'next/link';
import { PlanList } from '@/components/plans/plan-list';
import { StudyBreadcrumb } from '@/components/studies/study-breadcrumb';
import { StudyNav } from '@/components/studies/study-nav';
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
    <div className="space-y-8">
      <div className="space-y-3">
        <StudyBreadcrumb studyId={study.id} studyName={study.name} page="Plans" />
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
      </div>
      <StudyNav studyId={study.id} />
      <PlanList studyId={study.id} />
    </div>
  );
}
