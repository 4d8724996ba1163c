'use client';

import { Fragment, useMemo, useState } from 'react';
import { Button } from '@/components/ui/button';
import { cn } from '@/components/ui/cn';
import { Table, Td, Th } from '@/components/ui/table';
import type { Coil } from '@/lib/data/coils';
import { formatInductance, formatResistance } from '@/lib/units/format';
import { describeDimensions, describeMeasured, describeWire, sizeOf, TABLE_DIGITS, turnsOf } from './coil-format';

type SortKey = 'name' | 'kind' | 'size' | 'turns' | 'wire' | 'inductance' | 'dcResistance' | 'acResistance';
type Sort = { key: SortKey; ascending: boolean };

/** What each sortable column sorts by; coils without a prediction sort last either way. */
const SORT_VALUE: Record<SortKey, (coil: Coil) => string | number | null> = {
  name: (c) => c.name,
  kind: (c) => c.spec.kind,
  size: sizeOf,
  turns: turnsOf,
  wire: (c) => c.spec.wireDiameter,
  inductance: (c) => c.predicted?.selfInductance ?? null,
  dcResistance: (c) => c.predicted?.dcResistance ?? null,
  acResistance: (c) => c.predicted?.acResistance ?? null,
};

const collator = new Intl.Collator('en', { numeric: true, sensitivity: 'base' });

function compare(a: Coil, b: Coil, { key, ascending }: Sort): number {
  const x = SORT_VALUE[key](a);
  const y = SORT_VALUE[key](b);
  if (x === null || y === null) return x === y ? 0 : x === null ? 1 : -1;
  const order = typeof x === 'string' ? collator.compare(x, String(y)) : x - Number(y);
  return (ascending ? order : -order) || collator.compare(a.name, b.name);
}

interface SortableThProps {
  label: string;
  sortKey: SortKey;
  sort: Sort;
  onSort: (key: SortKey) => void;
  className?: string;
  /** Quantity symbols (L, Rdc) keep their case; words are set in capitals like every table head. */
  symbol?: boolean;
}

function SortableTh({ label, sortKey, sort, onSort, className, symbol = false }: SortableThProps) {
  const active = sort.key === sortKey;
  return (
    <Th dense aria-sort={active ? (sort.ascending ? 'ascending' : 'descending') : undefined} className={cn('whitespace-nowrap', className)}>
      <button
        type="button"
        onClick={() => onSort(sortKey)}
        className={cn('inline-flex items-center gap-1 tracking-wide hover:text-ink-800 hover:underline', symbol ? 'text-sm normal-case' : 'uppercase')}
      >
        {label}
        {/* only the active column shows its direction; the others are buttons all the same */}
        {active && (
          <span aria-hidden="true" className="text-copper-600">
            {sort.ascending ? '▲' : '▼'}
          </span>
        )}
      </button>
    </Th>
  );
}

/** Phrases that each stay on one line; the cell wraps only between them. */
function Parts({ parts }: { parts: string[] }) {
  return parts.map((part, index) => (
    <Fragment key={part}>
      <span className="whitespace-nowrap">
        {part}
        {index < parts.length - 1 && ','}
      </span>
      {index < parts.length - 1 && ' '}
    </Fragment>
  ));
}

interface CoilTableProps {
  coils: Coil[];
  canEdit: boolean;
  /** The coil whose delete is being confirmed or sent. */
  pendingDeleteId: number | null;
  busy: boolean;
  onEdit: (coil: Coil) => void;
  onAskDelete: (coil: Coil | null) => void;
  onDelete: (coil: Coil) => void;
}

/** The study's coils, sortable by any column; predicted values are at the study frequency. */
export function CoilTable({ coils, canEdit, pendingDeleteId, busy, onEdit, onAskDelete, onDelete }: CoilTableProps) {
  const [sort, setSort] = useState<Sort>({ key: 'name', ascending: true });
  const sorted = useMemo(() => [...coils].sort((a, b) => compare(a, b, sort)), [coils, sort]);
  const onSort = (key: SortKey) => setSort((s) => ({ key, ascending: s.key === key ? !s.ascending : true }));
  const th = { sort, onSort };
  const predicted = (value: number | undefined, format: (v: number, d: number) => string) => (value === undefined ? '—' : format(value, TABLE_DIGITS));

  return (
    <Table caption="Coils of this study">
      <thead>
        <tr>
          <SortableTh label="Name" sortKey="name" {...th} />
          <SortableTh label="Kind" sortKey="kind" {...th} />
          <SortableTh label="Dimensions" sortKey="size" {...th} />
          <SortableTh label="Turns" sortKey="turns" {...th} className="text-right" />
          <SortableTh label="Wire" sortKey="wire" {...th} />
          <SortableTh label="L" sortKey="inductance" symbol {...th} className="text-right" />
          <SortableTh label="Rdc" sortKey="dcResistance" symbol {...th} className="text-right" />
          <SortableTh label="Rac" sortKey="acResistance" symbol {...th} className="text-right" />
          <Th dense>Measured</Th>
          {canEdit && (
            <Th dense>
              <span className="sr-only">Actions</span>
            </Th>
          )}
        </tr>
      </thead>
      <tbody>
        {sorted.map((coil) => {
          const wire = describeWire(coil);
          const measured = describeMeasured(coil);
          return (
            <tr key={coil.id}>
              <Td dense className="min-w-36 font-medium text-ink-900">
                {coil.name}
                {coil.notes && <p className="line-clamp-1 max-w-60 text-xs font-normal text-ink-500" title={coil.notes}>{coil.notes}</p>}
              </Td>
              <Td dense>{coil.spec.kind}</Td>
              <Td dense className="tabular-nums">
                <Parts parts={describeDimensions(coil)} />
              </Td>
              <Td dense className="text-right tabular-nums">{turnsOf(coil)}</Td>
              <Td dense className="whitespace-nowrap tabular-nums">
                {wire.main}
                {wire.detail && <p className="text-xs text-ink-500">{wire.detail}</p>}
              </Td>
              <Td dense className="whitespace-nowrap text-right tabular-nums">{predicted(coil.predicted?.selfInductance, formatInductance)}</Td>
              <Td dense className="whitespace-nowrap text-right tabular-nums">{predicted(coil.predicted?.dcResistance, formatResistance)}</Td>
              <Td dense className="whitespace-nowrap text-right tabular-nums">{predicted(coil.predicted?.acResistance, formatResistance)}</Td>
              <Td dense className="tabular-nums text-ink-700">
                {measured ? (
                  <>
                    <Parts parts={measured.values} />
                    {measured.at && <p className="text-xs text-ink-500">{measured.at}</p>}
                  </>
                ) : (
                  <span className="text-ink-400">—</span>
                )}
              </Td>
              {canEdit && (
                // relative: the buttons' sr-only text must not stick out of the scrolling table
                <Td dense className="relative whitespace-nowrap text-right">
                  {pendingDeleteId === coil.id ? (
                    <span className="inline-flex gap-2">
                      <Button size="sm" variant="danger" disabled={busy} onClick={() => onDelete(coil)}>
                        Confirm delete<span className="sr-only"> {coil.name}</span>
                      </Button>
                      <Button size="sm" variant="ghost" disabled={busy} onClick={() => onAskDelete(null)}>
                        Keep
                      </Button>
                    </span>
                  ) : (
                    <span className="inline-flex gap-2">
                      <Button size="sm" disabled={busy} onClick={() => onEdit(coil)}>
                        Edit<span className="sr-only"> {coil.name}</span>
                      </Button>
                      <Button size="sm" variant="danger" disabled={busy} onClick={() => onAskDelete(coil)}>
                        Delete<span className="sr-only"> {coil.name}</span>
                      </Button>
                    </span>
                  )}
                </Td>
              )}
            </tr>
          );
        })}
      </tbody>
    </Table>
  );
}
