import { formatQuantity } from '@/lib/units/format';
import type { QuantityKind } from '@/lib/units/quantity';
import type { PointPrediction } from './plan-types';

/** Predicted values a chart or the run sheet can show, with how each is written. */
export const PREDICTED_QUANTITIES = [
  { key: 'coupling', label: 'Coupling k', unit: '', kind: null },
  { key: 'mutualInductance', label: 'Mutual inductance M', unit: 'H', kind: 'inductance' },
  { key: 'efficiency', label: 'Link efficiency', unit: '%', kind: null },
  { key: 'loadPower', label: 'Load power', unit: 'W', kind: null },
  { key: 'txSelfInductance', label: 'Tx inductance', unit: 'H', kind: 'inductance' },
  { key: 'rxSelfInductance', label: 'Rx inductance', unit: 'H', kind: 'inductance' },
  { key: 'txResistance', label: 'Tx resistance', unit: 'Ω', kind: 'resistance' },
  { key: 'rxResistance', label: 'Rx resistance', unit: 'Ω', kind: 'resistance' },
  { key: 'fieldRatio', label: 'Field / reference level', unit: '', kind: null },
] as const satisfies readonly { key: keyof PointPrediction; label: string; unit: string; kind: QuantityKind | null }[];

export type PredictedKey = (typeof PREDICTED_QUANTITIES)[number]['key'];

export const predictedInfo = (key: PredictedKey) => PREDICTED_QUANTITIES.find((q) => q.key === key)!;

/** Significant digits of predicted values in tables and tooltips. */
export const PREDICTED_DIGITS = 4;

/** A predicted SI value as people read it: "1.234 µH", "0.1234", "87.5 %", "2.5 W". */
export function formatPredicted(value: number | null | undefined, key: PredictedKey): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  const info = predictedInfo(key);
  if (info.kind) return formatQuantity(value, info.kind, PREDICTED_DIGITS);
  if (key === 'efficiency') return `${Number((value * 100).toPrecision(PREDICTED_DIGITS))} %`;
  if (key === 'loadPower') return `${Number(value.toPrecision(PREDICTED_DIGITS))} W`;
  return String(Number(value.toPrecision(PREDICTED_DIGITS)));
}
