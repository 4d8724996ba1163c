import { REVIEW_QUANTITIES } from '../review/types';
import { quantitySection } from './pdf-quantity';
import { closingSection, commentsSection, decisionsSection, planSection, setupSection, titleBlock } from './pdf-sections';
import { PdfWriter } from './pdf-writer';
import type { PlanReport } from './types';

/**
 * A plan's report as an A4 PDF: what was planned, how the measurements compare with the prediction
 * for each quantity, what was decided and said. The coupling coefficient always has its section (it
 * is what every plan predicts); M and the efficiency only when some reading measured them.
 */
export async function renderPlanPdf(report: PlanReport): Promise<Buffer> {
  const w = new PdfWriter({
    title: `${report.plan.name}: plan report`,
    subject: `Couplet plan report, study ${report.study.name}`,
    createdAt: new Date(report.generatedAt),
  });
  titleBlock(w, report);
  decisionsSection(w, report);
  setupSection(w, report);
  planSection(w, report);
  for (const quantity of REVIEW_QUANTITIES) {
    const review = report.reviews[quantity];
    if (quantity === 'coupling' || review.observations.length > 0) quantitySection(w, review);
  }
  commentsSection(w, report);
  closingSection(w, report);
  return w.finish((page, pages) => `Couplet · ${report.plan.name} · ${report.study.name} · page ${page} of ${pages}`);
}
