import type { AxisSpec, PlanPoint } from '@/components/plans/plan-types';
import { runSheetRows } from '@/components/plans/run-sheet-rows';

const axes: AxisSpec[] = [{ quantity: 'distance', displayUnit: 'mm', mode: 'list', values: [0.05, 0.1] }];
const points: PlanPoint[] = [
  { id: 12, seq: 2, repeatIndex: 1, isReference: true, pose: { distance: 0.05, lateralOffset: 0, tiltDeg: 0 }, predicted: null, solverVersion: null },
  { id: 11, seq: 1, repeatIndex: 1, isReference: false, pose: { distance: 0.1, lateralOffset: 0, tiltDeg: 0 }, predicted: null, solverVersion: null },
];

describe('run sheet rows', () => {
  test('measurement order, poses in the display unit, reference flagged and findable by text', () => {
    const rows = runSheetRows(points, axes);
    expect(rows.map((r) => r.seq)).toEqual([1, 2]);
    expect(rows[0].pose.distance).toBe(100);
    expect(rows[1].reference).toBe('reference');
    expect(rows[1].text).toContain('reference');
    expect(rows[0].predicted.coupling).toBeNull();
  });
});
