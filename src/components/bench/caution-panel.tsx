import { formatFrequency } from '@/lib/units/format';
import { CAPACITOR_VOLTAGE_CAUTION_V, type CautionId } from './cautions';
import { formatEngineering, formatScientific } from './format-quantity';
import type { ExposureLevel } from './solver-jobs';

interface CautionPanelProps {
  raised: CautionId[];
  txCapacitorVoltage: number | null;
  rxCapacitorVoltage: number | null;
  limiting: ExposureLevel | null;
  frequencyHz: number;
}

/**
 * The bench's cautions (PRODUCT.md): always the standing one, plus what this placement raises. The
 * wording leaves every decision to the institution's rules, local codes and qualified, licensed staff.
 */
export function CautionPanel({ raised, txCapacitorVoltage, rxCapacitorVoltage, limiting, frequencyHz }: CautionPanelProps) {
  const vMax = Math.max(txCapacitorVoltage ?? 0, rxCapacitorVoltage ?? 0);
  const which = (txCapacitorVoltage ?? 0) >= (rxCapacitorVoltage ?? 0) ? 'transmitter' : 'receiver';
  return (
    <section aria-labelledby="bench-cautions" className="rounded-lg border border-caution-500/40 bg-caution-50 px-5 py-4 text-sm text-caution-900">
      <h2 id="bench-cautions" className="mb-2 text-base font-semibold">Cautions</h2>
      {raised.length > 0 && (
        <ul className="mb-3 space-y-2" data-testid="raised-cautions">
          {raised.includes('capacitor-voltage') && (
            <li className="rounded-md border border-caution-500/50 bg-white/70 px-3 py-2" data-caution="capacitor-voltage">
              <strong>High voltage on a resonant capacitor:</strong> about {formatEngineering(vMax, 'V', 3)} rms on the {which} capacitor at
              this placement and drive, above {CAPACITOR_VOLTAGE_CAUTION_V} V. The tank also stores energy after the source is off.
              Plan rated parts, insulation, guarding and discharge as your institution&apos;s rules require.
            </li>
          )}
          {raised.includes('field-ratio') && limiting && (
            <li className="rounded-md border border-danger-500/40 bg-white/70 px-3 py-2 text-danger-700" data-caution="field-ratio">
              <strong>Field at the operator point:</strong> {formatScientific(limiting.ratio, 3)} times the reference level of {limiting.source}{' '}
              ({limiting.version}). Change the operator position, the drive or the arrangement, and have the exposure assessed by
              qualified staff.
            </li>
          )}
          {raised.includes('field-unassessed') && (
            <li className="rounded-md border border-caution-500/50 bg-white/70 px-3 py-2" data-caution="field-unassessed">
              <strong>Field not assessed:</strong> no reference level in the table covers {formatFrequency(frequencyHz)}.
            </li>
          )}
        </ul>
      )}
      <p className="leading-6">
        Resonant capacitors can carry hundreds of volts and hold their charge after the source is switched off. Rings, coins, tools
        and other stray metal heat up in the field, and the field can affect implanted medical devices such as pacemakers. These
        figures are predictions for planning, not an approval of the setup: follow your institution&apos;s safety rules and local codes,
        and have qualified, licensed staff approve the bench before it is powered.
      </p>
    </section>
  );
}
