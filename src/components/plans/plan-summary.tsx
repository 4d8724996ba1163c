import type { Setup } from '@/lib/data/setups';
import { AXIS_INFO, formatAxisValue } from './axis-units';
import { formatBenchTime } from './plan-count';
import { ORDER_LABEL, type AxisSpec, type Plan } from './plan-types';

/** An axis in words, in the units it was typed: "0 deg to 90 deg by 30 deg". */
export function describeAxis(axis: AxisSpec): string {
  const show = (v: number) => formatAxisValue(v, axis.quantity, axis.displayUnit);
  if (axis.mode === 'list') return axis.values.map(show).join(', ');
  if (axis.mode === 'range') return `${show(axis.start)} to ${show(axis.stop)} by ${show(axis.step)}`;
  return `${axis.count} values ${axis.spacing === 'log' ? 'log-spaced' : 'evenly spaced'} from ${show(axis.start)} to ${show(axis.stop)}`;
}

/** What a plan sweeps and how it is run, read-only. */
export function PlanSummary({ plan, setups }: { plan: Plan; setups?: Setup[] }) {
  const setup = setups?.find((s) => s.id === plan.setupId);
  const rows: [string, string][] = [
    ['Setup', setup?.name ?? `setup ${plan.setupId}`],
    ...plan.axes.map((axis): [string, string] => [AXIS_INFO[axis.quantity].label, describeAxis(axis)]),
    ['Repeats', String(plan.repeats)],
    ['Reference point', plan.referenceEvery ? `every ${plan.referenceEvery} points` : 'none'],
    ['Order', plan.orderMode === 'shuffled' ? `shuffled, seed ${plan.shuffleSeed ?? '—'}` : ORDER_LABEL[plan.orderMode]],
    ['Points', plan.pointCount.toLocaleString('en')],
    ['Bench time', `about ${formatBenchTime(plan.estimatedMinutes)} at ${plan.minutesPerPoint} min a point`],
  ];
  if (plan.notes) rows.push(['Notes', plan.notes]);
  return (
    <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[12rem_1fr]">
      {rows.map(([term, value]) => (
        <div key={term} className="contents">
          <dt className="font-medium text-ink-600">{term}</dt>
          <dd className="text-ink-900">{value}</dd>
        </div>
      ))}
    </dl>
  );
}
