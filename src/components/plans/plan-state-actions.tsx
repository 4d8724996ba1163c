'use client';

import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { Plan, PlanState } from './plan-types';

interface PlanStateActionsProps {
  studyId: number;
  plan: Plan;
  /** the viewer's allowed actions on the study (permissions.ts) */
  allowedActions: readonly string[];
  onChanged: (plan: Plan) => void;
}

interface Move {
  to: PlanState;
  label: string;
  confirm: string;
}

/**
 * The next step of the plan this viewer may take: a researcher puts a draft on the bench (it freezes);
 * whoever logs readings submits a plan on the bench for review. Accept and return come with review.
 */
function movesFor(plan: Plan, allowedActions: readonly string[]): Move[] {
  if (plan.state === 'draft' && allowedActions.includes('study.edit')) {
    return [{ to: 'on_bench', label: 'Put on the bench', confirm: 'Its axes, order and repeats are frozen from then on; only a draft can be changed.' }];
  }
  if (plan.state === 'on_bench' && allowedActions.includes('readings.log')) {
    return [{ to: 'in_review', label: 'Submit for review', confirm: 'The supervisor will compare predicted with measured values and accept or return it.' }];
  }
  return [];
}

export function PlanStateActions({ studyId, plan, allowedActions, onChanged }: PlanStateActionsProps) {
  const [asking, setAsking] = useState<Move | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const moves = movesFor(plan, allowedActions);
  if (moves.length === 0) return null;

  const go = async (move: Move) => {
    setBusy(true);
    setError(null);
    try {
      const { plan: moved } = await fetchJson<{ plan: Plan }>(`/api/studies/${studyId}/plans/${plan.id}/transition`, { method: 'POST', body: { to: move.to } });
      setAsking(null);
      onChanged(moved);
    } catch (failure) {
      setError(failure instanceof ApiError ? failure.message : 'Couplet could not be reached. Check your connection and try again.');
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="space-y-3">
      {!asking && (
        <div className="flex gap-2">
          {moves.map((move) => (
            <Button key={move.to} variant="primary" onClick={() => setAsking(move)}>
              {move.label}
            </Button>
          ))}
        </div>
      )}
      {asking && (
        <div role="alertdialog" aria-labelledby="plan-move-title" aria-describedby="plan-move-text" className="rounded-md border border-copper-200 bg-copper-50 p-4">
          <p id="plan-move-title" className="font-semibold text-ink-900">
            {asking.label}: “{plan.name}”?
          </p>
          <p id="plan-move-text" className="mt-1 text-sm text-ink-700">
            {asking.confirm}
          </p>
          <div className="mt-3 flex gap-2">
            <Button variant="primary" disabled={busy} onClick={() => go(asking)}>
              {busy ? 'Working…' : `Yes, ${asking.label.toLowerCase()}`}
            </Button>
            <Button disabled={busy} onClick={() => setAsking(null)}>
              Not now
            </Button>
          </div>
        </div>
      )}
      {error && <Alert tone="error">{error}</Alert>}
    </div>
  );
}
