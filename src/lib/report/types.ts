import type { Coil } from '../data/coils';
import type { PlanPoint } from '../data/plan-points';
import type { Plan } from '../data/plans';
import type { Reading } from '../data/readings';
import type { Setup } from '../data/setups';
import type { PlanComment, PlanReview, ReviewQuantity } from '../review/types';

/**
 * Everything a plan's report shows, gathered once (src/lib/report/load.ts) and then rendered as a PDF
 * or a zip of CSV files without touching the database again. Values are SI, as the API serves them.
 */
export interface PlanReport {
  /** ISO 8601 time the report was gathered */
  generatedAt: string;
  study: { id: number; name: string };
  plan: Plan;
  setup: Setup;
  transmitter: Coil;
  receiver: Coil;
  /** every point of the plan, in measurement order */
  points: PlanPoint[];
  /** the review of each quantity */
  reviews: Record<ReviewQuantity, PlanReview>;
  comments: PlanComment[];
  /** every version of every reading, in measurement order and then version order */
  readings: Reading[];
}
