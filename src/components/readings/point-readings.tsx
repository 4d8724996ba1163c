'use client';

import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { formatDateTime } from '@/components/ui/format-date';
import type { PointPrediction } from '@/components/plans/plan-types';
import { CALIBRATION_LABELS } from '@/lib/validations/reading';
import { DerivedValues } from './derived-values';
import { formatRaw } from './format-measured';
import { poseLabel } from './pose-label';
import { METHOD_SPECS, type MeasurementMethod, type Reading } from './reading-types';

const SOURCE_LABEL: Record<Reading['source'], string> = { form: 'typed in', csv: 'CSV import', touchstone: 'Touchstone file' };

function RawValues({ reading }: { reading: Reading }) {
  const spec = METHOD_SPECS[reading.method];
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-0.5 text-xs text-ink-700">
      {spec.fields
        .filter((field) => reading.raw[field.key] !== undefined)
        .map((field) => (
          <div key={field.key} className="contents">
            <dt>{field.label}</dt>
            <dd className="whitespace-nowrap font-mono tabular-nums">{formatRaw(reading.raw[field.key], field.kind)}</dd>
          </div>
        ))}
    </dl>
  );
}

function Circumstances({ reading }: { reading: Reading }) {
  const parts = [
    reading.instrument || 'instrument not named',
    `accuracy ${Number((reading.accuracy.relative * 100).toPrecision(3))} %, ${reading.accuracy.phaseDeg}\u00b0`,
    `calibration ${CALIBRATION_LABELS[reading.calibration]}`,
    reading.temperatureC !== null ? `${reading.temperatureC} \u00b0C` : null,
    SOURCE_LABEL[reading.source],
  ].filter(Boolean);
  return (
    <p className="text-xs text-ink-500">
      {parts.join(' \u00b7 ')}
      {reading.achievedPose && <> · achieved pose {poseLabel({ ...reading.achievedPose })}</>}
      {reading.setupNotes && <> · “{reading.setupNotes}”</>}
    </p>
  );
}

interface PointReadingsProps {
  readings: Reading[];
  predicted: PointPrediction | null;
  /** the viewer may correct this chain (logged it, may log, plan on the bench) */
  canCorrect: (first: Reading) => boolean;
  onCorrect: (reading: Reading) => void;
}

/**
 * The readings of one point, one block per method: the current version with its derived values, then
 * the earlier versions with the reason each was corrected. Nothing here is ever edited in place.
 */
export function PointReadings({ readings, predicted, canCorrect, onCorrect }: PointReadingsProps) {
  const byMethod = new Map<MeasurementMethod, Reading[]>();
  for (const reading of readings) byMethod.set(reading.method, [...(byMethod.get(reading.method) ?? []), reading]);
  if (byMethod.size === 0) return <p className="text-sm text-ink-600">No readings at this point yet.</p>;
  return (
    <div className="space-y-4">
      {[...byMethod.entries()].map(([method, chain]) => {
        const versions = [...chain].sort((a, b) => b.version - a.version);
        const [current, ...earlier] = versions;
        const first = versions[versions.length - 1];
        return (
          <article key={method} className="rounded-md border border-ink-200 p-4" aria-label={`${METHOD_SPECS[method].label} reading`}>
            <header className="mb-2 flex flex-wrap items-center justify-between gap-2">
              <div className="flex items-center gap-2">
                <h3 className="text-sm font-semibold text-ink-900">{METHOD_SPECS[method].label}</h3>
                <Badge tone={current.version > 1 ? 'copper' : 'neutral'}>version {current.version}</Badge>
              </div>
              {canCorrect(first) && (
                <Button size="sm" onClick={() => onCorrect(current)}>
                  Correct
                </Button>
              )}
            </header>
            <p className="mb-2 text-xs text-ink-500">
              {current.createdBy.name}, {formatDateTime(current.createdAt)}
              {current.correctionReason && <> · corrected because: “{current.correctionReason}”</>}
            </p>
            <div className="grid gap-4 lg:grid-cols-[minmax(0,17rem)_1fr]">
              <RawValues reading={current} />
              <DerivedValues derived={current.derived} predicted={predicted} />
            </div>
            <div className="mt-2">
              <Circumstances reading={current} />
            </div>
            {earlier.length > 0 && (
              <details className="mt-3 rounded-md bg-ink-50 px-3 py-2">
                <summary className="cursor-pointer text-sm font-medium text-ink-700">History: {earlier.length} earlier {earlier.length === 1 ? 'version' : 'versions'}</summary>
                <ol className="mt-2 space-y-3">
                  {earlier.map((old) => (
                    <li key={old.id} className="border-l-2 border-ink-300 pl-3" data-version={old.version}>
                      <p className="text-xs text-ink-600">
                        Version {old.version} by {old.createdBy.name}, {formatDateTime(old.createdAt)}
                        {old.correctionReason && <> · corrected because: “{old.correctionReason}”</>}
                      </p>
                      <div className="mt-1 grid gap-3 lg:grid-cols-[minmax(0,17rem)_1fr]">
                        <RawValues reading={old} />
                        <DerivedValues derived={old.derived} predicted={predicted} />
                      </div>
                    </li>
                  ))}
                </ol>
              </details>
            )}
          </article>
        );
      })}
    </div>
  );
}
