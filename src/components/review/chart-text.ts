import { AXIS_INFO } from '@/components/plans/axis-units';
import { formatPercentValue } from './format-review';
import { POINT_KINDS, type AxisChartData, type ParityData, type ResidualData } from './review-chart-data';

/**
 * One or two sentences under each chart that say what it shows, for readers who do not see the
 * chart (screen readers) and for anyone who wants the count without counting markers.
 */

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en')} ${n === 1 ? one : many}`;

/** "Lateral offset held at 0 cm; tilt held at 30 deg." or "" when nothing is held. */
export function heldText(data: AxisChartData): string {
  if (data.held.length === 0) return '';
  return `${data.held.map((h) => `${AXIS_INFO[h.quantity].label} held at ${h.value} ${h.unit}`).join('; ')}.`;
}

export function describeAxisChart(data: AxisChartData): string {
  const measured = data.series.reduce((n, s) => n + s.measured.length, 0);
  const predicted = data.series.reduce((n, s) => n + s.predicted.length, 0);
  const fit = data.series.some((s) => s.refit.length > 0);
  const parts = [
    `${plural(measured, 'measured pose')} (mean with ±1 u bars) against ${plural(predicted, 'predicted pose')} in ${plural(data.series.length, 'series', 'series')}.`,
  ];
  if (fit) parts.push('The dashed line is the latest fit, not the prediction.');
  const held = heldText(data);
  if (held) parts.push(held);
  return parts.join(' ');
}

export function describeParity(data: ParityData): string {
  const all = POINT_KINDS.flatMap((k) => data.points[k]);
  if (all.length === 0) return 'No reading with a prediction to compare.';
  const within = (fraction: number) => data.points.ordinary.concat(data.points.autoOutlier).filter((p) => p.relative !== null && Math.abs(p.relative) <= fraction).length;
  const kept = data.points.ordinary.length + data.points.autoOutlier.length;
  return (
    `${plural(all.length, 'reading')} with a prediction. Of the ${kept.toLocaleString('en')} not set aside, ${within(0.05)} within ±5 % and ${within(0.1)} within ±10 %; ` +
    `${plural(data.points.autoOutlier.length, 'reading')} flagged beyond 3 u, ${plural(data.points.setAside.length, 'reading')} set aside.`
  );
}

export function describeResiduals(data: ResidualData): string {
  const kept = data.points.ordinary.concat(data.points.autoOutlier);
  if (kept.length + data.points.setAside.length === 0) return 'No reading with a prediction to compare.';
  const outside = kept.filter((p) => Math.abs(p.percent) > data.tolerancePercent).length;
  return `${plural(kept.length, 'reading')} not set aside; ${outside.toLocaleString('en')} outside the tolerance of ±${formatPercentValue(data.tolerancePercent / 100)}.`;
}
