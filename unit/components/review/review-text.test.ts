import { describeAxisChart, describeParity, describeResiduals, heldText } from '@/components/review/chart-text';
import { newestFirst, standingReturn, summaryLine } from '@/components/review/decisions';
import type { AxisChartData, ParityData, ResidualData } from '@/components/review/review-chart-data';
import type { AgreementSummary, PlanDecision } from '@/lib/review/types';

/** The sentences under the charts and the decision history's lines, from hand-made data. */

const MINUS = '\u2212';

describe('chart summaries', () => {
  const parityPoint = (relative: number) => ({ predicted: 1, measured: 1 + relative, uncertainty: 0.01, relative, seq: 1, method: 'split_peaks' as const });

  test('the parity summary counts readings inside each band, leaving set-aside ones out', () => {
    const data: ParityData = {
      points: { ordinary: [parityPoint(0.01), parityPoint(-0.07)], autoOutlier: [parityPoint(0.2)], setAside: [parityPoint(0.001)] },
      range: [0, 2],
      step: 0.5,
      bands: [],
    };
    expect(describeParity(data)).toBe('4 readings with a prediction. Of the 3 not set aside, 1 within ±5 % and 2 within ±10 %; 1 reading flagged beyond 3 u, 1 reading set aside.');
  });

  test('the residual summary counts readings beyond the tolerance', () => {
    const point = (percent: number) => ({ x: 1, percent, seq: 1, method: 'split_peaks' as const });
    const data: ResidualData = { points: { ordinary: [point(1), point(-6)], autoOutlier: [point(12)], setAside: [point(50)] }, xRange: [0, 2], tolerancePercent: 5 };
    expect(describeResiduals(data)).toBe('3 readings not set aside; 2 outside the tolerance of ±5.00 %.');
  });

  test('the axis chart summary names held axes and the fit', () => {
    const data: AxisChartData = {
      series: [{ name: '', predicted: [[1, 1], [2, 2]], measured: [{ x: 1, mean: 1, uncertainty: 0.1, n: 2, seqs: [1] }], refit: [[1, 1.1]] }],
      held: [{ quantity: 'tiltDeg', value: 30, unit: 'deg' }],
    };
    expect(heldText(data)).toBe('Tilt held at 30 deg.');
    expect(describeAxisChart(data)).toBe('1 measured pose (mean with ±1 u bars) against 2 predicted poses in 1 series. The dashed line is the latest fit, not the prediction. Tilt held at 30 deg.');
  });

  test('nothing to compare says so', () => {
    const empty = { ordinary: [], autoOutlier: [], setAside: [] };
    expect(describeParity({ points: empty, range: null, step: 1, bands: [] })).toBe('No reading with a prediction to compare.');
    expect(describeResiduals({ points: empty, xRange: null, tolerancePercent: 5 })).toBe('No reading with a prediction to compare.');
  });
});

describe('decision history', () => {
  const summary: AgreementSummary = {
    compared: 4, observations: 6, rmsRelative: 0.0321, maxRelative: -0.05, bias: 0.01, tolerance: 0.05, outsideTolerance: 1, autoOutliers: 0, setAside: 2,
  };
  const decision = (id: number, decision: PlanDecision['decision'], createdAt: string): PlanDecision => ({
    id, decision, reason: '', reviewer: { id: 4, name: 'Maren Solberg' }, createdAt, summary,
  });

  test('the summary a decision was made on, in one line', () => {
    expect(summaryLine(summary)).toBe(`4 poses compared · RMS 3.21 % · largest ${MINUS}5.00 % · bias +1.00 % · 1 outside ±5.00 % · 2 set aside`);
  });

  test('newest first, ties broken by id', () => {
    const list = [decision(1, 'returned', '2026-03-01T10:00:00.000Z'), decision(3, 'accepted', '2026-03-02T10:00:00.000Z'), decision(2, 'returned', '2026-03-02T10:00:00.000Z')];
    expect(newestFirst(list).map((d) => d.id)).toEqual([3, 2, 1]);
  });

  test('a return stands while the plan is on the bench and nothing was decided since', () => {
    const returned = decision(1, 'returned', '2026-03-01T10:00:00.000Z');
    expect(standingReturn('on_bench', [returned])?.id).toBe(1);
    expect(standingReturn('in_review', [returned])).toBeNull();
    expect(standingReturn('accepted', [returned, decision(2, 'accepted', '2026-03-03T10:00:00.000Z')])).toBeNull();
    expect(standingReturn('on_bench', [])).toBeNull();
  });
});
