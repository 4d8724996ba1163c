/**
 * When the bench raises a caution beyond the standing one. The thresholds are prompts to stop and
 * check, not limits: meeting them does not make a setup acceptable (PRODUCT.md, "Cautions").
 */

/**
 * Capacitor voltage [V rms] above which the bench calls out resonant-capacitor voltage. 50 V ac is the
 * upper end of extra-low voltage in IEC 61140 / IEC 60449 (common practice; value recalled, not re-read).
 */
export const CAPACITOR_VOLTAGE_CAUTION_V = 50;
/** Field at the operator point at or above the reference level (ratio 1). */
export const FIELD_RATIO_CAUTION = 1;

export type CautionId = 'capacitor-voltage' | 'field-ratio' | 'field-unassessed';

export interface BenchCautionInput {
  /** [V rms], null while unknown */
  txCapacitorVoltage: number | null;
  rxCapacitorVoltage: number | null;
  /** field / limiting reference level at the operator point; null while unknown */
  operatorRatio: number | null;
  /** the operator point was assessed but no row of the table covers the frequency */
  noApplicableLevel: boolean;
}

export function raisedCautions(input: BenchCautionInput): CautionId[] {
  const out: CautionId[] = [];
  const vMax = Math.max(input.txCapacitorVoltage ?? 0, input.rxCapacitorVoltage ?? 0);
  if (vMax > CAPACITOR_VOLTAGE_CAUTION_V) out.push('capacitor-voltage');
  if (input.operatorRatio !== null && input.operatorRatio >= FIELD_RATIO_CAUTION) out.push('field-ratio');
  if (input.noApplicableLevel) out.push('field-unassessed');
  return out;
}
