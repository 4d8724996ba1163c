import { axisTitle, AXIS_INFO } from '@/components/plans/axis-units';
import { describeAxisChart, describeParity, describeResiduals } from '@/components/review/chart-text';
import { formatFitValue, formatPercentValue, formatReviewMeasured, formatReviewValue, formatSignedPercent } from '@/components/review/format-review';
import { buildAxisChart, buildParity, buildResiduals } from '@/components/review/review-chart-data';
import { FIT_MODEL_INFO, REVIEW_QUANTITY_LABELS, type PlanReview, type ReviewPose } from '../review/types';
import { OUTLIER_SIGMA } from '../../physics/review/outliers';
import { axisChartOption, parityOption, residualOption } from './chart-options';
import { renderChartSvg } from './chart-svg';
import { describePose, formatWhen, summaryFigures } from './format';
import { COLOUR, PT_PER_PX, type PdfWriter, type TableColumn } from './pdf-writer';

/** One reviewed quantity in the PDF: its figures, the fit, the charts and the table of poses. */

const FULL_CHART_HEIGHT_PT = 230;
const HALF_CHART_HEIGHT_PT = 200;
const CHART_GAP_PT = 15;
const CAPTION_SIZE = 7.5;

interface Chart {
  title: string;
  svg: (widthPx: number) => string;
  caption: string;
}

function blockHeight(w: PdfWriter, chart: Chart, width: number, chartHeight: number): number {
  return w.heightOf(chart.title, width, 9, true) + chartHeight + w.heightOf(chart.caption, width, CAPTION_SIZE) + 8;
}

function drawBlock(w: PdfWriter, chart: Chart, x: number, y: number, width: number, chartHeight: number): void {
  w.write(chart.title, { at: { x, y }, width, size: 9, bold: true });
  const top = w.doc.y + 2;
  w.svg(chart.svg(Math.round(width / PT_PER_PX)), x, top, width, chartHeight);
  w.write(chart.caption, { at: { x, y: top + chartHeight + 2 }, width, size: CAPTION_SIZE, color: COLOUR.muted });
}

/** A chart across the page. */
function fullChart(w: PdfWriter, chart: Chart): void {
  const height = blockHeight(w, chart, w.width, FULL_CHART_HEIGHT_PT);
  w.ensureSpace(height);
  const y = w.doc.y;
  drawBlock(w, chart, w.left, y, w.width, FULL_CHART_HEIGHT_PT);
  w.doc.x = w.left;
  w.doc.y = y + height + 6;
}

/** Charts two to a row. */
function halfCharts(w: PdfWriter, charts: readonly Chart[]): void {
  const width = (w.width - CHART_GAP_PT) / 2;
  for (let i = 0; i < charts.length; i += 2) {
    const row = charts.slice(i, i + 2);
    const height = Math.max(...row.map((c) => blockHeight(w, c, width, HALF_CHART_HEIGHT_PT)));
    w.ensureSpace(height);
    const y = w.doc.y;
    row.forEach((chart, j) => drawBlock(w, chart, w.left + j * (width + CHART_GAP_PT), y, width, HALF_CHART_HEIGHT_PT));
    w.doc.x = w.left;
    w.doc.y = y + height + 6;
  }
}

function charts(w: PdfWriter, review: PlanReview): void {
  const { axes } = review.plan;
  w.doc.moveDown(0.6);
  const { quantity } = review;
  const label = REVIEW_QUANTITY_LABELS[quantity].label;
  const [first, second] = axes;
  if (first) {
    const data = buildAxisChart(review.poses, axes, first.quantity, second?.quantity ?? null);
    const xTitle = axisTitle(first.quantity, first.displayUnit);
    const by = second ? `, one colour per ${AXIS_INFO[second.quantity].label.toLowerCase()}` : '';
    fullChart(w, {
      title: `${label}: measured and predicted against ${AXIS_INFO[first.quantity].label.toLowerCase()}${by}`,
      svg: (px) => renderChartSvg(axisChartOption(data, quantity, xTitle, px), px, Math.round(FULL_CHART_HEIGHT_PT / PT_PER_PX)),
      caption: `Solid lines: prediction; dots: measured mean with ±1 standard uncertainty bars${review.fit ? '; dashed: the latest fit' : ''}. ${describeAxisChart(data)}`,
    });
  }
  const parity = buildParity(review.observations);
  if (parity.range === null) {
    w.paragraph('No reading with a prediction to compare yet, so there is no parity or residual chart.', { color: COLOUR.muted });
    return;
  }
  const halfPx = (h: number) => Math.round(h / PT_PER_PX);
  const small: Chart[] = [
    {
      title: 'Measured against predicted',
      svg: (px) => renderChartSvg(parityOption(parity, quantity, px), px, halfPx(HALF_CHART_HEIGHT_PT)),
      caption: describeParity(parity),
    },
    ...axes.map((axis): Chart => {
      const data = buildResiduals(review.observations, review.poses, axes, axis.quantity, review.tolerance);
      const xTitle = axisTitle(axis.quantity, axis.displayUnit);
      return {
        title: `Relative error against ${AXIS_INFO[axis.quantity].label.toLowerCase()}`,
        svg: (px) => renderChartSvg(residualOption(data, xTitle, px), px, halfPx(HALF_CHART_HEIGHT_PT)),
        caption: describeResiduals(data),
      };
    }),
  ];
  halfCharts(w, small);
}

function fit(w: PdfWriter, review: PlanReview): void {
  const result = review.fit;
  if (!result) return;
  const info = FIT_MODEL_INFO[result.model];
  w.heading('Latest fit', 3);
  w.fields([
    ['Model', `${info.label}: ${info.explains}`],
    ['Estimate', formatFitValue(result.value, result.uncertainty, result.model)],
    ['Reduced χ²', result.reducedChiSquare === null ? '— (one pose)' : result.reducedChiSquare.toPrecision(3)],
    ['Poses used', result.posesUsed.toLocaleString('en')],
    ['RMS relative error after the fit', formatPercentValue(result.rmsRelativeAfter)],
    ['Fitted', `by ${result.createdBy.name}, ${formatWhen(result.createdAt)}, solver ${result.solverVersion}`],
  ]);
  w.paragraph('A fit estimates one effective parameter that would explain the differences; it does not change the plan\u2019s prediction.', {
    size: 8, color: COLOUR.muted,
  });
}

const POSE_COLUMNS: TableColumn[] = [
  { title: 'Pose', share: 0.27 },
  { title: 'Points', share: 0.1 },
  { title: 'Predicted', share: 0.13, align: 'right' },
  { title: 'Measured ± u (n)', share: 0.22, align: 'right' },
  { title: 'Relative error', share: 0.12, align: 'right' },
  { title: 'Flags', share: 0.16 },
];

function poseRow(review: PlanReview, pose: ReviewPose, marked: ReadonlySet<number>): string[] {
  const { quantity } = review;
  const flags: string[] = [];
  if (pose.autoOutlier) flags.push(`beyond ${OUTLIER_SIGMA} u`);
  if (pose.pointIds.some((id) => marked.has(id))) flags.push('set aside');
  if (!pose.measured) flags.push('not measured');
  return [
    describePose(pose.pose, review.plan.axes),
    pose.seqs.map((s) => `#${s}`).join(', '),
    formatReviewValue(pose.predicted, quantity),
    pose.measured ? `${formatReviewMeasured(pose.measured.mean, pose.measured.uncertainty, quantity)} (${pose.measured.n})` : '',
    pose.relative === null ? '' : formatSignedPercent(pose.relative),
    flags.join(', '),
  ];
}

export function quantitySection(w: PdfWriter, review: PlanReview): void {
  const info = REVIEW_QUANTITY_LABELS[review.quantity];
  w.doc.addPage();
  w.heading(`${info.label} ${info.symbol}`, 2);
  w.fields(summaryFigures(review.summary));
  fit(w, review);
  charts(w, review);
  w.heading('Poses', 3);
  w.paragraph(
    `Each distinct pose once, with the mean of its current readings that are not set aside (repeats, reference revisits and methods together). ` +
      `Relative error is (measured − predicted) / predicted.`,
    { size: 8, color: COLOUR.muted },
  );
  const marked = new Set(review.marks.map((m) => m.pointId));
  w.table(POSE_COLUMNS, review.poses.map((pose) => poseRow(review, pose, marked)));
}
