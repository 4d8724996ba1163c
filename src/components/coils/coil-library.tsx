'use client';

import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { useStudyCoils } from '@/hooks/use-study-coils';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { Coil } from '@/lib/data/coils';
import { formatFrequency } from '@/lib/units/format';
import { CoilForm } from './coil-form';
import { CoilTable } from './coil-table';

type Notice = { tone: 'error' | 'success'; text: string };
/** What the form above the table is doing: nothing, adding a coil, or editing one. */
type Editing = { mode: 'closed' } | { mode: 'new' } | { mode: 'edit'; coil: Coil };

interface CoilLibraryProps {
  studyId: number;
  /** The study's operating frequency [Hz], at which predictions are made; null when not set. */
  frequencyHz: number | null;
  canEdit: boolean;
  initialCoils: Coil[];
}

/** The coil library: the table for everyone on the study, the form and delete for those who may edit. */
export function CoilLibrary({ studyId, frequencyHz, canEdit, initialCoils }: CoilLibraryProps) {
  const { coils, error, isLoading, mutate } = useStudyCoils(studyId, initialCoils);
  const [editing, setEditing] = useState<Editing>({ mode: 'closed' });
  const [notice, setNotice] = useState<Notice | null>(null);
  const [pendingDelete, setPendingDelete] = useState<Coil | null>(null);
  const [deleting, setDeleting] = useState(false);

  async function saved(coil: Coil) {
    setNotice({ tone: 'success', text: `${editing.mode === 'edit' ? 'Saved' : 'Added'} “${coil.name}”.` });
    setEditing({ mode: 'closed' });
    await mutate();
  }

  async function remove(coil: Coil) {
    setDeleting(true);
    setNotice(null);
    try {
      await fetchJson(`/api/studies/${studyId}/coils/${coil.id}`, { method: 'DELETE' });
      await mutate();
      setNotice({ tone: 'success', text: `Deleted “${coil.name}”.` });
    } catch (failure) {
      // A 409 already names the coil and what uses it; anything else gets the coil's name in front.
      const text =
        failure instanceof ApiError
          ? failure.status === 409
            ? failure.message
            : `“${coil.name}” was not deleted. ${failure.message}`
          : `“${coil.name}” was not deleted. Couplet could not be reached. Try again.`;
      setNotice({ tone: 'error', text });
    } finally {
      setDeleting(false);
      setPendingDelete(null);
    }
  }

  const description =
    frequencyHz === null
      ? 'Predicted values appear once the study has an operating frequency.'
      : `Predicted L, Rdc and Rac at ${formatFrequency(frequencyHz)}, the study's operating frequency. Rac counts skin effect, not the proximity of neighbouring turns.`;

  return (
    <div className="space-y-6">
      {editing.mode !== 'closed' && (
        <CoilForm
          key={editing.mode === 'edit' ? editing.coil.id : 'new'}
          studyId={studyId}
          coil={editing.mode === 'edit' ? editing.coil : undefined}
          onSaved={(coil) => void saved(coil)}
          onCancel={() => setEditing({ mode: 'closed' })}
        />
      )}
      <Panel
        title="Coil library"
        description={description}
        flush
        actions={
          canEdit && editing.mode === 'closed' ? (
            <Button variant="primary" onClick={() => { setNotice(null); setEditing({ mode: 'new' }); }}>
              New coil
            </Button>
          ) : null
        }
      >
        {notice && (
          <div className="px-5 py-4">
            <Alert tone={notice.tone}>{notice.text}</Alert>
          </div>
        )}
        {isLoading && <Skeleton label="Loading coils…" className="px-5 py-5" />}
        {error && (
          <div className="px-5 py-4">
            <Alert tone="error">The coils could not be loaded. {error.message}</Alert>
          </div>
        )}
        {coils && coils.length === 0 && (
          <div className="px-5 py-10 text-center">
            <p className="text-sm font-medium text-ink-800">No coils yet.</p>
            <p className="mt-1 text-sm text-ink-500">{canEdit ? 'Add the first with “New coil”.' : 'A researcher on the study adds them.'}</p>
          </div>
        )}
        {coils && coils.length > 0 && (
          <CoilTable
            coils={coils}
            canEdit={canEdit}
            pendingDeleteId={pendingDelete?.id ?? null}
            busy={deleting}
            onEdit={(coil) => { setNotice(null); setEditing({ mode: 'edit', coil }); window.scrollTo({ top: 0, behavior: 'smooth' }); }}
            onAskDelete={setPendingDelete}
            onDelete={(coil) => void remove(coil)}
          />
        )}
      </Panel>
    </div>
  );
}
