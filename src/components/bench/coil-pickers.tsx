'use client';

import Link from 'next/link';
import { SelectField } from '@/components/ui/select';
import type { Coil } from './bench-types';

function describe(c: Coil): string {
  const s = c.spec;
  const kind = s.kind === 'loop' ? 'loop' : s.kind === 'helix' ? `helix, ${s.turns} turns` : `spiral, ${s.turns} turns`;
  return `${c.name} (${kind})`;
}

/** Which of the study's coils transmits and which receives. */
export function CoilPickers({ studyId, coils, transmitterId, receiverId, onChange }: {
  studyId: number;
  coils: Coil[];
  transmitterId: number | null;
  receiverId: number | null;
  onChange: (ids: { transmitterCoilId: number; receiverCoilId: number }) => void;
}) {
  const options = coils.map((c) => ({ value: String(c.id), label: describe(c) }));
  const tx = transmitterId ?? coils[0]?.id;
  const rx = receiverId ?? coils[0]?.id;
  return (
    <div className="grid gap-4 sm:grid-cols-[1fr_1fr_auto] sm:items-end">
      <SelectField label="Transmitter coil" value={String(tx)} options={options} onChange={(e) => onChange({ transmitterCoilId: Number(e.target.value), receiverCoilId: rx })} />
      <SelectField label="Receiver coil" value={String(rx)} options={options} onChange={(e) => onChange({ transmitterCoilId: tx, receiverCoilId: Number(e.target.value) })} />
      <Link href={`/studies/${studyId}/coils`} className="pb-2 text-sm font-medium text-flux-700 hover:underline">
        Coil library
      </Link>
    </div>
  );
}
