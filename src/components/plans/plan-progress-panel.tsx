'use client';

import { useEffect, useRef, useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { usePlanProgress } from '@/hooks/use-plan-progress';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { Plan, PlanProgress } from './plan-types';

interface PlanProgressPanelProps {
  studyId: number;
  plan: Plan;
  canEdit: boolean;
  /** called when a run ends (done, failed, cancelled) or a recompute starts, to reload plan and points */
  onChanged: () => void;
}

/** Prediction status: a progress bar with Cancel while running, the failure in words, Recompute for editors. */
export function PlanProgressPanel({ studyId, plan, canEdit, onChanged }: PlanProgressPanelProps) {
  const [runningLocally, setRunningLocally] = useState(false);
  const running = plan.prediction.status === 'running' || runningLocally;
  const { progress: polled } = usePlanProgress(studyId, plan.id, running);
  const progress: PlanProgress = polled ?? plan.prediction;
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const lastStatus = useRef(progress.status);

  useEffect(() => {
    if (lastStatus.current === 'running' && progress.status !== 'running') {
      setRunningLocally(false);
      onChanged();
    }
    lastStatus.current = progress.status;
  }, [progress.status, onChanged]);

  const post = async (path: string, startsRun: boolean) => {
    setBusy(true);
    setMessage(null);
    try {
      await fetchJson(`/api/studies/${studyId}/plans/${plan.id}/predictions${path}`, { method: 'POST' });
      if (startsRun) setRunningLocally(true);
      onChanged();
    } catch (error) {
      setMessage(error instanceof ApiError ? error.message : 'Couplet could not be reached. Check your connection and try again.');
    } finally {
      setBusy(false);
    }
  };

  const isRunning = progress.status === 'running';
  const percent = progress.total > 0 ? Math.round((progress.done / progress.total) * 100) : 0;
  return (
    <div className="space-y-3">
      {isRunning && (
        <div className="flex items-center gap-4">
          <div className="grow">
            <div className="mb-1 flex justify-between text-sm text-ink-700">
              <span id={`progress-${plan.id}`}>Computing predictions</span>
              <span className="tabular-nums">
                {progress.done.toLocaleString('en')} of {progress.total.toLocaleString('en')}
              </span>
            </div>
            <div
              role="progressbar"
              aria-labelledby={`progress-${plan.id}`}
              aria-valuemin={0}
              aria-valuemax={100}
              aria-valuenow={percent}
              className="h-2 overflow-hidden rounded-full bg-ink-100"
            >
              <div className="h-full bg-flux-500 transition-[width]" style={{ width: `${percent}%` }} />
            </div>
          </div>
          {canEdit && (
            <Button size="sm" variant="danger" disabled={busy} onClick={() => post('/cancel', false)}>
              Cancel
            </Button>
          )}
        </div>
      )}
      {progress.status === 'failed' && (
        <Alert tone="error" title="The predictions failed">
          {progress.error ?? 'The solver stopped without saying why.'} The earlier predictions are kept.
        </Alert>
      )}
      {progress.status === 'cancelled' && <Alert tone="info">The last computation was cancelled; the earlier predictions are kept.</Alert>}
      {progress.status === 'done' && progress.solverVersion && (
        <p className="text-sm text-ink-600">
          Every point predicted by solver {progress.solverVersion}.
        </p>
      )}
      {message && <Alert tone="error">{message}</Alert>}
      {canEdit && !isRunning && (
        <Button size="sm" disabled={busy} onClick={() => post('', true)}>
          Recompute
        </Button>
      )}
    </div>
  );
}
