import type { EChartsCoreOption } from 'echarts';
import { errorBarSeries, polygonSeries } from '@/components/review/chart-shapes';
import { formatAxisTick, formatPercentValue, quantityAxisName } from '@/components/review/format-review';
import { POINT_KINDS, type AxisChartData, type ParityData, type PointKind, type ResidualData } from '@/components/review/review-chart-data';
import { OUTLIER_SIGMA } from '../../physics/review/outliers';
import type { ReviewQuantity } from '../review/types';
import { FONT } from './fonts';

/**
 * ECharts options for the report's charts: the review page's three charts (same data, from
 * src/components/review/review-chart-data.ts) drawn for paper: no tooltips, a legend that wraps
 * instead of scrolling, and shapes as well as colours telling the kinds of reading apart, since a
 * report is often printed in black and white.
 */

/** Series colours as on the page (tailwind.config.ts, flux and copper first). */
const SERIES_COLOURS = ['#217a7b', '#c9662b', '#3b4960', '#44b5b3', '#df8046', '#8294ad', '#1e4f51', '#873f1e'];
const INK_700 = '#3b4960';
const INK_500 = '#64748b';
const BAND_WIDE = '#effbfa';
const BAND_NARROW = '#d5f3f1';

const KIND_STYLE: Record<PointKind, { name: string; symbol: string; symbolSize: number; itemStyle: Record<string, unknown> }> = {
  ordinary: { name: 'Reading', symbol: 'circle', symbolSize: 6, itemStyle: { color: '#217a7b' } },
  autoOutlier: { name: `Flagged: beyond ${OUTLIER_SIGMA} u`, symbol: 'triangle', symbolSize: 9, itemStyle: { color: '#d98e04', borderColor: '#5f3a0a', borderWidth: 1 } },
  setAside: { name: 'Set aside', symbol: 'diamond', symbolSize: 9, itemStyle: { color: '#ffffff', borderColor: '#4a5b75', borderWidth: 1.5 } },
};

/** Text size in chart pixels; the report draws 1 px as 0.75 pt, so 11 px prints at about 8 pt. */
const FONT_PX = 11;
const LEGEND_ROW_PX = 18;

const BASE = { animation: false, textStyle: { fontFamily: FONT.regular, fontSize: FONT_PX, color: INK_700 } };

/** Axes whose ends are the data's range plus padding: the ends are not round numbers, so not labelled. */
const PADDED_AXIS_LABEL = { color: INK_500, fontSize: FONT_PX - 1, showMinLabel: false, showMaxLabel: false };

/** Rows the legend needs at this width: each entry is its text plus the symbol and a gap. */
function legendRows(names: readonly string[], widthPx: number): number {
  const usable = widthPx - 20;
  let rows = 1;
  let used = 0;
  for (const name of names) {
    const entry = name.length * FONT_PX * 0.55 + 40;
    if (used > 0 && used + entry > usable) {
      rows += 1;
      used = 0;
    }
    used += entry;
  }
  return rows;
}

function frame(legendNames: string[], widthPx: number) {
  const top = legendRows(legendNames, widthPx) * LEGEND_ROW_PX + 14;
  return {
    legend: { top: 0, left: 'center', data: legendNames, itemWidth: 18, itemHeight: 10, itemGap: 16, textStyle: { fontSize: FONT_PX } },
    grid: { left: 64, right: 16, top, bottom: 44 },
  };
}

const quantityName = (quantity: ReviewQuantity, prefix: string) => quantityAxisName(quantity, prefix).trim();

const valueAxis = (name: string, extra: Record<string, unknown>, vertical: boolean) => ({
  type: 'value',
  name,
  nameLocation: 'middle',
  nameGap: vertical ? 50 : 26,
  nameTextStyle: { color: INK_700, fontSize: FONT_PX },
  axisLabel: { color: INK_500, fontSize: FONT_PX - 1 },
  splitLine: { lineStyle: { color: '#e2e8f0' } },
  ...extra,
});

/**
 * Predicted (solid), measured means with ±1 u bars (dots) and the latest fit (dashed) against the
 * first axis, one colour per value of the second axis.
 */
export function axisChartOption(data: AxisChartData, quantity: ReviewQuantity, xTitle: string, widthPx: number): EChartsCoreOption {
  const grouped = data.series.length > 1 || data.series.some((s) => s.name !== '');
  const series = data.series.flatMap((s, i) => {
    const colour = SERIES_COLOURS[i % SERIES_COLOURS.length];
    const name = (kind: string) => (grouped ? s.name : kind);
    const out: Record<string, unknown>[] = [
      { type: 'line', name: name('Predicted'), data: s.predicted, color: colour, showSymbol: s.predicted.length === 1, symbol: 'emptyCircle', lineStyle: { width: 1.5 } },
      { type: 'scatter', name: name('Measured ± 1 u'), data: s.measured.map((m) => [m.x, m.mean]), color: colour, symbolSize: 6, z: 4 },
      errorBarSeries(name('Measured ± 1 u'), colour, s.measured.map((m) => [m.x, m.mean - m.uncertainty, m.mean + m.uncertainty]), { cap: 3, lineWidth: 1 }),
    ];
    if (s.refit.length > 0) out.push({ type: 'line', name: name('Fit'), data: s.refit, color: colour, showSymbol: false, lineStyle: { width: 1.2, type: 'dashed' } });
    return out;
  });
  const names = [...new Set(series.map((s) => s.name as string))];
  return {
    ...BASE,
    ...frame(names, widthPx),
    xAxis: valueAxis(xTitle, { scale: true }, false),
    yAxis: valueAxis(quantityName(quantity, ''), { scale: true, axisLabel: { color: INK_500, fontSize: FONT_PX - 1, formatter: (v: number) => formatAxisTick(v, quantity) } }, true),
    series,
  };
}

function kindSeries(points: Record<PointKind, [number, number][]>): Record<string, unknown>[] {
  return POINT_KINDS.filter((kind) => points[kind].length > 0).map((kind) => ({
    type: 'scatter',
    name: KIND_STYLE[kind].name,
    symbol: KIND_STYLE[kind].symbol,
    symbolSize: KIND_STYLE[kind].symbolSize,
    itemStyle: KIND_STYLE[kind].itemStyle,
    z: kind === 'ordinary' ? 3 : 4,
    data: points[kind],
  }));
}

const mapKinds = <T>(points: Record<PointKind, T[]>, value: (p: T) => [number, number]) =>
  Object.fromEntries(POINT_KINDS.map((k) => [k, points[k].map(value)])) as Record<PointKind, [number, number][]>;

/** Measured against predicted, each reading one point, with the line of equality and ±5 % / ±10 % bands. */
export function parityOption(data: ParityData, quantity: ReviewQuantity, widthPx: number): EChartsCoreOption {
  const [lo, hi] = data.range ?? [0, 1];
  const tick = { ...PADDED_AXIS_LABEL, formatter: (v: number) => formatAxisTick(v, quantity) };
  const series = [
    ...data.bands.map((b) => polygonSeries(`±${Math.round(b.fraction * 100)} %`, b.polygon, b.fraction > 0.05 ? BAND_WIDE : BAND_NARROW)),
    { type: 'line', name: 'Measured = predicted', data: [[lo, lo], [hi, hi]], color: INK_700, showSymbol: false, lineStyle: { width: 1 } },
    ...kindSeries(mapKinds(data.points, (p) => [p.predicted, p.measured])),
  ];
  return {
    ...BASE,
    ...frame(series.map((s) => s.name as string), widthPx),
    xAxis: valueAxis(quantityName(quantity, 'Predicted'), { min: lo, max: hi, axisLabel: tick }, false),
    yAxis: valueAxis(quantityName(quantity, 'Measured'), { min: lo, max: hi, axisLabel: tick }, true),
    series,
  };
}

/** Each reading's relative error against one axis, with the zero line and the tolerance band. */
export function residualOption(data: ResidualData, xTitle: string, widthPx: number): EChartsCoreOption {
  const [lo, hi] = data.xRange ?? [0, 1];
  const t = data.tolerancePercent;
  const series = [
    polygonSeries(`Tolerance ±${formatPercentValue(t / 100)}`, [[lo, -t], [hi, -t], [hi, t], [lo, t]], BAND_NARROW),
    { type: 'line', name: 'Zero', data: [[lo, 0], [hi, 0]], color: INK_700, showSymbol: false, lineStyle: { width: 1 } },
    ...kindSeries(mapKinds(data.points, (p) => [p.x, p.percent])),
  ];
  return {
    ...BASE,
    ...frame(series.map((s) => s.name as string).filter((name) => name !== 'Zero'), widthPx),
    xAxis: valueAxis(xTitle, { min: lo, max: hi, axisLabel: PADDED_AXIS_LABEL }, false),
    yAxis: valueAxis('Relative error [%]', { scale: true, axisLabel: { color: INK_500, fontSize: FONT_PX - 1, formatter: (v: number) => `${Number(v.toPrecision(4))} %` } }, true),
    series,
  };
}
