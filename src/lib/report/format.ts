import { AXIS_INFO, axisTitle, formatAxisValue } from '@/components/plans/axis-units';
import { formatPercentValue, formatSignedPercent } from '@/components/review/format-review';
import { axisValueCount, type PlanAxis } from '../plans/axes';
import type { PlanPose } from '../plans/points';
import type { AgreementSummary } from '../review/types';
import { formatLength } from '../units';
import { OUTLIER_SIGMA } from '../../physics/review/outliers';
import type { CoilSpec } from '../../physics/types';

/**
 * How the report writes what the review page does not: times, coils, axes and poses. Numbers of the
 * review itself go through the page's own formatters (src/components/review/format-review.ts), so the
 * PDF and the page print the same figures.
 */

/** "2026-12-02 09:31 UTC": the same in every locale and time zone, since a report travels. */
export function formatWhen(iso: string): string {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return iso;
  return `${date.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

const plural = (n: number, one: string, many = `${one}s`) => `${n.toLocaleString('en')} ${n === 1 ? one : many}`;

const COIL_KIND: Record<CoilSpec['kind'], string> = { loop: 'Single loop', helix: 'Helix', spiral: 'Flat spiral' };

/** "Helix, radius 1.2 cm, 12 turns, length 3 cm; wire 0.644 mm (AWG 22) copper". */
export function describeCoil(spec: CoilSpec, wireLabel: string | null): string {
  const shape: string[] = [COIL_KIND[spec.kind]];
  if (spec.kind === 'loop') shape.push(`radius ${formatLength(spec.radius)}`);
  if (spec.kind === 'helix') shape.push(`radius ${formatLength(spec.radius)}`, plural(spec.turns, 'turn'), `length ${formatLength(spec.length)}`);
  if (spec.kind === 'spiral') shape.push(`radius ${formatLength(spec.innerRadius)} to ${formatLength(spec.outerRadius)}`, plural(spec.turns, 'turn'));
  const wire = [`wire ${formatLength(spec.wireDiameter)}${wireLabel ? ` (${wireLabel})` : ''}`, spec.material ?? 'copper'];
  if (spec.strands) wire.push(`${spec.strands} strands${spec.strandDiameter ? ` of ${formatLength(spec.strandDiameter)}` : ''}`);
  return `${shape.join(', ')}; ${wire.join(' ')}`;
}

/** "Tilt [deg]: 0 deg to 60 deg in steps of 10 deg (7 values)". */
export function describeAxis(axis: PlanAxis): string {
  const show = (si: number) => formatAxisValue(si, axis.quantity, axis.displayUnit);
  const count = plural(axisValueCount(axis), 'value');
  const title = axisTitle(axis.quantity, axis.displayUnit);
  switch (axis.mode) {
    case 'range':
      return `${title}: ${show(axis.start)} to ${show(axis.stop)} in steps of ${show(axis.step)} (${count})`;
    case 'count':
      return `${title}: ${show(axis.start)} to ${show(axis.stop)}, ${axis.spacing === 'log' ? 'log' : 'evenly'} spaced (${count})`;
    case 'list':
      return `${title}: ${axis.values.map(show).join(', ')} (${count})`;
  }
}

/** The swept values of one pose, in the plan's units: "tilt 30 deg, distance 10 cm". */
export function describePose(pose: PlanPose, axes: readonly PlanAxis[]): string {
  return axes
    .map((a) => {
      const si = pose[a.quantity];
      return si === undefined ? null : `${AXIS_INFO[a.quantity].label.toLowerCase()} ${formatAxisValue(si, a.quantity, a.displayUnit)}`;
    })
    .filter((part): part is string => part !== null)
    .join(', ');
}

/** The placement a plan's poses start from: "distance 10 cm, lateral offset 0 m, tilt 0°". */
export function describePlacement(placement: { distance: number; lateralOffset: number; tiltDeg: number }): string {
  return `distance ${formatLength(placement.distance)}, lateral offset ${formatLength(placement.lateralOffset ?? 0)}, tilt ${Number((placement.tiltDeg ?? 0).toPrecision(6))}\u00b0`;
}


/** The agreement figures as label and value, in the order the report prints them. */
export function summaryFigures(summary: AgreementSummary): [string, string][] {
  return [
    ['Compared poses', `${summary.compared.toLocaleString('en')} (${plural(summary.observations, 'observation')})`],
    ['RMS relative error', formatPercentValue(summary.rmsRelative)],
    ['Largest relative error', formatSignedPercent(summary.maxRelative)],
    ['Bias (mean relative error)', formatSignedPercent(summary.bias)],
    ['Outside tolerance', `${summary.outsideTolerance.toLocaleString('en')} of ${summary.compared.toLocaleString('en')} (tolerance ±${formatPercentValue(summary.tolerance)})`],
    ['Outliers', `${summary.autoOutliers.toLocaleString('en')} flagged beyond ${OUTLIER_SIGMA} u, ${summary.setAside.toLocaleString('en')} set aside by hand`],
  ];
}
