import type { AxisSpec } from './plan-types';
import { planPointCount } from '@/lib/plans/points';

/**
 * The live point count the designer shows before saving: the server's own count (src/lib/plans), so
 * the form and the stored plan agree, including repeats and reference points.
 */
export function countPlanPoints(axes: readonly AxisSpec[], repeats: number, referenceEvery: number | null): number {
  if (axes.length === 0) return 0;
  return planPointCount({ axes: [...axes], repeats: Math.max(1, Math.floor(repeats)), referenceEvery });
}

/** Bench time as people plan it: "3 h 20 min", "45 min". */
export function formatBenchTime(minutes: number): string {
  if (!Number.isFinite(minutes) || minutes < 0) return '—';
  const rounded = Math.round(minutes);
  const hours = Math.floor(rounded / 60);
  const rest = rounded % 60;
  if (hours === 0) return `${rest} min`;
  return rest === 0 ? `${hours} h` : `${hours} h ${rest} min`;
}
