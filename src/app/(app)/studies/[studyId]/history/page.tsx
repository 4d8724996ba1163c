import type { Metadata } from 'next';
import { HistoryView } from '@/components/history/history-view';
import type { HistoryFilters } from '@/hooks/use-study-history';
import { StudyPageFrame } from '@/components/studies/study-page-frame';
import { PageHeader } from '@/components/ui/page-header';
import { loadStudyPage } from '@/lib/auth/study-page';
import { listPlans } from '@/lib/data/plans';
import { historyQuerySchema } from '@/lib/validations/history';

type Params = Promise<{ studyId: string }>;
type SearchParams = Promise<Record<string, string | string[] | undefined>>;

export async function generateMetadata({ params }: { params: Params }): Promise<Metadata> {
  const { study } = await loadStudyPage((await params).studyId);
  return { title: `History · ${study.name}` };
}

/** Filters from the address; a malformed one is dropped rather than failing the page. */
async function initialFilters(searchParams: SearchParams): Promise<HistoryFilters> {
  const raw = await searchParams;
  const first = (key: string) => (Array.isArray(raw[key]) ? raw[key][0] : raw[key]);
  const candidate: Record<string, string | undefined> = { actorId: first('actorId'), planId: first('planId'), category: first('category') };
  let parsed = historyQuerySchema.safeParse(candidate);
  if (!parsed.success) {
    for (const issue of parsed.error.issues) delete candidate[String(issue.path[0])];
    parsed = historyQuerySchema.safeParse(candidate);
  }
  if (!parsed.success) return {};
  const { actorId, planId, category } = parsed.data;
  return { actorId, planId, category };
}

/** Who did what and when on a study, for everyone on it; 404 for people who are not. */
export default async function HistoryPage({ params, searchParams }: { params: Params; searchParams: SearchParams }) {
  const { study, user } = await loadStudyPage((await params).studyId);
  const plans = await listPlans(user, study.id);
  return (
    <StudyPageFrame
      study={study}
      page="History"
      header={<PageHeader title="History" description="Who did what on this study, and when, newest first." />}
    >
      <HistoryView
        studyId={study.id}
        plans={plans.map((plan) => ({ id: plan.id, name: plan.name }))}
        initialFilters={await initialFilters(searchParams)}
      />
    </StudyPageFrame>
  );
}
