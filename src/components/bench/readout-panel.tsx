'use client';

import type { ReactNode } from 'react';
import { Panel } from '@/components/ui/panel';
import { cn } from '@/components/ui/cn';
import type { SolveResponse } from '@/physics';
import type { ChannelView } from '@/hooks/use-solver-worker';
import { REFINED_TOLERANCE } from './build-request';
import { CAPACITOR_VOLTAGE_CAUTION_V } from './cautions';
import { formatEngineering, formatPercent, formatRelativeError, formatScientific, NO_VALUE } from './format-quantity';
import type { SolveAnswer } from './solver-jobs';

/** k is shown to 5 decimals, or in scientific notation once it is that small. */
export function formatCoupling(k: number | null | undefined): string {
  if (k === null || k === undefined || !Number.isFinite(k)) return NO_VALUE;
  if (k !== 0 && Math.abs(k) < 1e-3) return formatScientific(k, 3);
  return k.toFixed(5);
}

export type ReadoutState = 'computing' | 'refining' | 'refined' | 'error';

export function readoutState(solve: ChannelView<SolveAnswer> & { refined: boolean }): ReadoutState {
  if (solve.error) return 'error';
  if (!solve.answer) return 'computing';
  return solve.refined ? 'refined' : 'refining';
}

function Row({ label, symbol, value, testId, raw, warn = false }: { label: string; symbol: ReactNode; value: string; testId: string; raw?: number; warn?: boolean }) {
  return (
    <div className="flex items-baseline justify-between gap-3 py-1">
      <dt className="text-sm text-ink-600">
        <span className="inline-block w-9 font-mono text-xs text-ink-400">{symbol}</span>
        {label}
      </dt>
      <dd data-testid={testId} data-value={raw} className={cn('font-mono text-sm tabular-nums', warn ? 'font-semibold text-caution-700' : 'text-ink-900')}>
        {value}
      </dd>
    </div>
  );
}

function Group({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="border-t border-ink-100 pt-2 first:border-t-0 first:pt-0">
      <h3 className="mb-0.5 text-[11px] font-semibold uppercase tracking-wider text-ink-400">{title}</h3>
      <dl>{children}</dl>
    </div>
  );
}

function StatusLine({ state, response }: { state: ReadoutState; response: SolveResponse | null }) {
  if (state === 'refined' && response) {
    return (
      <p data-testid="readout-status" data-state="refined" className="flex items-center gap-2 text-xs text-flux-800">
        <span aria-hidden="true" className="h-2 w-2 rounded-full bg-flux-500" />
        M {formatRelativeError(response.accuracy.estimatedRelativeError)} (tolerance {formatScientific(REFINED_TOLERANCE, 1)})
      </p>
    );
  }
  const text = state === 'error' ? 'cannot solve this placement' : state === 'computing' ? 'computing…' : 'refining…';
  return (
    <p data-testid="readout-status" data-state={state} className="flex items-center gap-2 text-xs text-ink-500" aria-live="polite">
      <span aria-hidden="true" className={cn('h-2 w-2 rounded-full', state === 'error' ? 'bg-danger-500' : 'animate-pulse bg-caution-500')} />
      {text}
    </p>
  );
}

/**
 * The live numbers of the link: coupling, the coils, their tuning capacitors and the transfer. Values of
 * an earlier position stay on screen, dimmed, until the new ones arrive, so nothing flickers while dragging.
 */
export function ReadoutPanel({ solve }: { solve: ChannelView<SolveAnswer> & { refined: boolean } }) {
  const state = readoutState(solve);
  const r = solve.answer?.response ?? null;
  const t = r?.transfer;
  const vWarn = (v: number | undefined) => v !== undefined && v > CAPACITOR_VOLTAGE_CAUTION_V;
  const tunedNote = (tuned: boolean | undefined) => (tuned === undefined ? '' : tuned ? 'tuned' : 'fixed');
  return (
    <Panel title="Readout" actions={<StatusLine state={state} response={r} />}>
      {solve.error && (
        <p role="alert" className="mb-3 rounded-md border border-danger-500/30 bg-danger-50 px-3 py-2 text-sm text-danger-700">
          {solve.error.message.charAt(0).toUpperCase() + solve.error.message.slice(1)}.
        </p>
      )}
      <div className={cn('space-y-2 transition-opacity', (!solve.current || solve.error) && r ? 'opacity-50' : '')} aria-busy={state !== 'refined'}>
        <Group title="Coupling">
          <Row label="Mutual inductance" symbol="M" value={formatEngineering(r?.mutualInductance, 'H')} testId="readout-m" raw={r?.mutualInductance} />
          <Row label="Coupling factor" symbol="k" value={formatCoupling(r?.coupling)} testId="readout-k" raw={r?.coupling} />
        </Group>
        <Group title="Coils">
          <Row label="Transmitter inductance" symbol="L1" value={formatEngineering(r?.transmitter.selfInductance, 'H')} testId="readout-l1" raw={r?.transmitter.selfInductance} />
          <Row label="Receiver inductance" symbol="L2" value={formatEngineering(r?.receiver.selfInductance, 'H')} testId="readout-l2" raw={r?.receiver.selfInductance} />
          <Row label="Transmitter Q" symbol="Q1" value={r ? r.transmitter.qualityFactor.toPrecision(4) : NO_VALUE} testId="readout-q1" />
          <Row label="Receiver Q" symbol="Q2" value={r ? r.receiver.qualityFactor.toPrecision(4) : NO_VALUE} testId="readout-q2" />
        </Group>
        <Group title="Capacitors">
          <Row label={`Transmitter ${tunedNote(r?.transmitter.tuned)}`} symbol="C1" value={formatEngineering(r?.transmitter.capacitance, 'F')} testId="readout-c1" raw={r?.transmitter.capacitance} />
          <Row label={`Receiver ${tunedNote(r?.receiver.tuned)}`} symbol="C2" value={formatEngineering(r?.receiver.capacitance, 'F')} testId="readout-c2" raw={r?.receiver.capacitance} />
          <Row label="Voltage on C1, rms" symbol="VC1" value={formatEngineering(t?.txCapacitorVoltage, 'V')} testId="readout-vc1" warn={vWarn(t?.txCapacitorVoltage)} />
          <Row label="Voltage on C2, rms" symbol="VC2" value={formatEngineering(t?.rxCapacitorVoltage, 'V')} testId="readout-vc2" warn={vWarn(t?.rxCapacitorVoltage)} />
        </Group>
        <Group title="Transfer">
          <Row label="Load power" symbol="P" value={formatEngineering(t?.loadPower, 'W')} testId="readout-power" raw={t?.loadPower} />
          <Row label="Link efficiency" symbol="η" value={formatPercent(t?.efficiency)} testId="readout-efficiency" raw={t?.efficiency} />
          <Row label="Transmitter current, rms" symbol="I1" value={formatEngineering(t?.txCurrent, 'A')} testId="readout-i1" />
          <Row label="Receiver current, rms" symbol="I2" value={formatEngineering(t?.rxCurrent, 'A')} testId="readout-i2" />
        </Group>
      </div>
      {r && <p className="mt-3 text-[11px] text-ink-400">solver {r.solverVersion}</p>}
    </Panel>
  );
}
