import type { Metadata } from 'next';
import { CoilLibrary } from '@/components/coils/coil-library';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { PageHeader } from '@/components/ui/page-header';
import { loadStudyPage } from '@/lib/auth/study-page';
import { listCoils } from '@/lib/data/coils';

type Params = Promise<{ studyId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `Coils · ${study.name}` };
}

/** A study's coil library; 404 for people not on the study, the form only for roles that may edit. */
export default async function StudyCoilsPage({ params }: { params: Params }) {
  const { study, user } = await loadStudyPage((await params).studyId);
  const coils = await listCoils(user, study.id);

  return (
    <StudyPageFrame
      study={study}
      page="Coils"
      header={
        <PageHeader title="Coils" description="The transmitter and receiver coils of this study, with their predicted and measured values." />
      }
    >
      <CoilLibrary studyId={study.id} frequencyHz={study.frequencyHz} canEdit={study.allowedActions.includes('study.edit')} initialCoils={coils} />
    </StudyPageFrame>
  );
}
