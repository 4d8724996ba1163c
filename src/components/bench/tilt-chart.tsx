'use client';

import { Panel } from '@/components/ui/panel';
import { cn } from '@/components/ui/cn';
import type { ChannelView } from '@/hooks/use-solver-worker';
import { interpolateAt, linearScale, niceTicks } from './chart-scale';
import { formatInputNumber, metresToCm } from './format-quantity';
import { formatCoupling } from './readout-panel';
import type { SweepAnswer } from './solver-jobs';

const W = 340;
const H = 196;
const M = { left: 54, right: 14, top: 22, bottom: 36 };
const X_TICKS = [0, 15, 30, 45, 60, 75, 90];

function tickLabel(v: number, ticks: number[]): string {
  const span = Math.max(...ticks.map(Math.abs));
  if (v === 0) return '0';
  // plain decimals down to 0.0001; smaller couplings in exponent form
  if (span < 1e-4) return v.toExponential(0);
  return String(Number(v.toPrecision(3)));
}

/**
 * k against tilt (0-90 degrees) at the current distance and offset, computed after let-go; the current
 * tilt is marked, so the cost of a tilted receiver reads at a glance.
 */
export function TiltChart({ sweep, tiltDeg, currentK, distance, lateralOffset }: {
  sweep: ChannelView<SweepAnswer>;
  tiltDeg: number;
  /** k of the current state when known */
  currentK: number | null;
  distance: number;
  lateralOffset: number;
}) {
  const points = sweep.answer?.points ?? [];
  const values = points.map((p) => p.coupling).filter((k): k is number => k !== null);
  const yTicks = values.length ? niceTicks(Math.min(0, ...values), Math.max(0, ...values), 5) : [];
  const y0 = yTicks[0] ?? 0;
  const y1 = yTicks[yTicks.length - 1] ?? 1;
  const x = linearScale(0, 90, M.left, W - M.right);
  const y = linearScale(y0, y1, H - M.bottom, M.top);
  const segments: string[] = [];
  let run: string[] = [];
  for (const p of points) {
    if (p.coupling === null) {
      if (run.length > 1) segments.push(run.join(' '));
      run = [];
    } else run.push(`${x(p.tiltDeg).toFixed(1)},${y(p.coupling).toFixed(1)}`);
  }
  if (run.length > 1) segments.push(run.join(' '));
  const markerK = currentK ?? interpolateAt(points, tiltDeg);
  const inRange = tiltDeg >= 0 && tiltDeg <= 90;
  const title = `k against tilt at distance ${formatInputNumber(metresToCm(distance), 2)} cm, offset ${formatInputNumber(metresToCm(lateralOffset), 2)} cm`;

  return (
    <Panel title="Coupling against tilt" description={title}>
      <figure>
        {points.length === 0 ? (
          <p className="flex h-[196px] items-center justify-center text-sm text-ink-500">
            {sweep.error ? sweep.error.message : 'Computed when the receiver is at rest…'}
          </p>
        ) : (
          <svg viewBox={`0 0 ${W} ${H}`} className={cn('w-full', !sweep.current && 'opacity-50')} role="img" aria-label={`${title}. Current tilt ${tiltDeg} degrees.`} data-testid="tilt-chart">
            {yTicks.map((t) => (
              <g key={`y${t}`}>
                <line x1={M.left} x2={W - M.right} y1={y(t)} y2={y(t)} className={t === 0 ? 'stroke-ink-300' : 'stroke-ink-100'} strokeWidth={1} />
                <text x={M.left - 6} y={y(t)} dy="0.32em" textAnchor="end" className="fill-ink-500 font-mono text-[10px]">{tickLabel(t, yTicks)}</text>
              </g>
            ))}
            {X_TICKS.map((t) => (
              <g key={`x${t}`}>
                <line x1={x(t)} x2={x(t)} y1={H - M.bottom} y2={H - M.bottom + 4} className="stroke-ink-300" />
                <text x={x(t)} y={H - M.bottom + 15} textAnchor="middle" className="fill-ink-500 font-mono text-[10px]">{t}°</text>
              </g>
            ))}
            <text x={(M.left + W - M.right) / 2} y={H - 4} textAnchor="middle" className="fill-ink-500 text-[10px]">tilt</text>
            <text x={M.left - 6} y={9} textAnchor="end" className="fill-ink-500 text-[10px] italic">k</text>
            {segments.map((s) => (
              <polyline key={s} points={s} fill="none" className="stroke-flux-600" strokeWidth={1.8} strokeLinejoin="round" />
            ))}
            {points.map((p) => p.coupling !== null && <circle key={p.tiltDeg} cx={x(p.tiltDeg)} cy={y(p.coupling)} r={1.8} className="fill-flux-600" />)}
            {inRange && (
              <g data-testid="tilt-chart-marker">
                <line x1={x(tiltDeg)} x2={x(tiltDeg)} y1={M.top} y2={H - M.bottom} className="stroke-copper-500" strokeDasharray="3 3" />
                {markerK !== null && <circle cx={x(tiltDeg)} cy={y(Math.min(y1, Math.max(y0, markerK)))} r={4} className="fill-copper-500 stroke-white" strokeWidth={1.5} />}
              </g>
            )}
          </svg>
        )}
        <figcaption className="mt-1 flex justify-between text-xs text-ink-500">
          <span>
            now: {formatInputNumber(tiltDeg, 1)}°, k = {formatCoupling(markerK)}
            {!inRange && ' (outside the chart)'}
          </span>
          <span>19 points, tolerance 1e-4</span>
        </figcaption>
        {points.length > 0 && (
          <table className="sr-only">
            <caption>{title}</caption>
            <thead><tr><th>tilt (degrees)</th><th>k</th></tr></thead>
            <tbody>
              {points.map((p) => (
                <tr key={p.tiltDeg}><td>{p.tiltDeg}</td><td>{p.coupling === null ? 'touches the transmitter' : formatCoupling(p.coupling)}</td></tr>
              ))}
            </tbody>
          </table>
        )}
      </figure>
    </Panel>
  );
}
