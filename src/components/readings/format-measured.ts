import { formatEngineering, formatPercent, NO_VALUE } from '@/components/bench/format-quantity';
import type { RawFieldKind } from '@/physics/measurement/methods';
import type { MeasuredValue } from '@/physics/measurement/types';

export type MeasuredQuantity = 'mutualInductance' | 'coupling' | 'efficiency';

export const MEASURED_LABEL: Record<MeasuredQuantity, string> = {
  mutualInductance: 'M',
  coupling: 'k',
  efficiency: 'Efficiency',
};

/** Significant digits of an uncertainty: two, as the GUM suggests for a reported standard uncertainty. */
const UNCERTAINTY_DIGITS = 2;

/** A value of one quantity without its uncertainty: "1.234 µH", "0.05000", "72.10 %". */
export function formatQuantityValue(value: number | null | undefined, quantity: MeasuredQuantity): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return NO_VALUE;
  if (quantity === 'mutualInductance') return formatEngineering(value, 'H');
  if (quantity === 'efficiency') return formatPercent(value);
  // four significant digits, trailing zeros kept, as M and the efficiency are written
  return value.toPrecision(4);
}

function formatUncertainty(uncertainty: number, quantity: MeasuredQuantity): string {
  if (quantity === 'mutualInductance') return formatEngineering(uncertainty, 'H', UNCERTAINTY_DIGITS);
  if (quantity === 'efficiency') return formatPercent(uncertainty, UNCERTAINTY_DIGITS);
  return Number(uncertainty.toPrecision(UNCERTAINTY_DIGITS)).toString();
}

/** "1.234 µH ± 12 nH": the value and its standard uncertainty (k = 1). */
export function formatMeasured(measured: MeasuredValue | null, quantity: MeasuredQuantity): string {
  if (!measured) return NO_VALUE;
  return `${formatQuantityValue(measured.value, quantity)} ± ${formatUncertainty(measured.uncertainty, quantity)}`;
}

const RAW_UNIT: Record<RawFieldKind, string> = {
  frequency: 'Hz',
  voltage: 'V',
  current: 'A',
  inductance: 'H',
  resistance: '\u03a9',
  angle: '\u00b0',
  power: 'W',
};

/** A raw input as an instrument shows it: "6.780 MHz", "250.0 mA", "89.2°". */
export function formatRaw(value: number, kind: RawFieldKind): string {
  if (kind === 'angle') return `${Number(value.toPrecision(4))}\u00b0`;
  return formatEngineering(value, RAW_UNIT[kind]);
}

/** Relative difference of measured from predicted, "+3.2 %"; null when either is missing or predicted is 0. */
export function formatDeviation(measured: number | null | undefined, predicted: number | null | undefined): string | null {
  if (measured === null || measured === undefined || predicted === null || predicted === undefined || predicted === 0) return null;
  const pct = ((measured - predicted) / Math.abs(predicted)) * 100;
  const magnitude = Math.abs(pct);
  // two significant digits, but whole numbers once the difference is 100 % or more ("+2,900 %", not "+2.9e+3 %")
  const text = magnitude >= 100 ? Math.round(magnitude).toLocaleString('en') : magnitude.toPrecision(2);
  return `${pct >= 0 ? '+' : '\u2212'}${text} %`;
}
