import type { PointPrediction } from '@/components/plans/plan-types';
import { Alert } from '@/components/ui/alert';
import { formatDeviation, formatMeasured, formatQuantityValue, MEASURED_LABEL, type MeasuredQuantity } from './format-measured';
import type { Derivation } from './reading-types';

const QUANTITIES: MeasuredQuantity[] = ['mutualInductance', 'coupling', 'efficiency'];

const SELF_INDUCTANCE_NOTE: Record<Derivation['selfInductanceSource'], string | null> = {
  measured: 'k and M use the self-inductances measured with this reading.',
  predicted: 'k and M convert with the predicted self-inductances.',
  none: null,
};

/** Measured values with standard uncertainties, next to the prediction, and the formula that produced them. */
export function DerivedValues({ derived, predicted }: { derived: Derivation; predicted: PointPrediction | null }) {
  const shown = QUANTITIES.filter((q) => derived[q] !== null);
  return (
    <div className="space-y-2 text-sm">
      <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-[auto_1fr_auto]">
        {shown.map((q) => {
          const deviation = formatDeviation(derived[q]?.value, predicted?.[q]);
          return (
            <div key={q} className="contents" data-quantity={q}>
              <dt className="font-medium text-ink-700">{MEASURED_LABEL[q]}</dt>
              <dd className="font-mono tabular-nums text-ink-900">{formatMeasured(derived[q], q)}</dd>
              <dd className="text-ink-500">
                {predicted ? `predicted ${formatQuantityValue(predicted[q], q)}${deviation ? ` (${deviation})` : ''}` : 'no prediction yet'}
              </dd>
            </div>
          );
        })}
      </dl>
      <p className="text-xs text-ink-500">
        {derived.formula.name} (formula “{derived.formula.id}” v{derived.formula.version}; {derived.formula.source}). Uncertainties are standard
        uncertainties (k = 1). {SELF_INDUCTANCE_NOTE[derived.selfInductanceSource]}
      </p>
      {derived.warnings.length > 0 && (
        <Alert tone="caution">
          <ul className="list-disc space-y-1 pl-4">
            {derived.warnings.map((warning) => (
              <li key={warning}>{warning}</li>
            ))}
          </ul>
        </Alert>
      )}
    </div>
  );
}
