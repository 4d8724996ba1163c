'use client';

import { useEffect, useRef } from 'react';
import { Panel } from '@/components/ui/panel';
import { Select } from '@/components/ui/select';
import { cn } from '@/components/ui/cn';
import { formatLength } from '@/lib/units/format';
import type { Population } from '@/physics';
import type { ChannelView } from '@/hooks/use-solver-worker';
import type { Vec3 } from './bench-types';
import { type FieldGrid, type FieldScale, rampColour, scalePosition } from './field-grid';
import { cmToMetres, formatEngineering, formatInputNumber, formatScientific, metresToCm } from './format-quantity';
import type { FieldAnswer, OperatorExposure } from './solver-jobs';

const VIEW = 1000;

function ColourBar({ scale, limitTesla }: { scale: FieldScale; limitTesla: number | null }) {
  const stops = [0, 0.25, 0.5, 0.75, 1].map((t) => `rgb(${rampColour(t).join(',')}) ${t * 100}%`).join(', ');
  const decades: number[] = [];
  for (let e = Math.ceil(scale.logMin); e <= Math.floor(scale.logMax); e++) decades.push(e);
  const pos = (logB: number) => ((logB - scale.logMin) / (scale.logMax - scale.logMin)) * 100;
  const limitPos = limitTesla ? pos(Math.log10(limitTesla)) : null;
  return (
    <div className="space-y-1">
      <div className="relative h-3 rounded-sm" style={{ background: `linear-gradient(to right, ${stops})` }}>
        {limitPos !== null && limitPos >= 0 && limitPos <= 100 && (
          <span className="absolute -top-1 h-5 w-0.5 bg-danger-600" style={{ left: `${limitPos}%` }} title="reference level" />
        )}
      </div>
      <div className="relative h-4 font-mono text-[10px] text-ink-500">
        {decades.map((e) => (
          <span
            key={e}
            className={cn('absolute whitespace-nowrap', pos(e) < 8 ? '' : pos(e) > 92 ? '-translate-x-full' : '-translate-x-1/2')}
            style={{ left: `${pos(e)}%` }}
          >
            {formatEngineering(10 ** e, 'T', 3, true)}
          </span>
        ))}
      </div>
      <p className="text-[11px] text-ink-500">
        |B| rms, log scale{limitPos !== null && limitPos >= 0 && limitPos <= 100 ? '; red mark: the reference level used below' : ''}.
      </p>
    </div>
  );
}

function OperatorInput({ axis, value, onChange }: { axis: 'x' | 'y' | 'z'; value: number; onChange: (m: number) => void }) {
  return (
    <label className="flex items-center gap-1.5 text-sm text-ink-700">
      <span className="font-mono text-xs text-ink-500">{axis}</span>
      <input
        type="number"
        step="any"
        aria-label={`Operator ${axis} (cm)`}
        defaultValue={formatInputNumber(metresToCm(value), 2)}
        key={value}
        onBlur={(e) => {
          const v = Number(e.target.value);
          if (e.target.value.trim() !== '' && Number.isFinite(v)) onChange(cmToMetres(v));
        }}
        onKeyDown={(e) => {
          if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
        }}
        className="h-8 w-20 rounded-md border border-ink-300 bg-white px-2 text-right font-mono text-sm tabular-nums text-ink-900 hover:border-ink-400"
      />
    </label>
  );
}

function ExposureSummary({ operator, current }: { operator: OperatorExposure | null; current: boolean }) {
  if (!operator) return <p className="text-sm text-ink-500">Computed when the receiver is at rest…</p>;
  const lim = operator.limiting;
  return (
    <div className={cn('space-y-2 text-sm', !current && 'opacity-50')} data-testid="operator-exposure">
      <p className="text-ink-800">
        |B| at the operator point: <span className="font-mono font-semibold tabular-nums">{formatEngineering(operator.fluxDensityRms, 'T', 3)}</span> rms
      </p>
      {lim ? (
        <>
          <p className={cn('text-ink-800', lim.ratio >= 1 && 'font-semibold text-danger-700')}>
            Ratio to the reference level: <span className="font-mono tabular-nums" data-testid="operator-ratio" data-value={lim.ratio}>{formatScientific(lim.ratio, 3)}</span>
          </p>
          <p className="text-xs leading-5 text-ink-600">
            Level used: {formatEngineering(lim.limitTesla, 'T', 3)} ({lim.formula}), {lim.basis}, {lim.population === 'general' ? 'general public' : 'occupational exposure'}.
            Source: {lim.source}, version {lim.version}
            {lim.memory ? '. These numbers were entered from memory, not re-read from the publication: check them before relying on them.' : '.'}
          </p>
          {operator.applicable.length > 1 && (
            <details className="text-xs text-ink-600">
              <summary className="cursor-pointer text-ink-700">All {operator.applicable.length} levels that cover this frequency</summary>
              <ul className="mt-1 space-y-1">
                {operator.applicable.map((a) => (
                  <li key={a.id}>
                    {a.source} ({a.version}): {formatEngineering(a.limitTesla, 'T', 3)}, {a.basis}; ratio {formatScientific(a.ratio, 3)}
                  </li>
                ))}
              </ul>
            </details>
          )}
        </>
      ) : (
        <p className="text-caution-900">No reference level in the table covers this frequency, so the field is not compared with one.</p>
      )}
    </div>
  );
}

/**
 * |B| on the plane y = 0 (it holds both coil axes) as a colour map, seen from the front like the 3D view
 * (x to the right, z up), with the coils' outlines, the operator point and its exposure assessment.
 */
export function FieldMapPanel({ field, pixels, scale, outlines, operatorPoint, onOperatorPointChange, population, onPopulationChange, showInScene, onShowInSceneChange, sceneAvailable }: {
  field: ChannelView<FieldAnswer>;
  pixels: Uint8ClampedArray | null;
  scale: FieldScale | null;
  /** coil paths in world coordinates, xyz interleaved [m] */
  outlines: { tx: Float64Array; rx: Float64Array };
  operatorPoint: Vec3;
  onOperatorPointChange: (p: Vec3) => void;
  population: Population;
  onPopulationChange: (p: Population) => void;
  showInScene: boolean;
  onShowInSceneChange: (show: boolean) => void;
  sceneAvailable: boolean;
}) {
  const canvas = useRef<HTMLCanvasElement>(null);
  const grid: FieldGrid | null = field.answer?.grid ?? null;
  useEffect(() => {
    const c = canvas.current;
    if (!c || !grid || !pixels) return;
    c.width = grid.n;
    c.height = grid.n;
    c.getContext('2d')?.putImageData(new ImageData(new Uint8ClampedArray(pixels), grid.n, grid.n), 0, 0);
  }, [grid, pixels]);

  const sx = (x: number) => (grid ? ((x - grid.xMin) / (grid.xMax - grid.xMin)) * VIEW : 0);
  const sz = (z: number) => (grid ? (1 - (z - grid.zMin) / (grid.zMax - grid.zMin)) * VIEW : 0);
  const outline = (p: Float64Array) => {
    const pts: string[] = [];
    for (let i = 0; i < p.length; i += 3) pts.push(`${sx(p[i]).toFixed(1)},${sz(p[i + 2]).toFixed(1)}`);
    return pts.join(' ');
  };
  const setAxis = (a: 0 | 1 | 2) => (m: number) => {
    const next = [...operatorPoint] as Vec3;
    next[a] = m;
    onOperatorPointChange(next);
  };
  const limit = field.answer?.operator?.limiting?.limitTesla ?? null;
  const span = grid ? formatLength(grid.xMax - grid.xMin, 3) : null;

  return (
    <Panel
      title="Field on the x-z plane"
      description="Magnitude of B at y = 0 from both coils' currents, 41 × 41 points, computed after let-go."
      actions={
        sceneAvailable ? (
          <label className="flex items-center gap-2 text-sm text-ink-700">
            <input type="checkbox" checked={showInScene} onChange={(e) => onShowInSceneChange(e.target.checked)} className="accent-flux-600" />
            Show in 3D
          </label>
        ) : undefined
      }
    >
      <div className="grid gap-6 md:grid-cols-[minmax(0,340px)_1fr]">
        <div className="space-y-2">
          <div className={cn('relative aspect-square w-full overflow-hidden rounded-md bg-ink-950 ring-1 ring-ink-800', !field.current && 'opacity-60')}>
            {grid && pixels ? (
              <>
                <canvas ref={canvas} className="absolute inset-0 h-full w-full" aria-hidden="true" data-testid="field-map" />
                <svg viewBox={`0 0 ${VIEW} ${VIEW}`} className="absolute inset-0 h-full w-full" role="img" aria-label="Field map with the coils' outlines and the operator point">
                  {/* a light halo under a dark line keeps the outlines readable on dark and pale parts of the map */}
                  {[outlines.tx, outlines.rx].map((o, i) => (
                    <g key={i}>
                      <polyline points={outline(o)} fill="none" stroke="#f5f7fa" strokeOpacity={0.55} strokeWidth={9} strokeLinejoin="round" />
                      <polyline points={outline(o)} fill="none" stroke="#10151e" strokeWidth={3.5} strokeLinejoin="round" />
                    </g>
                  ))}
                  <g transform={`translate(${sx(operatorPoint[0])} ${sz(operatorPoint[2])})`}>
                    <circle r={18} fill="none" stroke="#d98e04" strokeWidth={6} />
                    <line x1={-34} x2={34} stroke="#d98e04" strokeWidth={4} />
                    <line y1={-34} y2={34} stroke="#d98e04" strokeWidth={4} />
                  </g>
                </svg>
                <span className="pointer-events-none absolute bottom-1.5 left-2 font-mono text-[10px] text-ink-200">x →  z ↑  · {span} across</span>
              </>
            ) : (
              <p className="flex h-full items-center justify-center px-4 text-center text-xs text-ink-300">
                {field.error ? field.error.message : 'Computing the field map…'}
              </p>
            )}
          </div>
          {scale && <ColourBar scale={scale} limitTesla={limit} />}
        </div>
        <div className="space-y-4">
          <fieldset className="space-y-2">
            <legend className="text-sm font-medium text-ink-800">Operator point (cm)</legend>
            <div className="flex flex-wrap gap-3">
              <OperatorInput axis="x" value={operatorPoint[0]} onChange={setAxis(0)} />
              <OperatorInput axis="y" value={operatorPoint[1]} onChange={setAxis(1)} />
              <OperatorInput axis="z" value={operatorPoint[2]} onChange={setAxis(2)} />
            </div>
            {Math.abs(operatorPoint[1]) > 1e-9 && (
              <p className="text-xs text-ink-500">The point is off the map's plane (y ≠ 0); the map marks where it projects.</p>
            )}
          </fieldset>
          <label className="block space-y-1.5 text-sm">
            <span className="font-medium text-ink-800">Reference levels for</span>
            <Select
              value={population}
              onChange={(e) => onPopulationChange(e.target.value as Population)}
              options={[
                { value: 'general', label: 'the general public' },
                { value: 'occupational', label: 'occupational exposure' },
              ]}
              className="max-w-xs"
            />
          </label>
          <ExposureSummary operator={field.answer?.operator ?? null} current={field.current} />
        </div>
      </div>
    </Panel>
  );
}
