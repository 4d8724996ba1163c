import type { PlanState } from '@/lib/plans/states';
import type { AgreementSummary, PlanDecision } from '@/lib/review/types';
import { formatPercentValue, formatSignedPercent } from './format-review';

/** Decisions newest first; ties (same second) by id. */
export const newestFirst = (decisions: readonly PlanDecision[]): PlanDecision[] =>
  [...decisions].sort((a, b) => b.createdAt.localeCompare(a.createdAt) || b.id - a.id);

/** "4 poses compared · RMS 3.21 % · largest −5.00 % · bias +1.00 % · 1 outside ±5.00 %" */
export function summaryLine(summary: AgreementSummary): string {
  return [
    `${summary.compared} ${summary.compared === 1 ? 'pose' : 'poses'} compared`,
    `RMS ${formatPercentValue(summary.rmsRelative)}`,
    `largest ${formatSignedPercent(summary.maxRelative)}`,
    `bias ${formatSignedPercent(summary.bias)}`,
    `${summary.outsideTolerance} outside ±${formatPercentValue(summary.tolerance)}`,
    `${summary.setAside} set aside`,
  ].join(' · ');
}

/** The decision that sent the plan back, while it is still on the bench because of it; else null. */
export function standingReturn(state: PlanState, decisions: readonly PlanDecision[]): PlanDecision | null {
  const latest = newestFirst(decisions)[0];
  return state === 'on_bench' && latest?.decision === 'returned' ? latest : null;
}
