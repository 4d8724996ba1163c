'use client';

import { useMemo, useState, type ReactNode } from 'react';
import { AXIS_INFO, axisTitle } from '@/components/plans/axis-units';
import { EChart } from '@/components/plans/echart';
import type { AxisQuantity } from '@/components/plans/plan-types';
import { Select } from '@/components/ui/select';
import { REVIEW_QUANTITY_LABELS, type PlanReview } from '@/lib/review/types';
import { describeAxisChart, describeParity, describeResiduals } from './chart-text';
import { buildAxisChart, buildParity, buildResiduals } from './review-chart-data';
import { axisChartOption, parityOption, residualOption } from './review-chart-options';

function LabelledSelect({ label, value, options, onChange }: { label: string; value: string; options: { value: string; label: string }[]; onChange: (value: string) => void }) {
  return (
    <label className="space-y-1 text-sm font-medium text-ink-800">
      <span className="block">{label}</span>
      <Select aria-label={label} value={value} options={options} onChange={(e) => onChange(e.target.value)} className="w-52" />
    </label>
  );
}

function ChartSection({ title, summary, children }: { title: string; summary: string; children: ReactNode }) {
  return (
    <section aria-label={title} className="space-y-2">
      <h3 className="text-sm font-semibold text-ink-900">{title}</h3>
      {children}
      <p className="text-sm text-ink-600">{summary}</p>
    </section>
  );
}

/** The review's three charts; loaded only in the browser (next/dynamic), as ECharts needs a canvas. */
export default function ReviewChartsView({ review, slug }: { review: PlanReview; slug: string }) {
  const axes = review.plan.axes;
  const axisOptions = axes.map((a) => ({ value: a.quantity, label: AXIS_INFO[a.quantity].label }));
  const [xChoice, setXAxis] = useState<AxisQuantity>(axes[axes.length - 1]?.quantity ?? 'distance');
  const [seriesChoice, setSeriesAxis] = useState<AxisQuantity | ''>(axes.length > 1 ? axes[0].quantity : '');
  const xSpec = axes.find((a) => a.quantity === xChoice) ?? axes[0];
  const seriesAxis = seriesChoice && seriesChoice !== xSpec?.quantity ? seriesChoice : null;
  const quantity = review.quantity;
  const info = REVIEW_QUANTITY_LABELS[quantity];

  const axisData = useMemo(() => (xSpec ? buildAxisChart(review.poses, axes, xSpec.quantity, seriesAxis) : { series: [], held: [] }), [review.poses, axes, xSpec, seriesAxis]);
  const parity = useMemo(() => buildParity(review.observations), [review.observations]);
  const residuals = useMemo(
    () => (xSpec ? buildResiduals(review.observations, review.poses, axes, xSpec.quantity, review.tolerance) : null),
    [review.observations, review.poses, axes, xSpec, review.tolerance],
  );
  const xTitle = xSpec ? axisTitle(xSpec.quantity, xSpec.displayUnit) : '';
  const axisOption = useMemo(() => axisChartOption(axisData, quantity, xTitle), [axisData, quantity, xTitle]);
  const parityChart = useMemo(() => parityOption(parity, quantity), [parity, quantity]);
  const residualChart = useMemo(() => (residuals ? residualOption(residuals, xTitle) : null), [residuals, xTitle]);

  if (!xSpec) return <p className="text-sm text-ink-600">This plan has no swept axis to chart against.</p>;
  const against = AXIS_INFO[xSpec.quantity].label.toLowerCase();

  return (
    <div className="space-y-8">
      <div className="flex flex-wrap items-end gap-4">
        <LabelledSelect label="Against" value={xSpec.quantity} options={axisOptions} onChange={(v) => setXAxis(v as AxisQuantity)} />
        {axes.length > 1 && (
          <LabelledSelect
            label="One series per"
            value={seriesAxis ?? ''}
            options={[{ value: '', label: 'one series' }, ...axisOptions.filter((o) => o.value !== xSpec.quantity)]}
            onChange={(v) => setSeriesAxis(v as AxisQuantity | '')}
          />
        )}
      </div>

      <ChartSection title={`Measured and predicted ${info.symbol} against ${against}`} summary={describeAxisChart(axisData)}>
        <EChart option={axisOption} label={`${info.label}: measured means with ±1 u bars over the predicted line, against ${against}`} filename={`${slug}-${quantity}-against-${xSpec.quantity}`} />
      </ChartSection>

      <ChartSection title={`Parity plot of ${info.symbol}`} summary={describeParity(parity)}>
        <EChart option={parityChart} label={`Parity plot of ${info.label}: measured against predicted, with the line of equality and ±5 % and ±10 % bands`} filename={`${slug}-${quantity}-parity`} />
      </ChartSection>

      {residuals && residualChart && (
        <ChartSection title={`Relative error of ${info.symbol} against ${against}`} summary={describeResiduals(residuals)}>
          <EChart option={residualChart} label={`Relative error of ${info.label} in percent against ${against}, with the zero line and the tolerance band`} filename={`${slug}-${quantity}-residuals`} />
        </ChartSection>
      )}
    </div>
  );
}
