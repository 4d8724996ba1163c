'use client';

import { useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { TextAreaField } from '@/components/ui/field';
import { formatDateTime } from '@/components/ui/format-date';
import { fetchJson } from '@/lib/client/fetch-json';
import type { PlanDecision } from '@/lib/review/types';
import { newestFirst, summaryLine } from './decisions';
import { failureMessage } from './failure';

/** Longest reason for returning a plan (the transition API's limit). */
const RETURN_REASON_MAX = 2000;

/** Every decision on the plan, newest first, each with the coupling summary it was made on. */
export function DecisionHistory({ decisions }: { decisions: readonly PlanDecision[] }) {
  if (decisions.length === 0) return <p className="text-sm text-ink-600">No decision yet.</p>;
  return (
    <ol aria-label="Decisions, newest first" className="space-y-3">
      {newestFirst(decisions).map((d) => (
        <li key={d.id} className="rounded-md border border-ink-100 px-4 py-3" data-decision={d.decision}>
          <p className="flex flex-wrap items-center gap-2 text-sm">
            <Badge tone={d.decision === 'accepted' ? 'dark' : 'copper'}>{d.decision === 'accepted' ? 'Accepted' : 'Returned to the bench'}</Badge>
            <span className="text-ink-800">
              by <span className="font-semibold">{d.reviewer.name}</span>, <time dateTime={d.createdAt}>{formatDateTime(d.createdAt)}</time>
            </span>
          </p>
          {d.reason && <p className="mt-1 whitespace-pre-wrap text-sm text-ink-800">“{d.reason}”</p>}
          <p className="mt-1 text-xs text-ink-600">k at the time: {d.summary ? summaryLine(d.summary) : 'nothing compared'}</p>
        </li>
      ))}
    </ol>
  );
}

type Step = 'idle' | 'accepting' | 'returning';

/** Accept (with a confirm step) or return to the bench (with a reason): the supervisor's decision. */
export function DecisionForm({ base, planName, onDecided }: { base: string; planName: string; onDecided: () => void }) {
  const [step, setStep] = useState<Step>('idle');
  const [reason, setReason] = useState('');
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [reasonError, setReasonError] = useState<string | null>(null);

  const decide = async (body: { to: 'accepted' } | { to: 'on_bench'; reason: string }) => {
    setBusy(true);
    setError(null);
    try {
      await fetchJson(`${base}/transition`, { method: 'POST', body });
      setStep('idle');
      setReason('');
      onDecided();
    } catch (failure) {
      setError(failureMessage(failure));
    } finally {
      setBusy(false);
    }
  };

  const submitReturn = (event: FormEvent) => {
    event.preventDefault();
    const text = reason.trim();
    if (text.length === 0) {
      setReasonError('Say what the student should change before the plan comes back.');
      return;
    }
    setReasonError(null);
    void decide({ to: 'on_bench', reason: text });
  };

  return (
    <div className="space-y-3">
      {step === 'idle' && (
        <div className="flex flex-wrap gap-2">
          <Button variant="primary" onClick={() => setStep('accepting')}>
            Accept
          </Button>
          <Button onClick={() => setStep('returning')}>Return to the bench</Button>
        </div>
      )}
      {step === 'accepting' && (
        <div role="alertdialog" aria-labelledby="accept-title" aria-describedby="accept-text" className="rounded-md border border-copper-200 bg-copper-50 p-4">
          <p id="accept-title" className="font-semibold text-ink-900">Accept “{planName}”?</p>
          <p id="accept-text" className="mt-1 text-sm text-ink-700">
            The plan is closed: no more readings, marks or decisions. The agreement as it stands now is stored with your decision.
          </p>
          <div className="mt-3 flex gap-2">
            <Button variant="primary" disabled={busy} onClick={() => decide({ to: 'accepted' })}>
              {busy ? 'Working…' : 'Yes, accept'}
            </Button>
            <Button disabled={busy} onClick={() => setStep('idle')}>
              Not now
            </Button>
          </div>
        </div>
      )}
      {step === 'returning' && (
        <form onSubmit={submitReturn} aria-label="Return to the bench" className="space-y-3 rounded-md border border-ink-200 bg-ink-50 p-4">
          <TextAreaField
            label="What needs another look"
            hint="It goes out by e-mail with a link to this page, and stays in the decision history."
            value={reason}
            maxLength={RETURN_REASON_MAX}
            onChange={(e) => setReason(e.target.value)}
            error={reasonError ?? undefined}
            rows={3}
          />
          <div className="flex gap-2">
            <Button type="submit" variant="primary" disabled={busy}>
              {busy ? 'Working…' : 'Return to the bench'}
            </Button>
            <Button disabled={busy} onClick={() => setStep('idle')}>
              Cancel
            </Button>
          </div>
        </form>
      )}
      {error && <Alert tone="error">{error}</Alert>}
    </div>
  );
}
