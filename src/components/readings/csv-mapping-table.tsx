'use client';

import { cn } from '@/components/ui/cn';
import { controlClasses, TextField } from '@/components/ui/field';
import { Select, SelectField, type SelectOption } from '@/components/ui/select';
import { Table, Td, Th } from '@/components/ui/table';
import type { CsvColumnMap } from '@/lib/readings/csv-mapping';
import { siUnit } from '@/lib/readings/csv-fields';
import { MEASUREMENT_METHODS, METHOD_SPECS, isMeasurementMethod, type MeasurementMethod } from '@/physics/measurement/methods';
import { mappableFields } from './csv-file';

interface CsvMappingTableProps {
  headers: string[];
  mapping: CsvColumnMap;
  /** the methods the file's method column names (empty: not known, every field is offered) */
  methodsInFile: readonly MeasurementMethod[];
  onChange: (mapping: CsvColumnMap) => void;
}

const PER_ROW = 'per-row';
type Circumstance = 'instrument' | 'calibration' | 'temperatureC' | 'setupNotes';
const CIRCUMSTANCE_LABELS: Record<Circumstance, string> = {
  instrument: 'Instrument column',
  calibration: 'Calibration column',
  temperatureC: 'Temperature column (°C)',
  setupNotes: 'Notes column',
};

/**
 * Which column holds what: the point's seq, the repeat, the method (one for the file or a column),
 * each raw input with the unit of its bare numbers, and, folded away, the circumstances and accuracy.
 */
export function CsvMappingTable({ headers, mapping, methodsInFile, onChange }: CsvMappingTableProps) {
  const columns: SelectOption[] = headers.filter((h) => h !== '').map((h) => ({ value: h, label: h }));
  const none = (label: string): SelectOption[] => [{ value: '', label }, ...columns];
  const methods = mapping.methodColumn !== null ? methodsInFile : mapping.method ? [mapping.method] : [];
  const fields = mappableFields(methods);
  const update = (patch: Partial<CsvColumnMap>) => onChange({ ...mapping, ...patch });
  const setField = (key: string, value: { column: string; unit: string } | null) => {
    const next = { ...mapping.fields };
    if (value) next[key] = value;
    else delete next[key];
    update({ fields: next });
  };
  const setCircumstance = (key: Circumstance, column: string) => update({ circumstances: { ...mapping.circumstances, [key]: column || null } });
  const setAccuracy = (key: 'relative' | 'phaseDeg', text: string, scale: number) =>
    update({ circumstances: { ...mapping.circumstances, accuracy: { ...mapping.circumstances.accuracy, [key]: text === '' ? Number.NaN : Number(text) / scale } } });

  return (
    <div className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-3">
        <SelectField label="Seq column" options={none('Choose a column')} value={mapping.seqColumn} onChange={(e) => update({ seqColumn: e.target.value })} />
        <SelectField label="Repeat column" hint="Checked against the run sheet." options={none('Not in the file')} value={mapping.repeatColumn ?? ''} onChange={(e) => update({ repeatColumn: e.target.value || null })} />
        <SelectField
          label="Method"
          options={[{ value: '', label: 'Choose a method' }, ...MEASUREMENT_METHODS.map((m) => ({ value: m, label: METHOD_SPECS[m].label })), { value: PER_ROW, label: 'Named in a column of the file' }]}
          value={mapping.methodColumn !== null ? PER_ROW : mapping.method ?? ''}
          onChange={(e) => {
            const value = e.target.value;
            if (value === PER_ROW) update({ method: null, methodColumn: mapping.methodColumn ?? columns[0]?.value ?? '' });
            else update({ method: isMeasurementMethod(value) ? value : null, methodColumn: null });
          }}
        />
        {mapping.methodColumn !== null && (
          <SelectField label="Method column" hint="Each cell holds a method’s id or name." options={none('Choose a column')} value={mapping.methodColumn} onChange={(e) => update({ methodColumn: e.target.value })} />
        )}
      </div>

      <Table caption="Columns of the measured values">
        <thead>
          <tr>
            <Th dense>Value</Th>
            <Th dense>Column</Th>
            <Th dense>Unit of bare numbers</Th>
          </tr>
        </thead>
        <tbody>
          {fields.map((field) => {
            const mapped = mapping.fields[field.key];
            return (
              <tr key={field.key}>
                <Td dense>
                  {field.label}
                  {field.required && <span className="text-ink-500"> (required)</span>}
                </Td>
                <Td dense>
                  <Select
                    aria-label={`Column of ${field.label}`}
                    options={none('Not in the file')}
                    value={mapped?.column ?? ''}
                    onChange={(e) => setField(field.key, e.target.value ? { column: e.target.value, unit: mapped?.unit || siUnit(field.kind) } : null)}
                  />
                </Td>
                <Td dense>
                  <input
                    aria-label={`Unit of ${field.label}`}
                    className={cn(controlClasses(false), 'h-9 max-w-32')}
                    value={mapped?.unit ?? ''}
                    placeholder={siUnit(field.kind)}
                    disabled={!mapped}
                    onChange={(e) => mapped && setField(field.key, { ...mapped, unit: e.target.value })}
                  />
                </Td>
              </tr>
            );
          })}
        </tbody>
      </Table>

      <details className="rounded-md border border-ink-200 px-4 py-3">
        <summary className="cursor-pointer text-sm font-medium text-ink-800">Instrument, calibration, temperature, notes and accuracy</summary>
        <div className="mt-3 grid gap-4 sm:grid-cols-2">
          {(Object.keys(CIRCUMSTANCE_LABELS) as Circumstance[]).map((key) => (
            <SelectField key={key} label={CIRCUMSTANCE_LABELS[key]} options={none('Not in the file')} value={mapping.circumstances[key] ?? ''} onChange={(e) => setCircumstance(key, e.target.value)} />
          ))}
          <TextField
            label="Relative accuracy (%)"
            hint="Of every magnitude in the file, as the instrument's data sheet gives it."
            type="number"
            step="any"
            min={0}
            value={Number.isNaN(mapping.circumstances.accuracy.relative) ? '' : String(Number((mapping.circumstances.accuracy.relative * 100).toPrecision(6)))}
            onChange={(e) => setAccuracy('relative', e.target.value, 100)}
          />
          <TextField
            label="Phase accuracy (°)"
            type="number"
            step="any"
            min={0}
            value={Number.isNaN(mapping.circumstances.accuracy.phaseDeg) ? '' : String(mapping.circumstances.accuracy.phaseDeg)}
            onChange={(e) => setAccuracy('phaseDeg', e.target.value, 1)}
          />
        </div>
      </details>
    </div>
  );
}
