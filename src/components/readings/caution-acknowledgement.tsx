'use client';

import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import { BENCH_CAUTIONS, BENCH_CAUTIONS_DEFERRAL, BENCH_CAUTIONS_VERSION } from '@/lib/readings/bench-cautions';
import type { CautionAcknowledgement as Acknowledgement } from './reading-types';

interface CautionAcknowledgementProps {
  studyId: number;
  planId: number;
  onAcknowledged: (acknowledgement: Acknowledgement) => void;
}

/**
 * The bench cautions, read and acknowledged once per plan before the first reading. The box must be
 * ticked; the server stores who acknowledged which wording and when.
 */
export function CautionAcknowledgement({ studyId, planId, onAcknowledged }: CautionAcknowledgementProps) {
  const [checked, setChecked] = useState(false);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);

  const submit = async () => {
    setBusy(true);
    setError(null);
    try {
      const { acknowledgement } = await fetchJson<{ acknowledgement: Acknowledgement }>(`/api/studies/${studyId}/plans/${planId}/cautions`, {
        method: 'POST',
        body: { version: BENCH_CAUTIONS_VERSION, acknowledged: true },
      });
      onAcknowledged(acknowledgement);
    } catch (failure) {
      setError(failure instanceof ApiError ? failure.message : 'Couplet could not be reached. Check your connection and try again.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <section aria-labelledby="bench-caution-title" className="rounded-lg border border-caution-500/40 bg-caution-50 px-5 py-4 text-sm text-caution-900">
      <h2 id="bench-caution-title" className="text-base font-semibold">
        Before the first reading on this plan
      </h2>
      <ul className="mt-3 space-y-2">
        {BENCH_CAUTIONS.map((caution) => (
          <li key={caution.id} className="rounded-md border border-caution-500/30 bg-white/70 px-3 py-2 leading-6">
            <strong>{caution.title}.</strong> {caution.text}
          </li>
        ))}
      </ul>
      <p className="mt-3 leading-6">{BENCH_CAUTIONS_DEFERRAL}</p>
      <label className="mt-3 flex items-start gap-2 font-medium">
        <input type="checkbox" className="mt-1 size-4 accent-copper-600" checked={checked} onChange={(event) => setChecked(event.target.checked)} />
        I have read these cautions and will follow my institution&apos;s safety rules at the bench.
      </label>
      {error && (
        <Alert tone="error" className="mt-3">
          {error}
        </Alert>
      )}
      <Button variant="primary" className="mt-3" disabled={!checked || busy} onClick={submit}>
        {busy ? 'Saving…' : 'Acknowledge and start logging'}
      </Button>
    </section>
  );
}
