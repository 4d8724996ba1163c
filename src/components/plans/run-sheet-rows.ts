import { axisTitle, toDisplayNumber } from './axis-units';
import type { AxisQuantity, AxisSpec, PlanPoint } from './plan-types';
import { formatPredicted, type PredictedKey } from './predicted-quantities';

/** Predicted columns of the run sheet and the printed sheet, in reading order. */
export const SHEET_PREDICTED: readonly PredictedKey[] = ['mutualInductance', 'coupling', 'efficiency', 'loadPower', 'fieldRatio'];

/** One line of the run sheet: the planned pose in the axes' display units, predictions in SI. */
export interface RunSheetRow {
  id: number;
  seq: number;
  /** 1 to the plan's repeats, as the API and the CSV count them */
  repeat: number;
  reference: 'reference' | '';
  pose: Partial<Record<AxisQuantity, number>>;
  predicted: Partial<Record<PredictedKey, number | null>>;
  /** everything the row shows, lower-case, for the text filter */
  text: string;
}

export const poseColumnTitle = (axis: AxisSpec) => axisTitle(axis.quantity, axis.displayUnit);

/** The points in measurement order as run sheet rows. */
export function runSheetRows(points: readonly PlanPoint[], axes: readonly AxisSpec[]): RunSheetRow[] {
  return [...points]
    .sort((a, b) => a.seq - b.seq)
    .map((point) => {
      const pose: RunSheetRow['pose'] = {};
      for (const axis of axes) {
        const si = point.pose[axis.quantity];
        if (si !== undefined) pose[axis.quantity] = toDisplayNumber(si, axis.quantity, axis.displayUnit);
      }
      const predicted: RunSheetRow['predicted'] = {};
      for (const key of SHEET_PREDICTED) predicted[key] = point.predicted ? point.predicted[key] : null;
      const reference = point.isReference ? 'reference' : '';
      const text = [point.seq, point.repeatIndex, reference, ...Object.values(pose), ...SHEET_PREDICTED.map((k) => formatPredicted(predicted[k], k))]
        .join(' ')
        .toLowerCase();
      return { id: point.id, seq: point.seq, repeat: point.repeatIndex, reference, pose, predicted, text };
    });
}
