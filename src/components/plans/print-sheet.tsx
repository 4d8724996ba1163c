'use client';

import { usePlan } from '@/hooks/use-plan';
import { usePlanPoints } from '@/hooks/use-plan-points';
import { describeAxis } from './plan-summary';
import { AXIS_INFO } from './axis-units';
import { formatBenchTime } from './plan-count';
import { ORDER_LABEL, STATE_LABEL } from './plan-types';
import { formatPredicted, predictedInfo } from './predicted-quantities';
import { poseColumnTitle, runSheetRows, SHEET_PREDICTED } from './run-sheet-rows';

/** Printed run sheet: black on white, one table, a tick column and room for notes; no navigation. */
export function PrintSheet({ studyId, planId, studyName }: { studyId: number; planId: number; studyName: string }) {
  const { plan, error } = usePlan(studyId, planId);
  const { points } = usePlanPoints(studyId, planId);
  if (error) return <p>{error.message}</p>;
  if (!plan || !points) return <p role="status">Loading the run sheet…</p>;
  const rows = runSheetRows(points, plan.axes);
  return (
    <article className="space-y-4 text-black">
      <header className="flex items-start justify-between gap-6">
        <div>
          <p className="text-xs uppercase tracking-wide">{studyName}</p>
          <h1 className="text-xl font-semibold">Run sheet: {plan.name}</h1>
          <p className="text-sm">
            {STATE_LABEL[plan.state]} · {plan.pointCount.toLocaleString('en')} points · about {formatBenchTime(plan.estimatedMinutes)} ·{' '}
            {plan.orderMode === 'shuffled' ? `shuffled, seed ${plan.shuffleSeed}` : ORDER_LABEL[plan.orderMode]}
            {plan.prediction.solverVersion ? ` · solver ${plan.prediction.solverVersion}` : ''}
          </p>
          <ul className="text-sm">
            {plan.axes.map((axis) => (
              <li key={axis.quantity}>
                {AXIS_INFO[axis.quantity].label}: {describeAxis(axis)}
              </li>
            ))}
          </ul>
        </div>
        <button type="button" onClick={() => window.print()} className="rounded border border-black px-3 py-1 text-sm print:hidden">
          Print
        </button>
      </header>
      <table className="w-full border-collapse text-xs" aria-label="Run sheet">
        <thead>
          <tr>
            {['#', 'Rep.', 'Ref.', ...plan.axes.map(poseColumnTitle), ...SHEET_PREDICTED.map((k) => predictedInfo(k).label), 'Done', 'Notes'].map((head) => (
              <th key={head} scope="col" className="border border-black px-1.5 py-1 text-left font-semibold">
                {head}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.id} className="break-inside-avoid">
              <td className="border border-black px-1.5 py-1 tabular-nums">{row.seq}</td>
              <td className="border border-black px-1.5 py-1 tabular-nums">{row.repeat}</td>
              <td className="border border-black px-1.5 py-1">{row.reference ? 'ref' : ''}</td>
              {plan.axes.map((axis) => (
                <td key={axis.quantity} className="border border-black px-1.5 py-1 tabular-nums">
                  {row.pose[axis.quantity] ?? ''}
                </td>
              ))}
              {SHEET_PREDICTED.map((key) => (
                <td key={key} className="border border-black px-1.5 py-1 tabular-nums">
                  {formatPredicted(row.predicted[key], key)}
                </td>
              ))}
              <td className="w-10 border border-black" />
              <td className="w-40 border border-black" />
            </tr>
          ))}
        </tbody>
      </table>
    </article>
  );
}
