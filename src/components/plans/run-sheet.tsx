'use client';

import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createSortedRowModel,
  globalFilteringFeature,
  rowSortingFeature,
  sortFn_basic,
  tableFeatures,
  useTable,
  type Row,
} from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { TextField } from '@/components/ui/field';
import { Select } from '@/components/ui/select';
import { Td, Th } from '@/components/ui/table';
import type { AxisSpec, PlanPoint } from './plan-types';
import { formatPredicted, predictedInfo } from './predicted-quantities';
import { poseColumnTitle, runSheetRows, SHEET_PREDICTED, type RunSheetRow } from './run-sheet-rows';

const features = tableFeatures({
  columnFilteringFeature,
  globalFilteringFeature,
  rowSortingFeature,
  filteredRowModel: createFilteredRowModel(),
  sortedRowModel: createSortedRowModel(),
  filterFns: {
    /** the text box: matches anything the row shows */
    rowText: (row: Row<any, any>, _columnId: string, filterValue: string) => (row.original as RunSheetRow).text.includes(String(filterValue).trim().toLowerCase()),
    /** the per-column selects: one exact value */
    sameText: (row: Row<any, any>, columnId: string, filterValue: string) => String(row.getValue(columnId) ?? '') === filterValue,
  },
  sortFns: { basic: sortFn_basic },
});

const helper = createColumnHelper<typeof features, RunSheetRow>();

/** The run sheet: every point in measurement order, sortable, with a text filter and per-column filters. */
export function RunSheet({ axes, points }: { axes: AxisSpec[]; points: PlanPoint[] }) {
  const data = useMemo(() => runSheetRows(points, axes), [points, axes]);
  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('seq', { header: '#', sortFn: 'basic', enableGlobalFilter: true, filterFn: 'sameText' }),
        helper.accessor('repeat', { header: 'Repeat', sortFn: 'basic', filterFn: 'sameText' }),
        helper.accessor('reference', { header: 'Reference', filterFn: 'sameText', cell: (info) => (info.getValue() ? 'reference' : '') }),
        ...axes.map((axis) =>
          helper.accessor((row) => row.pose[axis.quantity] ?? null, {
            id: axis.quantity,
            header: poseColumnTitle(axis),
            sortFn: 'basic',
            filterFn: 'sameText',
            sortUndefined: 'last',
          }),
        ),
        ...SHEET_PREDICTED.map((key) =>
          helper.accessor((row) => row.predicted[key] ?? null, {
            id: key,
            header: predictedInfo(key).label,
            sortFn: 'basic',
            enableColumnFilter: false,
            cell: (info) => formatPredicted(info.getValue() as number | null, key),
          }),
        ),
      ]),
    [axes],
  );
  const [globalFilter, setGlobalFilter] = useState('');
  const table = useTable({
    features,
    columns,
    data,
    globalFilterFn: 'rowText',
    state: { globalFilter },
    onGlobalFilterChange: setGlobalFilter,
  });

  // Per-column filters where a column has few values people pick from: reference, repeat, each axis.
  const choicesOf = (columnId: string) => [...new Set(data.map((row) => String(columnId === 'reference' ? row.reference : columnId === 'repeat' ? row.repeat : (row.pose as Record<string, number>)[columnId] ?? '')))];
  const rows = table.getRowModel().rows;

  return (
    <div className="space-y-3">
      <div className="px-5 pt-4">
        <TextField label="Filter rows" placeholder="e.g. reference, 30, 5" value={globalFilter} onChange={(e) => setGlobalFilter(e.target.value)} className="max-w-xs" />
      </div>
      <p className="px-5 text-sm text-ink-600" role="status">
        {rows.length.toLocaleString('en')} of {data.length.toLocaleString('en')} points
      </p>
      <div className="max-h-[32rem] overflow-auto">
        <table className="min-w-full text-left text-sm" aria-label="Run sheet">
          <thead className="sticky top-0">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <Th key={header.id} dense aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}>
                      <button type="button" className="uppercase hover:text-ink-800" onClick={header.column.getToggleSortingHandler()}>
                        <table.FlexRender header={header} />
                        {sorted === 'asc' ? ' ▲' : sorted === 'desc' ? ' ▼' : ''}
                      </button>
                    </Th>
                  );
                })}
              </tr>
            ))}
            <tr>
              {table.getHeaderGroups()[0].headers.map((header) => {
                const id = header.column.id;
                const filterable = id === 'reference' || id === 'repeat' || axes.some((a) => a.quantity === id);
                return (
                  <Th key={`${header.id}-filter`} dense className="normal-case">
                    {filterable && (
                      <Select
                        aria-label={`Filter ${typeof header.column.columnDef.header === 'string' ? header.column.columnDef.header : id}`}
                        value={String(header.column.getFilterValue() ?? '')}
                        onChange={(e) => header.column.setFilterValue(e.target.value === '' ? undefined : e.target.value)}
                        options={[{ value: '', label: 'all' }, ...choicesOf(id).map((v) => ({ value: v, label: v === '' ? '(none)' : v }))]}
                        className="h-8 w-24 text-xs"
                      />
                    )}
                  </Th>
                );
              })}
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className={row.original.reference ? 'bg-copper-50/60' : undefined}>
                {row.getAllCells().map((cell) => (
                  <Td key={cell.id} dense className="font-mono tabular-nums">
                    <table.FlexRender cell={cell} />
                  </Td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
