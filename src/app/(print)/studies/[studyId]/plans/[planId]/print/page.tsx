import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { PrintSheet } from '@/components/plans/print-sheet';
import { loadStudyPage } from '@/lib/auth/study-page';

type Params = Promise<{ studyId: string; planId: string }>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `Run sheet · ${study.name}` };
}

/** The printable run sheet of a plan; 404 for people not on the study. */
export default async function PrintRunSheetPage({ params }: { params: Params }) {
  const { studyId, planId } = await params;
  const { study } = await loadStudyPage(studyId);
  if (!/^[1-9][0-9]{0,9}$/.test(planId)) notFound();
  return <PrintSheet studyId={study.id} planId={Number(planId)} studyName={study.name} />;
}
