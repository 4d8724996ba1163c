'use client';

import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { SelectField } from '@/components/ui/select';
import { formatDateTime } from '@/components/ui/format-date';
import { fetchJson } from '@/lib/client/fetch-json';
import { FIT_MODEL_INFO, type FitModel, type FitResult, type PlanReview } from '@/lib/review/types';
import { modelsFor } from './fit-models';
import { failureMessage } from './failure';
import { formatFitValue, formatPercentValue } from './format-review';

function FitFigures({ fit, rmsBefore }: { fit: FitResult; rmsBefore: number | null }) {
  const info = FIT_MODEL_INFO[fit.model];
  return (
    <div className="space-y-2" aria-label="Latest fit" role="group">
      <dl className="grid gap-x-6 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="text-ink-600">{info.label}</dt>
        <dd className="font-semibold tabular-nums text-ink-900">{formatFitValue(fit.value, fit.uncertainty, fit.model)}</dd>
        <dt className="text-ink-600">Reduced chi-square</dt>
        <dd className="tabular-nums text-ink-900">{fit.reducedChiSquare === null ? '— (as many poses as parameters)' : fit.reducedChiSquare.toFixed(2)}</dd>
        <dt className="text-ink-600">Poses used</dt>
        <dd className="tabular-nums text-ink-900">{fit.posesUsed.toLocaleString('en')}</dd>
        <dt className="text-ink-600">RMS relative error</dt>
        <dd className="tabular-nums text-ink-900">
          {formatPercentValue(rmsBefore)} with the prediction → {formatPercentValue(fit.rmsRelativeAfter)} with the fit
        </dd>
      </dl>
      <p className="text-xs text-ink-500">
        Fitted by {fit.createdBy.name}, {formatDateTime(fit.createdAt)} (solver {fit.solverVersion}). The uncertainty is scaled up by the square root of the reduced chi-square when
        that is above 1.
      </p>
    </div>
  );
}

/**
 * An effective parameter fitted to the measured means, to say what a disagreement would take to
 * explain. The plan's prediction stays as it is; the fit only draws the dashed curve.
 */
export function FitPanel({ review, base, canFit, onFitted }: { review: PlanReview; base: string; canFit: boolean; onFitted: () => void }) {
  const models = modelsFor(review.quantity);
  const [chosen, setChosen] = useState<FitModel | null>(null);
  const model = chosen && models.includes(chosen) ? chosen : models[0];
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  const run = async () => {
    if (!model) return;
    setBusy(true);
    setError(null);
    try {
      await fetchJson<FitResult>(`${base}/fits`, { method: 'POST', body: { model, quantity: review.quantity } });
      onFitted();
    } catch (failure) {
      setError(failureMessage(failure));
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="space-y-4">
      <p className="text-sm text-ink-700">
        The plan’s prediction is unchanged by a fit: the fitted value is shown here and only as the dashed curve in the first chart, never in place of the prediction.
      </p>
      {canFit && models.length > 0 && model && (
        <div className="space-y-3">
          <SelectField
            label="Effective parameter"
            value={model}
            onChange={(e) => setChosen(e.target.value as FitModel)}
            options={models.map((m) => ({ value: m, label: `${FIT_MODEL_INFO[m].label} [${FIT_MODEL_INFO[m].unit}]` }))}
            hint={`Fits ${FIT_MODEL_INFO[model].explains}.`}
            className="max-w-md"
          />
          <Button variant="primary" onClick={run} disabled={busy}>
            {busy ? 'Fitting… this can take a few seconds' : 'Run the fit'}
          </Button>
        </div>
      )}
      {canFit && models.length === 0 && <p className="text-sm text-ink-600">No effective parameter is offered for this quantity.</p>}
      {error && <Alert tone="error">{error}</Alert>}
      {review.fit ? <FitFigures fit={review.fit} rmsBefore={review.summary.rmsRelative} /> : <p className="text-sm text-ink-600">No fit of this quantity yet.</p>}
    </div>
  );
}
