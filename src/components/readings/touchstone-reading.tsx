'use client';

import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { SelectField } from '@/components/ui/select';
import { usePlanAttachments } from '@/hooks/use-plan-attachments';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import { parseQuantity } from '@/lib/units';
import type { Reading } from './reading-types';

interface TouchstoneReadingProps {
  studyId: number;
  planId: number;
  pointId: number;
  /** the instrument and conditions entered in the reading form */
  circumstances: { accuracy: { relative: number; phaseDeg: number }; instrument: string; calibration: string; temperatureC: number | null; setupNotes: string };
  onSaved: (reading: Reading) => void;
}

const TOUCHSTONE_NAME = /\.s2p$/i;

/**
 * A two-port reading from a network analyser's .s2p file attached to this plan (under "Photos and
 * files"): the server parses it and reads the Z-parameters at the point's frequency.
 */
export function TouchstoneReading({ studyId, planId, pointId, circumstances, onSaved }: TouchstoneReadingProps) {
  const { attachments } = usePlanAttachments(studyId, planId);
  const files = (attachments ?? []).filter((a) => a.kind === 'instrument' && TOUCHSTONE_NAME.test(a.fileName));
  const [fileId, setFileId] = useState('');
  const [frequency, setFrequency] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);

  if (files.length === 0) {
    return <p className="text-sm text-ink-600">To read Z from a network analyser, attach its .s2p file below (as an instrument file), then choose it here.</p>;
  }

  const submit = async () => {
    setError(null);
    const parsed = parseQuantity(frequency, 'frequency', { field: 'Frequency in the file' });
    const chosen = fileId || String(files[0].id);
    if (!parsed.ok) {
      setFieldErrors({ frequency: parsed.message });
      return;
    }
    setFieldErrors({});
    setBusy(true);
    try {
      const { reading } = await fetchJson<{ reading: Reading }>(`/api/studies/${studyId}/plans/${planId}/readings/from-touchstone`, {
        method: 'POST',
        body: { pointId, attachmentId: Number(chosen), frequency: parsed.value, ...circumstances },
      });
      onSaved(reading);
    } catch (failure) {
      if (failure instanceof ApiError) {
        setError(failure.issues.map((i) => i.message).join(' ') || failure.message);
      } else {
        setError('Couplet could not be reached. Check your connection and try again.');
      }
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="grid gap-4 sm:grid-cols-[1fr_12rem_auto] sm:items-end">
      <SelectField label="Touchstone file" value={fileId || String(files[0].id)} onChange={(e) => setFileId(e.target.value)} options={files.map((f) => ({ value: String(f.id), label: f.pointSeq ? `${f.fileName} (point ${f.pointSeq})` : f.fileName }))} />
      <TextField label="Frequency in the file" value={frequency} onChange={(e) => setFrequency(e.target.value)} placeholder="the point's" error={fieldErrors.frequency} />
      <Button onClick={submit} disabled={busy}>
        {busy ? 'Reading…' : 'Read Z from the file'}
      </Button>
      {error && (
        <Alert tone="error" className="sm:col-span-3">
          {error}
        </Alert>
      )}
    </div>
  );
}
