'use client';

import { Panel } from '@/components/ui/panel';
import { SelectField } from '@/components/ui/select';
import type { CircuitSpec, Topology } from '@/physics';
import { UnitField } from './unit-field';

const TOPOLOGY_OPTIONS: { value: Topology; label: string }[] = [
  { value: 'SS', label: 'SS: series, series' },
  { value: 'SP', label: 'SP: series, parallel' },
  { value: 'PS', label: 'PS: parallel, series' },
  { value: 'PP', label: 'PP: parallel, parallel' },
];

const positive = (v: number) => (v > 0 ? null : 'must be greater than zero.');
const notNegative = (v: number) => (v >= 0 ? null : 'must not be negative.');

/** The drive circuit of the link. Capacitors left empty are tuned to the frequency, C = 1 / (omega^2 L). */
export function CircuitPanel({ circuit, onChange }: { circuit: CircuitSpec; onChange: (circuit: CircuitSpec) => void }) {
  const set = (patch: Partial<CircuitSpec>) => onChange({ ...circuit, ...patch });
  return (
    <Panel title="Drive circuit" description="Source and load as the link sees them, rms values. A capacitor left empty is tuned to the frequency.">
      <div className="grid gap-4 sm:grid-cols-2 md:grid-cols-3">
        <UnitField label="Frequency" kind="frequency" value={circuit.frequency} defaultUnit="Hz" check={positive} onCommit={(v) => set({ frequency: v! })} />
        <UnitField label="Source voltage" kind="voltage" value={circuit.sourceVoltage} defaultUnit="V" check={notNegative} hint="open-circuit, rms" onCommit={(v) => set({ sourceVoltage: v! })} />
        <UnitField label="Source resistance" kind="resistance" value={circuit.sourceResistance} defaultUnit="ohm" check={notNegative} onCommit={(v) => set({ sourceResistance: v! })} />
        <SelectField
          label="Topology"
          hint="capacitors: transmitter, receiver"
          value={circuit.topology}
          options={TOPOLOGY_OPTIONS}
          onChange={(e) => set({ topology: e.target.value as Topology })}
        />
        <UnitField label="Load resistance" kind="resistance" value={circuit.loadResistance} defaultUnit="ohm" check={positive} onCommit={(v) => set({ loadResistance: v! })} />
        <div aria-hidden="true" className="hidden md:block" />
        <UnitField
          label="Transmitter capacitor" kind="capacitance" value={circuit.txCapacitance ?? null} defaultUnit="F" optional check={positive}
          placeholder="tuned" onCommit={(v) => set({ txCapacitance: v ?? undefined })}
        />
        <UnitField
          label="Receiver capacitor" kind="capacitance" value={circuit.rxCapacitance ?? null} defaultUnit="F" optional check={positive}
          placeholder="tuned" onCommit={(v) => set({ rxCapacitance: v ?? undefined })}
        />
      </div>
    </Panel>
  );
}
