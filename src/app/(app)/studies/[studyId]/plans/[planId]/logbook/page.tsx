import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { Logbook } from '@/components/readings/logbook';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { loadStudyPage } from '@/lib/auth/study-page';
import { getPlan } from '@/lib/data/plans';
import { HttpError } from '@/lib/http/errors';

type Params = Promise<{ studyId: string; planId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `Logbook · ${study.name}` };
}

/** The bench logbook of one plan; the plan is checked here so a plan of another study is a real 404. */
export default async function LogbookPage({ params }: { params: Params }) {
  const { studyId, planId } = await params;
  const { study, user } = await loadStudyPage(studyId);
  if (!/^[1-9][0-9]{0,9}$/.test(planId)) notFound();
  try {
    await getPlan(user, study.id, Number(planId));
  } catch (error) {
    if (error instanceof HttpError && error.status === 404) notFound();
    throw error;
  }
  return (
    <StudyPageFrame study={study} page="Plans">
      <Logbook studyId={study.id} planId={Number(planId)} viewerId={user.id} allowedActions={study.allowedActions} />
    </StudyPageFrame>
  );
}
