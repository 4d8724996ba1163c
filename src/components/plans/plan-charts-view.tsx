'use client';

import { useMemo, useState } from 'react';
import { Select } from '@/components/ui/select';
import { AXIS_INFO, axisTitle } from './axis-units';
import { buildHeatmap, buildLineSeries, canUseLog } from './chart-data';
import { EChart, type ChartOption } from './echart';
import type { AxisQuantity, AxisSpec, PlanPoint } from './plan-types';
import { formatPredicted, PREDICTED_QUANTITIES, predictedInfo, type PredictedKey } from './predicted-quantities';

/** Colours of the lines: flux and copper first, as the rest of Couplet (tailwind.config.ts). */
const LINE_COLOURS = ['#217a7b', '#c9662b', '#3b4960', '#44b5b3', '#df8046', '#8294ad', '#1e4f51', '#873f1e'];
/** Heatmap from light to dark flux. */
const HEAT_COLOURS = ['#effbfa', '#77d1ce', '#2a9897', '#1e4f51'];

const QUANTITY_OPTIONS = PREDICTED_QUANTITIES.map((q) => ({ value: q.key, label: q.label }));

function LabelledSelect({ label, value, options, onChange }: { label: string; value: string; options: { value: string; label: string }[]; onChange: (value: string) => void }) {
  return (
    <label className="space-y-1 text-sm font-medium text-ink-800">
      <span className="block">{label}</span>
      <Select aria-label={label} value={value} options={options} onChange={(e) => onChange(e.target.value)} className="w-56" />
    </label>
  );
}

/** Line chart and heatmap of the predicted values; loaded only in the browser (next/dynamic). */
export default function PlanChartsView({ axes, points, planName }: { axes: AxisSpec[]; points: PlanPoint[]; planName: string }) {
  const axisOptions = axes.map((a) => ({ value: a.quantity, label: AXIS_INFO[a.quantity].label }));
  const [quantity, setQuantity] = useState<PredictedKey>('coupling');
  const [xAxis, setXAxis] = useState<AxisQuantity>(axes[axes.length - 1].quantity);
  const [seriesAxis, setSeriesAxis] = useState<AxisQuantity | ''>(axes.length > 1 ? axes[0].quantity : '');
  const [logY, setLogY] = useState(false);
  const info = predictedInfo(quantity);
  const xSpec = axes.find((a) => a.quantity === xAxis) ?? axes[0];

  const series = useMemo(() => buildLineSeries(points, axes, quantity, xSpec.quantity, seriesAxis || null), [points, axes, quantity, xSpec.quantity, seriesAxis]);
  const logPossible = canUseLog(series);
  const useLog = logY && logPossible;

  const lineOption = useMemo<ChartOption>(
    () => ({
      color: LINE_COLOURS,
      animation: false,
      grid: { left: 80, right: 24, top: 40, bottom: 56 },
      legend: { top: 0, type: 'scroll' },
      tooltip: { trigger: 'axis', valueFormatter: (v: unknown) => formatPredicted(Number(v), quantity) },
      xAxis: { type: 'value', name: axisTitle(xSpec.quantity, xSpec.displayUnit), nameLocation: 'middle', nameGap: 32, min: 'dataMin', max: 'dataMax' },
      yAxis: {
        type: useLog ? 'log' : 'value',
        name: info.label,
        scale: true,
        axisLabel: { formatter: (v: number) => formatPredicted(v, quantity) },
      },
      series: series.map((s) => ({ type: 'line', name: s.name || info.label, data: s.data, showSymbol: true, symbolSize: 5 })),
    }),
    [series, useLog, info.label, quantity, xSpec],
  );

  const [heatX, setHeatX] = useState<AxisQuantity>(axes[axes.length - 1].quantity);
  const [heatY, setHeatY] = useState<AxisQuantity>(axes[0].quantity);
  const heat = useMemo(() => buildHeatmap(points, axes, quantity, heatX, heatY), [points, axes, quantity, heatX, heatY]);
  const heatXSpec = axes.find((a) => a.quantity === heatX)!;
  const heatYSpec = axes.find((a) => a.quantity === heatY)!;
  const heatOption = useMemo<ChartOption>(
    () => ({
      animation: false,
      grid: { left: 80, right: 110, top: 16, bottom: 56 },
      tooltip: { formatter: (p: { value: [number, number, number] }) => formatPredicted(p.value[2], quantity) },
      xAxis: { type: 'category', data: heat.xValues.map(String), name: heatXSpec ? axisTitle(heatXSpec.quantity, heatXSpec.displayUnit) : '', nameLocation: 'middle', nameGap: 32 },
      yAxis: { type: 'category', data: heat.yValues.map(String), name: heatYSpec ? axisTitle(heatYSpec.quantity, heatYSpec.displayUnit) : '', nameLocation: 'middle', nameGap: 56 },
      visualMap: {
        min: heat.min,
        max: heat.max === heat.min ? heat.min + 1e-12 : heat.max,
        calculable: true,
        orient: 'vertical',
        right: 0,
        top: 'middle',
        inRange: { color: HEAT_COLOURS },
        formatter: (v: number) => formatPredicted(v, quantity),
      },
      series: [{ type: 'heatmap', name: info.label, data: heat.cells, label: { show: false } }],
    }),
    [heat, heatXSpec, heatYSpec, info.label, quantity],
  );

  const slug = planName.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'plan';
  return (
    <div className="space-y-8">
      <section aria-label="Line chart" className="space-y-3">
        <div className="flex flex-wrap items-end gap-4">
          <LabelledSelect label="Quantity" value={quantity} options={QUANTITY_OPTIONS} onChange={(v) => setQuantity(v as PredictedKey)} />
          <LabelledSelect label="Against" value={xSpec.quantity} options={axisOptions} onChange={(v) => setXAxis(v as AxisQuantity)} />
          <LabelledSelect
            label="One line per"
            value={seriesAxis}
            options={[{ value: '', label: 'one line' }, ...axisOptions.filter((o) => o.value !== xSpec.quantity)]}
            onChange={(v) => setSeriesAxis(v as AxisQuantity | '')}
          />
          <label className="flex h-9 items-center gap-2 text-sm text-ink-800">
            <input type="checkbox" checked={useLog} disabled={!logPossible} onChange={(e) => setLogY(e.target.checked)} />
            Log scale{!logPossible && <span className="text-ink-500"> (needs values above zero)</span>}
          </label>
        </div>
        <EChart option={lineOption} label={`${info.label} against ${AXIS_INFO[xSpec.quantity].label.toLowerCase()}`} filename={`${slug}-${quantity}-line`} />
      </section>
      {axes.length >= 2 && (
        <section aria-label="Heatmap" className="space-y-3">
          <div className="flex flex-wrap items-end gap-4">
            <LabelledSelect label="Heatmap across" value={heatX} options={axisOptions} onChange={(v) => setHeatX(v as AxisQuantity)} />
            <LabelledSelect label="Heatmap up" value={heatY} options={axisOptions} onChange={(v) => setHeatY(v as AxisQuantity)} />
          </div>
          {heatX === heatY ? (
            <p className="text-sm text-ink-600">Choose two different axes for the heatmap.</p>
          ) : (
            <EChart option={heatOption} label={`Heatmap of ${info.label}`} filename={`${slug}-${quantity}-heatmap`} />
          )}
        </section>
      )}
    </div>
  );
}
