'use client';

import { useState, type FormEvent, type ReactNode } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { controlClasses } from '@/components/ui/field';
import { fetchJson } from '@/lib/client/fetch-json';
import type { AgreementSummary } from '@/lib/review/types';
import { failureMessage } from './failure';
import { formatPercentValue, formatSignedPercent, parseTolerancePercent, PERCENT_DECIMALS } from './format-review';

function Figure({ label, value, hint, testId }: { label: string; value: ReactNode; hint?: string; testId?: string }) {
  return (
    <div className="rounded-md border border-ink-100 bg-ink-50 px-3 py-2" data-testid={testId}>
      <dt className="text-xs font-medium uppercase tracking-wide text-ink-500">{label}</dt>
      <dd className="mt-0.5 text-lg font-semibold tabular-nums text-ink-900">{value}</dd>
      {hint && <dd className="text-xs text-ink-500">{hint}</dd>}
    </div>
  );
}

function ToleranceForm({ base, tolerance, onSaved }: { base: string; tolerance: number; onSaved: () => void }) {
  const [text, setText] = useState((tolerance * 100).toFixed(PERCENT_DECIMALS));
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const submit = async (event: FormEvent) => {
    event.preventDefault();
    const fraction = parseTolerancePercent(text);
    if (fraction === null) {
      setError('Enter a tolerance from 0.1 to 100 %.');
      return;
    }
    setBusy(true);
    setError(null);
    try {
      await fetchJson(`${base}/tolerance`, { method: 'PUT', body: { tolerance: fraction } });
      onSaved();
    } catch (failure) {
      setError(failureMessage(failure));
    } finally {
      setBusy(false);
    }
  };
  return (
    <form onSubmit={submit} aria-label="Review tolerance" className="flex flex-wrap items-end gap-2">
      <label className="w-32 text-sm font-medium text-ink-800">
        <span className="block">Tolerance ± (%)</span>
        <input
          value={text}
          onChange={(e) => setText(e.target.value)}
          inputMode="decimal"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? 'tolerance-error' : undefined}
          className={`${controlClasses(Boolean(error))} mt-1 h-8`}
        />
      </label>
      <Button type="submit" size="sm" disabled={busy}>
        {busy ? 'Saving…' : 'Set tolerance'}
      </Button>
      {error && (
        <p id="tolerance-error" role="alert" className="w-full text-xs font-medium text-danger-700">
          {error}
        </p>
      )}
    </form>
  );
}

/** The agreement in figures, each pose counted once; reviewers can change the tolerance here. */
export function SummaryFigures({ summary, symbol, base, canSetTolerance, onChanged }: {
  summary: AgreementSummary;
  symbol: string;
  base: string;
  canSetTolerance: boolean;
  onChanged: () => void;
}) {
  const tolerance = formatPercentValue(summary.tolerance);
  return (
    <div className="space-y-4">
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <Figure label="Compared poses" value={summary.compared.toLocaleString('en')} hint={`${summary.observations.toLocaleString('en')} readings behind them`} />
        <Figure label={`RMS relative error of ${symbol}`} value={formatPercentValue(summary.rmsRelative)} testId="figure-rms" />
        <Figure label="Largest relative error" value={formatSignedPercent(summary.maxRelative)} hint="signed, measured against predicted" />
        <Figure label="Bias" value={formatSignedPercent(summary.bias)} hint="mean relative error" />
        <Figure label={`Outside ±${tolerance}`} value={summary.outsideTolerance.toLocaleString('en')} hint="compared poses" />
        <Figure label="Flagged automatically" value={summary.autoOutliers.toLocaleString('en')} hint="readings beyond 3 u" />
        <Figure label="Set aside" value={summary.setAside.toLocaleString('en')} hint="points, by a reviewer" />
      </dl>
      {canSetTolerance && <ToleranceForm key={summary.tolerance} base={base} tolerance={summary.tolerance} onSaved={onChanged} />}
      {summary.compared === 0 && <Alert tone="info">No pose has both a measured mean and a prediction yet, so there is nothing to compare.</Alert>}
    </div>
  );
}
