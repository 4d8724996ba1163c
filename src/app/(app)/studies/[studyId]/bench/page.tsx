import type { Metadata } from 'next';
import { Suspense } from 'react';
import { BenchWorkspace } from '@/components/bench/bench-workspace';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { PageHeader } from '@/components/ui/page-header';
import { Skeleton } from '@/components/ui/skeleton';
import { loadStudyPage } from '@/lib/auth/study-page';
import { listCoils } from '@/lib/data/coils';
import { listSetups } from '@/lib/data/setups';
import { formatFrequency } from '@/lib/units/format';

type Params = Promise<{ studyId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `Bench · ${study.name}` };
}

/**
 * The 3D placement bench of a study. Every member may open setups and move the receiver; saving needs
 * 'study.edit' (the API checks again). Non-members get the same 404 as for a study that does not exist.
 */
export default async function BenchPage({ params }: { params: Params }) {
  const { study, user } = await loadStudyPage((await params).studyId);
  const canEdit = study.allowedActions.includes('study.edit');
  const [coils, setups] = await Promise.all([listCoils(user, study.id), listSetups(user, study.id)]);

  return (
    <StudyPageFrame
      study={study}
      page="Bench"
      className="space-y-6"
      header={
        <PageHeader
          title="Placement bench"
          description={
            <>
              Place the receiver against the transmitter and read the link as it moves
              {study.frequencyHz !== null ? <> (study frequency {formatFrequency(study.frequencyHz)})</> : null}.
            </>
          }
        />
      }
    >
      {/* useSearchParams (?setup=) needs a boundary of its own */}
      <Suspense fallback={<Skeleton label="Loading the bench" rows={4} />}>
        <BenchWorkspace studyId={study.id} studyFrequencyHz={study.frequencyHz} canEdit={canEdit} initialCoils={coils} initialSetups={setups} />
      </Suspense>
    </StudyPageFrame>
  );
}
