import Papa from 'papaparse';
import { METHOD_SPECS, MEASUREMENT_METHODS, type MeasurementMethod } from '@/physics/measurement/methods';
import { readMethod } from '@/lib/readings/csv-cells';
import { CSV_RAW_FIELDS } from '@/lib/readings/csv-fields';

/** What the import form reads from a chosen file in the browser before anything is sent. */

const withoutBom = (text: string) => text.replace(/^\uFEFF/, '');

/** The header row: the first non-empty row, cells trimmed. */
export function csvHeaders(text: string): string[] {
  const { data } = Papa.parse<string[]>(withoutBom(text), { preview: 20, skipEmptyLines: 'greedy' });
  return (data[0] ?? []).map((cell) => cell.trim());
}

/** The methods a method column names, in the app's order (unreadable cells are the server's to report). */
export function methodsInColumn(text: string, column: string): MeasurementMethod[] {
  const { data } = Papa.parse<string[]>(withoutBom(text), { skipEmptyLines: 'greedy' });
  const index = (data[0] ?? []).map((cell) => cell.trim()).indexOf(column);
  if (index < 0) return [];
  const found = new Set<MeasurementMethod>();
  for (const row of data.slice(1)) {
    const read = readMethod((row[index] ?? '').trim());
    if (read.ok) found.add(read.value);
  }
  return MEASUREMENT_METHODS.filter((m) => found.has(m));
}

export interface MappableField {
  key: string;
  label: string;
  required: boolean;
  kind: (typeof CSV_RAW_FIELDS)[number]['kind'];
}

/** The raw inputs of these methods, labelled as the first of them names each; all of them when none is known. */
export function mappableFields(methods: readonly MeasurementMethod[]): MappableField[] {
  const used = methods.length > 0 ? methods : MEASUREMENT_METHODS;
  return CSV_RAW_FIELDS.filter((field) => field.methods.some((m) => used.includes(m))).map((field) => {
    const specs = used.flatMap((m) => METHOD_SPECS[m].fields.filter((f) => f.key === field.key));
    return { key: field.key, kind: field.kind, label: specs[0]?.label ?? field.label, required: specs.some((f) => f.required) };
  });
}
