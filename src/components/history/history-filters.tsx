'use client';

import { Button } from '@/components/ui/button';
import { SelectField, type SelectOption } from '@/components/ui/select';
import type { HistoryFilters } from '@/hooks/use-study-history';
import { HISTORY_CATEGORIES, HISTORY_CATEGORY_LABELS, type HistoryCategory } from '@/lib/audit/describe-event';

export interface NamedRef {
  id: number;
  name: string;
}

interface HistoryFilterBarProps {
  filters: HistoryFilters;
  people: NamedRef[];
  plans: NamedRef[];
  onChange: (filters: HistoryFilters) => void;
}

const ANY = '';

/** Choices from a list of named things, with "all" first; a chosen id not in the list still shows. */
function choices(all: string, items: NamedRef[], chosen: number | undefined, unknown: (id: number) => string): SelectOption[] {
  const options = [{ value: ANY, label: all }, ...items.map((item) => ({ value: String(item.id), label: item.name }))];
  if (chosen !== undefined && !items.some((item) => item.id === chosen)) options.push({ value: String(chosen), label: unknown(chosen) });
  return options;
}

const KIND_OPTIONS: SelectOption[] = [
  { value: ANY, label: 'All kinds' },
  ...HISTORY_CATEGORIES.map((category) => ({ value: category, label: HISTORY_CATEGORY_LABELS[category] })),
];

const idOrNone = (value: string) => (value === ANY ? undefined : Number(value));

/** Narrow the history to one person, one kind of work, one plan; each choice applies at once. */
export function HistoryFilterBar({ filters, people, plans, onChange }: HistoryFilterBarProps) {
  const filtered = filters.actorId !== undefined || filters.category !== undefined || filters.planId !== undefined;
  return (
    <form role="search" aria-label="Filter the history" className="flex flex-wrap items-end gap-4" onSubmit={(event) => event.preventDefault()}>
      <SelectField
        label="Person"
        className="w-56"
        value={filters.actorId === undefined ? ANY : String(filters.actorId)}
        options={choices('Everyone', people, filters.actorId, (id) => `Person ${id}`)}
        onChange={(event) => onChange({ ...filters, actorId: idOrNone(event.target.value) })}
      />
      <SelectField
        label="Kind"
        className="w-44"
        value={filters.category ?? ANY}
        options={KIND_OPTIONS}
        onChange={(event) => onChange({ ...filters, category: event.target.value === ANY ? undefined : (event.target.value as HistoryCategory) })}
      />
      <SelectField
        label="Plan"
        className="w-64"
        value={filters.planId === undefined ? ANY : String(filters.planId)}
        options={choices('All plans', plans, filters.planId, (id) => `Plan ${id} (deleted)`)}
        onChange={(event) => onChange({ ...filters, planId: idOrNone(event.target.value) })}
      />
      {filtered && (
        <Button variant="ghost" onClick={() => onChange({})}>
          Clear filters
        </Button>
      )}
    </form>
  );
}
