'use client';

import { Panel } from '@/components/ui/panel';
import type { BenchPlacement } from './bench-types';
import { cmToMetres, metresToCm } from './format-quantity';
import { NumberSliderField } from './number-slider-field';

/** Largest magnitude typed into the placement fields [cm]; the API accepts up to 100 m. */
const HARD_LIMIT_CM = 10_000;

/**
 * Distance, lateral offset and tilt in the units people use at the bench (cm, degrees); the bench keeps
 * them in SI. Slider ranges follow the coils' size; typing may go beyond them.
 */
export function PlacementPanel({ placement, sceneSize, onChange, onSlideActive }: {
  placement: BenchPlacement;
  /** largest coil extent [m] */
  sceneSize: number;
  onChange: (placement: BenchPlacement) => void;
  onSlideActive: (active: boolean) => void;
}) {
  const rangeCm = Math.max(30, Math.ceil((sceneSize * 100 * 4) / 10) * 10);
  const set = (patch: Partial<BenchPlacement>) => onChange({ ...placement, ...patch });
  return (
    <Panel title="Receiver placement" description="Centre at (offset, 0, distance); tilt turns its axis from +z toward +x.">
      <div className="space-y-4">
        <NumberSliderField
          label="Distance" unit="cm" value={metresToCm(placement.distance)} min={0} max={rangeCm} step={0.1}
          hardMin={-HARD_LIMIT_CM} hardMax={HARD_LIMIT_CM} decimals={2}
          onChange={(cm) => set({ distance: cmToMetres(cm) })} onSlideActive={onSlideActive}
        />
        <NumberSliderField
          label="Lateral offset" unit="cm" value={metresToCm(placement.lateralOffset)} min={-rangeCm / 2} max={rangeCm / 2} step={0.1}
          hardMin={-HARD_LIMIT_CM} hardMax={HARD_LIMIT_CM} decimals={2}
          onChange={(cm) => set({ lateralOffset: cmToMetres(cm) })} onSlideActive={onSlideActive}
        />
        <NumberSliderField
          label="Tilt" unit="degrees" value={placement.tiltDeg} min={-90} max={90} step={0.5}
          hardMin={-180} hardMax={180} decimals={1}
          onChange={(deg) => set({ tiltDeg: deg })} onSlideActive={onSlideActive}
        />
      </div>
    </Panel>
  );
}
