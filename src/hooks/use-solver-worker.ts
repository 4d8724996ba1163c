'use client';

import { useEffect, useMemo, useRef, useState } from 'react';
import type { Population, SolveRequest } from '@/physics';
import type { Vec3 } from '@/components/bench/bench-types';
import { FAST_TOLERANCE, fieldKey, REFINED_TOLERANCE, requestKey, sweepKey, SWEEP_TILTS_DEG } from '@/components/bench/build-request';
import { createSolverWorker } from '@/components/bench/create-solver-worker';
import type { FieldGrid } from '@/components/bench/field-grid';
import { LatestOnlyQueue } from '@/components/bench/latest-only-queue';
import type { FieldAnswer, JobFailure, JobKind, SolveAnswer, SolverAnswer, SolverJob, SweepAnswer, WorkerReply } from '@/components/bench/solver-jobs';

export interface SolverInputs {
  /** the bench's request; its tolerance is ignored (the hook picks the pass) */
  request: SolveRequest | null;
  /** the user is dragging: only fast passes, no refinement, no sweep or field map */
  interacting: boolean;
  field: { grid: FieldGrid; operatorPoint: Vec3 | null; population: Population } | null;
}

interface Channel<T> {
  answer: T | null;
  failure: { key: string; failure: JobFailure } | null;
}

export interface ChannelView<T> {
  /** the newest answer received, possibly for an earlier state */
  answer: T | null;
  /** the answer describes the bench as it is now */
  current: boolean;
  /** the solver refused the current state */
  error: JobFailure | null;
}

const EMPTY = { answer: null, failure: null };

/**
 * Runs src/physics in two Web Workers: one for the live solve (fast pass at 1e-4 while dragging, refined
 * at 1e-6 once the user lets go), one for the slower background jobs (k against tilt, the |B| map) that
 * start only after let-go. Each kind of job keeps at most one in flight and only the newest waiting, so
 * stale positions are skipped and the page thread never computes.
 */
export function useSolverWorker({ request, interacting, field }: SolverInputs) {
  const queues = useRef<Record<JobKind, LatestOnlyQueue<SolverJob>> | null>(null);
  const jobKeys = useRef<Record<JobKind, Map<number, string>>>({ solve: new Map(), sweep: new Map(), field: new Map() });
  const sent = useRef<{ fast?: string; refined?: string; sweep?: string; field?: string }>({});
  const [ready, setReady] = useState(false);
  const [workerError, setWorkerError] = useState<string | null>(null);
  const [solveCh, setSolveCh] = useState<Channel<SolveAnswer>>(EMPTY);
  const [sweepCh, setSweepCh] = useState<Channel<SweepAnswer>>(EMPTY);
  const [fieldCh, setFieldCh] = useState<Channel<FieldAnswer>>(EMPTY);

  useEffect(() => {
    let interactive: Worker;
    let background: Worker;
    try {
      interactive = createSolverWorker();
      background = createSolverWorker();
    } catch {
      setWorkerError('This browser could not start the solver thread, so nothing can be computed here.');
      return;
    }
    const keys = jobKeys.current;
    const post = (worker: Worker) => (id: number, job: SolverJob) => worker.postMessage({ id, job });
    const q: Record<JobKind, LatestOnlyQueue<SolverJob>> = {
      solve: new LatestOnlyQueue(post(interactive)),
      sweep: new LatestOnlyQueue(post(background)),
      field: new LatestOnlyQueue(post(background)),
    };
    const setters = { solve: setSolveCh, sweep: setSweepCh, field: setFieldCh } as Record<JobKind, (f: (c: Channel<SolverAnswer>) => Channel<SolverAnswer>) => void>;
    const onMessage = (event: MessageEvent<WorkerReply>) => {
      const reply = event.data;
      q[reply.kind].complete(reply.id);
      const key = keys[reply.kind].get(reply.id) ?? '';
      keys[reply.kind].delete(reply.id);
      setters[reply.kind]((prev) => {
        if (!reply.ok) return { answer: prev.answer, failure: { key, failure: reply.failure } };
        const a = reply.answer;
        // a fast answer never replaces a refined one for the same state
        if (a.kind === 'solve' && prev.answer?.kind === 'solve' && prev.answer.key === a.key && prev.answer.tolerance < a.tolerance) return prev;
        return { answer: a, failure: null };
      });
    };
    const onError = () => setWorkerError('The solver thread failed to load. Reload the page to try again.');
    for (const w of [interactive, background]) {
      w.addEventListener('message', onMessage);
      w.addEventListener('error', onError);
    }
    queues.current = q;
    setReady(true);
    return () => {
      interactive.terminate();
      background.terminate();
      queues.current = null;
      sent.current = {};
      for (const m of Object.values(keys)) m.clear();
      setReady(false);
    };
  }, []);

  const key = request ? requestKey(request) : null;
  const sKey = request ? sweepKey(request) : null;
  const fKey = request && field ? fieldKey(request, field.grid, field.operatorPoint, field.population) : null;

  // Runs when a key changes (not on every new object identity); the request and field it reads are
  // those of the render that produced the keys.
  useEffect(() => {
    const q = queues.current;
    const req = request;
    const fld = field;
    if (!ready || !q || !req || !key) return;
    const submit = (kind: JobKind, job: SolverJob, jobKey: string) => jobKeys.current[kind].set(q[kind].submit(job), jobKey);
    const s = sent.current;
    if (s.fast !== key && s.refined !== key) {
      submit('solve', { kind: 'solve', request: { ...req, tolerance: FAST_TOLERANCE } }, key);
      s.fast = key;
    }
    if (interacting) return;
    if (s.refined !== key) {
      submit('solve', { kind: 'solve', request: { ...req, tolerance: REFINED_TOLERANCE } }, key);
      s.refined = key;
    }
    if (sKey && s.sweep !== sKey) {
      submit('sweep', { kind: 'sweep', request: { ...req, tolerance: FAST_TOLERANCE }, tiltsDeg: SWEEP_TILTS_DEG }, sKey);
      s.sweep = sKey;
    }
    if (fld && fKey && s.field !== fKey) {
      const job: SolverJob = { kind: 'field', request: { ...req, tolerance: FAST_TOLERANCE }, grid: fld.grid, operatorPoint: fld.operatorPoint, population: fld.population };
      submit('field', job, fKey);
      s.field = fKey;
    }
  }, [ready, key, sKey, fKey, interacting]);

  return useMemo(() => {
    const view = <T extends SolverAnswer>(ch: Channel<T>, k: string | null, answerKey: (a: T) => string): ChannelView<T> => ({
      answer: ch.answer,
      current: Boolean(ch.answer && k && answerKey(ch.answer) === k),
      error: ch.failure && ch.failure.key === k ? ch.failure.failure : null,
    });
    const solveView = view(solveCh, key, (a) => a.key);
    return {
      workerError,
      solve: { ...solveView, refined: solveView.current && solveView.answer?.tolerance === REFINED_TOLERANCE },
      sweep: view(sweepCh, sKey, (a) => a.key),
      field: view(fieldCh, fKey, (a) => a.key),
    };
  }, [workerError, solveCh, sweepCh, fieldCh, key, sKey, fKey]);
}

export type SolverResults = ReturnType<typeof useSolverWorker>;
