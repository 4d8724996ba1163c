'use client';

import Link from 'next/link';
import { useEffect, useState } from 'react';
import { Button } from '@/components/ui/button';
import { cn } from '@/components/ui/cn';
import { TextAreaField, TextField } from '@/components/ui/field';
import { Panel } from '@/components/ui/panel';
import { Skeleton } from '@/components/ui/skeleton';
import { UNREACHABLE_MESSAGE } from '@/components/forms/apply-server-errors';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import { formatDateTime } from '@/components/ui/format-date';
import { setupNameSchema } from '@/lib/validations/setup';
import type { Coil, Setup, SetupInput } from './bench-types';
import { formatInputNumber, metresToCm } from './format-quantity';

interface SetupsPanelProps {
  studyId: number;
  setups: Setup[] | undefined;
  coils: Coil[] | undefined;
  loadError: string | null;
  openSetup: Setup | null;
  canEdit: boolean;
  dirty: boolean;
  /** the body to save for the bench as it is now, with this name and notes; null when no coils are chosen */
  buildInput: (name: string, notes: string) => SetupInput | null;
  onSaved: (setup: Setup) => Promise<void> | void;
  onRevert: () => void;
}

function placementSummary(s: Setup): string {
  const p = s.placement;
  return `${formatInputNumber(metresToCm(p.distance), 2)} cm, offset ${formatInputNumber(metresToCm(p.lateralOffset), 2)} cm, tilt ${formatInputNumber(p.tiltDeg, 1)}°`;
}

/**
 * Saved setups of the study (open one to restore its coils, placement, circuit, operator point and view)
 * and, for roles that may edit, saving the bench as a new setup or over the open one.
 */
export function SetupsPanel({ studyId, setups, coils, loadError, openSetup, canEdit, dirty, buildInput, onSaved, onRevert }: SetupsPanelProps) {
  const [name, setName] = useState(openSetup?.name ?? '');
  const [notes, setNotes] = useState(openSetup?.notes ?? '');
  const [nameError, setNameError] = useState<string | undefined>();
  const [message, setMessage] = useState<{ tone: 'error' | 'ok'; text: string } | null>(null);
  const [saving, setSaving] = useState(false);
  const coilName = (id: number) => coils?.find((c) => c.id === id)?.name ?? `coil ${id}`;

  useEffect(() => {
    setName(openSetup?.name ?? '');
    setNotes(openSetup?.notes ?? '');
    setNameError(undefined);
  }, [openSetup?.id, openSetup?.name, openSetup?.notes]);

  const save = async (mode: 'create' | 'update') => {
    setMessage(null);
    const parsedName = setupNameSchema.safeParse(name);
    if (!parsedName.success) return setNameError(parsedName.error.issues[0]?.message);
    setNameError(undefined);
    const input = buildInput(parsedName.data, notes);
    if (!input) return setMessage({ tone: 'error', text: 'Choose a transmitter and a receiver coil first.' });
    setSaving(true);
    try {
      const url = mode === 'create' ? `/api/studies/${studyId}/setups` : `/api/studies/${studyId}/setups/${openSetup!.id}`;
      const { setup } = await fetchJson<{ setup: Setup }>(url, { method: mode === 'create' ? 'POST' : 'PATCH', body: input });
      await onSaved(setup);
      setMessage({ tone: 'ok', text: mode === 'create' ? `Saved as “${setup.name}”.` : `Saved “${setup.name}”.` });
    } catch (error) {
      if (!(error instanceof ApiError)) return setMessage({ tone: 'error', text: UNREACHABLE_MESSAGE });
      const forName = error.issues.find((i) => i.path === 'name');
      if (forName) setNameError(forName.message);
      const others = error.issues.filter((i) => i.path !== 'name').map((i) => i.message);
      setMessage({ tone: 'error', text: [error.message, ...others].join(' ') });
    } finally {
      setSaving(false);
    }
  };

  return (
    <Panel title="Setups" description="A setup keeps the two coils, the placement, the circuit, the operator point and the camera view.">
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div>
          {loadError ? (
            <p role="alert" className="text-sm text-danger-700">{loadError}</p>
          ) : !setups ? (
            <Skeleton label="Loading setups" rows={2} />
          ) : setups.length === 0 ? (
            <p className="text-sm text-ink-500">No saved setups yet.</p>
          ) : (
            <ul className="divide-y divide-ink-100 rounded-md border border-ink-200" aria-label="Saved setups">
              {setups.map((s) => {
                const open = s.id === openSetup?.id;
                return (
                  <li key={s.id} className={cn('flex items-center justify-between gap-3 px-4 py-2.5', open && 'bg-flux-50')}>
                    <div className="min-w-0 flex-1">
                      <p className="truncate text-sm font-medium text-ink-900">
                        {s.name}
                        {open && <span className="ml-2 text-xs font-normal text-flux-800">{dirty ? 'open, changed' : 'open'}</span>}
                      </p>
                      <p className="truncate text-xs text-ink-500">
                        {coilName(s.transmitterCoilId)} → {coilName(s.receiverCoilId)} · {placementSummary(s)} · {formatDateTime(s.updatedAt)}
                      </p>
                    </div>
                    {open ? (
                      dirty && <Button size="sm" variant="ghost" className="shrink-0" onClick={onRevert}>Revert to saved</Button>
                    ) : (
                      <Link href={`?setup=${s.id}`} scroll={false} className="shrink-0 text-sm font-medium text-flux-700 hover:underline" aria-label={`Open ${s.name}`}>
                        Open
                      </Link>
                    )}
                  </li>
                );
              })}
            </ul>
          )}
        </div>
        {canEdit ? (
          <form
            className="space-y-3"
            aria-label="Save setup"
            onSubmit={(e) => {
              e.preventDefault();
              void save(openSetup ? 'update' : 'create');
            }}
          >
            <TextField label="Setup name" value={name} error={nameError} onChange={(e) => setName(e.target.value)} maxLength={120} />
            <TextAreaField label="Notes" value={notes} rows={2} onChange={(e) => setNotes(e.target.value)} />
            <div className="flex flex-wrap gap-2">
              {openSetup && (
                <Button type="submit" variant="primary" disabled={saving}>
                  Save changes
                </Button>
              )}
              <Button type={openSetup ? 'button' : 'submit'} variant={openSetup ? 'secondary' : 'primary'} disabled={saving} onClick={openSetup ? () => void save('create') : undefined}>
                Save as new setup
              </Button>
            </div>
            {message && (
              <p role={message.tone === 'error' ? 'alert' : 'status'} className={cn('text-sm', message.tone === 'error' ? 'text-danger-700' : 'text-flux-800')}>
                {message.text}
              </p>
            )}
          </form>
        ) : (
          <p className="rounded-md border border-ink-200 bg-ink-50 px-4 py-3 text-sm text-ink-600">
            You can open setups and move the receiver to explore, but your role on this study does not save setups.
          </p>
        )}
      </div>
    </Panel>
  );
}
