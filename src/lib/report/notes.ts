import type { PlanReport } from './types';

/**
 * Lines both exports print. The safety line only points to who decides; the full cautions people
 * acknowledge at the bench are in src/lib/readings/bench-cautions.ts.
 */
export const BENCH_SAFETY_LINE =
  'Readings near resonant circuits involve high voltages and strong magnetic fields; your institution\u2019s safety rules, ' +
  'local codes and qualified, licensed staff govern whether and how the bench is powered.';

/** The solver versions behind the plan's predictions ("1.0.0"; several when points were computed apart). */
export function solverVersions(report: PlanReport): string {
  const versions = new Set(report.points.map((p) => p.solverVersion).filter((v): v is string => v !== null));
  if (versions.size === 0 && report.plan.prediction.solverVersion) versions.add(report.plan.prediction.solverVersion);
  return versions.size === 0 ? 'none (not predicted)' : [...versions].sort().join(', ');
}

/** "couplet-probe-tilt-at-10-cm": ASCII letters, digits and dashes only, so it is safe in any header. */
export function fileStem(planName: string, planId: number): string {
  const slug = planName
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60)
    .replace(/-+$/, '');
  return `couplet-${slug || `plan-${planId}`}`;
}
