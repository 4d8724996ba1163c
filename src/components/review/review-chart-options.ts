import type { ChartOption } from '@/components/plans/echart';
import { METHOD_SPECS } from '@/physics/measurement/methods';
import type { ReviewQuantity } from '@/lib/review/types';
import { errorBarSeries, polygonSeries } from './chart-shapes';
import { formatAxisTick, formatPercentValue, formatReviewMeasured, formatReviewValue, formatSignedPercent, quantityAxisName } from './format-review';
import { POINT_KINDS, type AxisChartData, type ParityData, type ParityPoint, type PointKind, type ResidualData, type ResidualPoint } from './review-chart-data';

/**
 * ECharts options for the three review charts. Kinds of point differ by shape and colour both, so a
 * reader who cannot tell the colours apart still tells a flagged reading from one set aside.
 */

/** Series colours: flux and copper first, as the plan charts (tailwind.config.ts). */
export const SERIES_COLOURS = ['#217a7b', '#c9662b', '#3b4960', '#44b5b3', '#df8046', '#8294ad', '#1e4f51', '#873f1e'];
const INK_700 = '#3b4960';
const FLUX_100 = '#d5f3f1';
const FLUX_200 = '#ade6e3';

export const KIND_STYLE: Record<PointKind, { name: string; symbol: string; symbolSize: number; itemStyle: Record<string, unknown> }> = {
  ordinary: { name: 'Reading', symbol: 'circle', symbolSize: 8, itemStyle: { color: '#217a7b' } },
  autoOutlier: { name: 'Flagged: beyond 3 u', symbol: 'triangle', symbolSize: 12, itemStyle: { color: '#d98e04', borderColor: '#5f3a0a', borderWidth: 1 } },
  setAside: { name: 'Set aside', symbol: 'diamond', symbolSize: 12, itemStyle: { color: '#ffffff', borderColor: '#4a5b75', borderWidth: 2 } },
};

const BASE = { animation: false, textStyle: { fontFamily: 'Inter, ui-sans-serif, system-ui, sans-serif' } };
/** Axes at the plot's edges, not through zero, so they never cross the data or the zero line. */
const EDGE = { axisLine: { onZero: false } };


/** Bands are see-through, so the grid and the narrower band show through the wider one. */
const BAND_OPACITY = 0.7;


const methodLabel = (m: ParityPoint['method']) => METHOD_SPECS[m]?.label ?? m;

/** Predicted lines, measured means with ±1 u bars and the fit's dashed re-prediction, against one axis. */
export function axisChartOption(data: AxisChartData, quantity: ReviewQuantity, xTitle: string): ChartOption {
  const series = data.series.flatMap((s, i) => {
    const colour = SERIES_COLOURS[i % SERIES_COLOURS.length];
    const suffix = s.name ? ` · ${s.name}` : '';
    const measuredName = `Measured${suffix}`;
    const out: Record<string, unknown>[] = [
      { type: 'line', name: `Predicted${suffix}`, data: s.predicted, color: colour, showSymbol: false, lineStyle: { width: 2 } },
      {
        type: 'scatter',
        name: measuredName,
        color: colour,
        symbolSize: 8,
        z: 4,
        data: s.measured.map((m) => ({ value: [m.x, m.mean], u: m.uncertainty, n: m.n, seqs: m.seqs })),
      },
      errorBarSeries(measuredName, colour, s.measured.map((m) => [m.x, m.mean - m.uncertainty, m.mean + m.uncertainty]), { cap: 4, lineWidth: 1.5 }),
    ];
    if (s.refit.length > 0) {
      out.push({ type: 'line', name: `Fit${suffix}`, data: s.refit, color: colour, showSymbol: false, lineStyle: { width: 1.5, type: 'dashed' } });
    }
    return out;
  });
  return {
    ...BASE,
    grid: { left: 88, right: 24, top: 48, bottom: 56 },
    legend: { top: 0, type: 'scroll' },
    tooltip: {
      trigger: 'item',
      formatter: (p: { seriesName: string; data: unknown; value: unknown }) => {
        const item = p.data as { value?: [number, number]; u?: number; n?: number; seqs?: number[] };
        if (item && item.u !== undefined && item.value) {
          return `${p.seriesName}<br/>#${item.seqs?.join(', #')}: ${formatReviewMeasured(item.value[1], item.u, quantity)} (n = ${item.n})`;
        }
        const v = p.value as [number, number];
        return `${p.seriesName}<br/>${formatReviewValue(v[1], quantity)}`;
      },
    },
    xAxis: { ...EDGE, type: 'value', name: xTitle, nameLocation: 'middle', nameGap: 32, scale: true },
    yAxis: { ...EDGE, type: 'value', name: quantityAxisName(quantity, ''), scale: true, axisLabel: { formatter: (v: number) => formatAxisTick(v, quantity) } },
    series,
  };
}

function kindSeries<T>(points: Record<PointKind, T[]>, value: (p: T) => [number, number], tooltip: (p: T) => string): Record<string, unknown>[] {
  return POINT_KINDS.map((kind) => ({
    type: 'scatter',
    name: KIND_STYLE[kind].name,
    symbol: KIND_STYLE[kind].symbol,
    symbolSize: KIND_STYLE[kind].symbolSize,
    itemStyle: KIND_STYLE[kind].itemStyle,
    z: kind === 'ordinary' ? 3 : 4,
    data: points[kind].map((p) => ({ value: value(p), tip: tooltip(p) })),
  }));
}

const itemTooltip = { trigger: 'item', formatter: (p: { seriesName: string; data: { tip?: string } }) => p.data?.tip ?? p.seriesName };

/** Measured against predicted, each reading one point, with the line of equality and ±5 % / ±10 % bands. */
export function parityOption(data: ParityData, quantity: ReviewQuantity): ChartOption {
  const [lo, hi] = data.range ?? [0, 1];
  const tick = (v: number) => formatAxisTick(v, quantity);
  const tip = (p: ParityPoint) =>
    `#${p.seq} · ${methodLabel(p.method)}<br/>measured ${formatReviewMeasured(p.measured, p.uncertainty, quantity)}<br/>predicted ${formatReviewValue(p.predicted, quantity)}<br/>${formatSignedPercent(p.relative)}`;
  return {
    ...BASE,
    grid: { left: 88, right: 24, top: 48, bottom: 56 },
    legend: { top: 0, type: 'scroll' },
    tooltip: itemTooltip,
    xAxis: { ...EDGE, type: 'value', name: quantityAxisName(quantity, 'Predicted'), nameLocation: 'middle', nameGap: 32, min: lo, max: hi, interval: data.step, axisLabel: { formatter: tick } },
    yAxis: { ...EDGE, type: 'value', name: quantityAxisName(quantity, 'Measured'), min: lo, max: hi, interval: data.step, axisLabel: { formatter: tick } },
    series: [
      ...data.bands.map((b) => polygonSeries(`±${Math.round(b.fraction * 100)} %`, b.polygon, b.fraction > 0.05 ? FLUX_100 : FLUX_200, BAND_OPACITY)),
      { type: 'line', name: 'Measured = predicted', data: [[lo, lo], [hi, hi]], color: INK_700, showSymbol: false, silent: true, lineStyle: { width: 1 } },
      ...kindSeries(data.points, (p) => [p.predicted, p.measured], tip),
    ],
  };
}

/** Each reading's relative error against one axis, with the zero line and the tolerance band. */
export function residualOption(data: ResidualData, xTitle: string): ChartOption {
  const [lo, hi] = data.xRange ?? [0, 1];
  const t = data.tolerancePercent;
  const tip = (p: ResidualPoint) => `#${p.seq} · ${methodLabel(p.method)}<br/>${formatSignedPercent(p.percent / 100)}`;
  return {
    ...BASE,
    grid: { left: 88, right: 24, top: 48, bottom: 56 },
    legend: { top: 0, type: 'scroll' },
    tooltip: itemTooltip,
    // the padded ends are not round numbers; the ticks between them are
    xAxis: { ...EDGE, type: 'value', name: xTitle, nameLocation: 'middle', nameGap: 32, min: lo, max: hi, axisLabel: { showMinLabel: false, showMaxLabel: false } },
    yAxis: { ...EDGE, type: 'value', name: 'Relative error [%]', scale: true, axisLabel: { formatter: (v: number) => `${Number(v.toPrecision(4))} %` } },
    series: [
      polygonSeries(`Tolerance ±${formatPercentValue(t / 100)}`, [[lo, -t], [hi, -t], [hi, t], [lo, t]], FLUX_100, BAND_OPACITY),
      { type: 'line', name: 'Zero', data: [[lo, 0], [hi, 0]], color: INK_700, showSymbol: false, silent: true, lineStyle: { width: 1 } },
      ...kindSeries(data.points, (p) => [p.x, p.percent], tip),
    ],
  };
}
