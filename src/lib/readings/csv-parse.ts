import Papa from 'papaparse';
import { METHOD_SPECS, type MeasurementMethod, type RawFieldSpec } from '../../physics/measurement/methods';
import type { QuantityParse } from '../units/quantity';
import { readingCreateSchema, type ReadingCreate } from '../validations/reading';
import type { CsvColumnMap } from '../validations/reading-import';
import { columnReader, csvRawField } from './csv-fields';
import { readCalibration, readMethod, readRepeat, readSeq, readTemperature, type CellRead } from './csv-cells';

/**
 * Reads a readings CSV with its mapping into one reading per row, each with the problems that keep
 * it from being stored. Checks that need the plan (the point exists, is not read yet) are the
 * server's (src/lib/data/reading-import.ts). Pure: runs in the browser and on the server.
 */

/** Most data rows one file may hold (a plan has at most 5,000 points; a few methods each). */
export const MAX_IMPORT_ROWS = 20_000;

/**
 * `field` is where in the reading the problem is ("seq", "method", "raw.rxVoltage", "temperatureC") or,
 * for the file as a whole, in the mapping ("mapping.fields.rxVoltage.column") or "csv".
 */
export interface CsvProblem {
  field: string;
  /** the header of the column at fault, when there is one */
  column: string | null;
  message: string;
}

export type CsvReadingInput = Omit<ReadingCreate, 'pointId'>;

export interface CsvReadingRow {
  /** 1-based line of the file where the row starts (the header is a line too) */
  line: number;
  seq: number | null;
  /** the repeat the file states, null when it states none */
  repeat: number | null;
  method: MeasurementMethod | null;
  /** the reading as readingCreateSchema outputs it (without the point), null when the row has problems */
  input: CsvReadingInput | null;
  problems: CsvProblem[];
}

export interface ParsedReadingsCsv {
  headers: string[];
  rows: CsvReadingRow[];
  /** problems of the file or the mapping as a whole (no data rows, a mapped column the file lacks) */
  fileProblems: CsvProblem[];
}

type Circumstance = 'instrument' | 'calibration' | 'temperatureC' | 'setupNotes';
const CIRCUMSTANCES: readonly Circumstance[] = ['instrument', 'calibration', 'temperatureC', 'setupNotes'];
interface FieldColumn { index: number; column: string; unit: string }

/** The mapped columns and where the mapping names them, to check them against the header. */
function mappedColumns(map: CsvColumnMap): { path: string; column: string }[] {
  const columns = [{ path: 'mapping.seqColumn', column: map.seqColumn }];
  if (map.repeatColumn) columns.push({ path: 'mapping.repeatColumn', column: map.repeatColumn });
  if (map.methodColumn) columns.push({ path: 'mapping.methodColumn', column: map.methodColumn });
  for (const [key, field] of Object.entries(map.fields)) if (field) columns.push({ path: `mapping.fields.${key}.column`, column: field.column });
  for (const key of CIRCUMSTANCES) {
    const column = map.circumstances[key];
    if (column) columns.push({ path: `mapping.circumstances.${key}`, column });
  }
  return columns;
}

/** Inputs of a method the mapping gives no column for: required ones, and whether no alternative group is complete. */
function mappingGaps(method: MeasurementMethod, fields: Map<string, FieldColumn>) {
  const spec = METHOD_SPECS[method];
  const required = spec.fields.filter((f) => f.required && !fields.has(f.key)).map((f) => f.key);
  const noGroup = spec.alternatives ? !spec.alternatives.some((group) => group.every((key) => fields.has(key))) : false;
  return { required, noGroup };
}

function gapProblems(method: MeasurementMethod, fields: Map<string, FieldColumn>): CsvProblem[] {
  const spec = METHOD_SPECS[method];
  const label = (key: string) => spec.fields.find((f) => f.key === key)?.label ?? key;
  const gaps = mappingGaps(method, fields);
  const problems = gaps.required.map((key) => ({ field: `mapping.fields.${key}.column`, column: null, message: `Choose the column of ${label(key)}: ${spec.label} needs it.` }));
  if (gaps.noGroup) {
    const groups = spec.alternatives!.map((group) => group.map(label).join(', '));
    problems.push({ field: `mapping.fields.${spec.alternatives![0][0]}.column`, column: null, message: `Choose the columns of ${groups.join(' or of ')}: ${spec.label} needs one set.` });
  }
  return problems;
}

function rowReader(headers: string[], map: CsvColumnMap) {
  const index = new Map<string, number>();
  headers.forEach((header, i) => { if (!index.has(header)) index.set(header, i); });
  const at = (column: string | null) => (column === null ? -1 : index.get(column)!);
  const fields = new Map<string, FieldColumn>();
  for (const [key, field] of Object.entries(map.fields)) {
    const spec = csvRawField(key);
    if (field && spec) fields.set(key, { index: at(field.column), column: field.column, unit: field.unit });
  }
  // one reader per method and input, so a message names the input as that method labels it
  const readers = new Map<string, (text: string) => QuantityParse>();
  const readerOf = (spec: RawFieldSpec, column: FieldColumn) => {
    const id = `${spec.key}:${spec.label}`;
    return readers.get(id) ?? readers.set(id, columnReader(spec.kind, column.unit, spec.label)).get(id)!;
  };
  const columnOf = (path: string): string | null => {
    const [head, key] = path.split('.');
    if (head === 'raw') return fields.get(key)?.column ?? null;
    return CIRCUMSTANCES.includes(head as Circumstance) ? map.circumstances[head as Circumstance] : null;
  };
  const gapCache = new Map<MeasurementMethod, ReturnType<typeof mappingGaps>>();
  const gapsOf = (method: MeasurementMethod) => gapCache.get(method) ?? gapCache.set(method, mappingGaps(method, fields)).get(method)!;
  const seqAt = at(map.seqColumn);
  const repeatAt = at(map.repeatColumn);
  const methodAt = at(map.methodColumn);
  const circumstanceAt = (key: Circumstance) => at(map.circumstances[key]);

  return {
    fields,
    read(cells: string[], line: number): CsvReadingRow {
      const cell = (i: number) => (i < 0 ? '' : cells[i] ?? '');
      const problems: CsvProblem[] = [];
      const take = <T, F>(read: CellRead<T>, field: string, column: string | null, fallback: F): T | F => {
        if (read.ok) return read.value;
        problems.push({ field, column, message: read.message });
        return fallback;
      };
      const seq = take(readSeq(cell(seqAt)), 'seq', map.seqColumn, null);
      const repeat = take(readRepeat(cell(repeatAt)), 'repeat', map.repeatColumn, null);
      const method = map.methodColumn === null ? map.method : take(readMethod(cell(methodAt)), 'method', map.methodColumn, null);
      if (method === null) return { line, seq, repeat, method, input: null, problems };

      const raw: Record<string, number> = {};
      const unreadable = new Set<string>();
      for (const spec of METHOD_SPECS[method].fields) {
        const column = fields.get(spec.key);
        if (!column) continue;
        const read = readerOf(spec, column)(cell(column.index));
        if (!read.ok) {
          problems.push({ field: `raw.${spec.key}`, column: column.column, message: read.message });
          unreadable.add(spec.key);
        } else if (read.value !== null) {
          raw[spec.key] = read.value;
        }
      }
      const candidate = {
        pointId: 1, // stands in for the point, which the server resolves from the seq
        method,
        raw,
        accuracy: map.circumstances.accuracy,
        achievedPose: null,
        instrument: cell(circumstanceAt('instrument')),
        calibration: take(readCalibration(cell(circumstanceAt('calibration'))), 'calibration', map.circumstances.calibration, 'unknown' as const),
        temperatureC: take(readTemperature(cell(circumstanceAt('temperatureC'))), 'temperatureC', map.circumstances.temperatureC, null),
        setupNotes: cell(circumstanceAt('setupNotes')),
      };
      const parsed = readingCreateSchema.safeParse(candidate);
      if (!parsed.success) {
        const gaps = gapsOf(method);
        const alternativesKey = METHOD_SPECS[method].alternatives?.[0][0];
        for (const issue of parsed.error.issues) {
          const path = issue.path.map(String).join('.');
          const key = issue.path[0] === 'raw' ? String(issue.path[1]) : null;
          // "enter either ... or ..." about an empty set follows from an unreadable cell or a set without columns
          const incompleteSet = key !== null && key === alternativesKey && raw[key] === undefined && (unreadable.size > 0 || gaps.noGroup);
          // a cell that could not be read is reported once; a field without a column once for the file
          if (key !== null && (unreadable.has(key) || gaps.required.includes(key) || incompleteSet)) continue;
          problems.push({ field: path, column: columnOf(path), message: issue.message });
        }
      }
      const input = parsed.success && problems.length === 0 ? (({ pointId: _point, ...rest }) => rest)(parsed.data) : null;
      return { line, seq, repeat, method, input, problems };
    },
  };
}

/** Newlines in text[from, to). */
function countNewlines(text: string, from: number, to: number): number {
  let count = 0;
  for (let i = text.indexOf('\n', from); i !== -1 && i < to; i = text.indexOf('\n', i + 1)) count++;
  return count;
}

/**
 * Reads the file: the first non-empty line is the header; empty lines are skipped; cells are trimmed.
 * A mapped column the header lacks stops the reading (every row would fail the same way).
 */
export function parseReadingsCsv(text: string, map: CsvColumnMap): ParsedReadingsCsv {
  const source = text.replace(/^\uFEFF/, '');
  const fileProblems: CsvProblem[] = [];
  const rows: CsvReadingRow[] = [];
  let headers: string[] | null = null;
  let reader: ReturnType<typeof rowReader> | null = null;
  let line = 1;
  let counted = 0;
  let rowStart = 0;

  Papa.parse<string[]>(source, {
    header: false,
    skipEmptyLines: false,
    step: (result, parser) => {
      line += countNewlines(source, counted, rowStart);
      counted = rowStart;
      const start = line;
      rowStart = result.meta.cursor;
      const cells = result.data.map((c) => c.trim());
      if (cells.every((c) => c === '')) return;
      if (headers === null) {
        headers = cells;
        for (const { path, column } of mappedColumns(map)) {
          const count = headers.filter((h) => h === column).length;
          if (count === 0) fileProblems.push({ field: path, column, message: `The file has no column “${column}”; choose another column.` });
          if (count > 1) fileProblems.push({ field: path, column, message: `The file has ${count} columns named “${column}”; rename all but one.` });
        }
        if (fileProblems.length > 0) parser.abort();
        else reader = rowReader(headers, map);
        return;
      }
      if (rows.length === MAX_IMPORT_ROWS) {
        fileProblems.push({ field: 'csv', column: null, message: `The file has more than ${MAX_IMPORT_ROWS.toLocaleString('en')} rows; import it in parts.` });
        parser.abort();
        return;
      }
      const row = reader!.read(cells, start);
      if (result.errors.some((e) => e.type === 'Quotes')) row.problems.push({ field: 'row', column: null, message: 'A quoted cell is not closed; check the quotes from this line on.' });
      if (row.problems.length > 0) row.input = null;
      rows.push(row);
    },
  });

  if (headers === null) {
    fileProblems.push({ field: 'csv', column: null, message: 'The file is empty: it needs a header row and one row per reading.' });
  } else if (reader !== null) {
    if (rows.length === 0) fileProblems.push({ field: 'csv', column: null, message: 'The file has a header but no data rows.' });
    const methods = new Set((map.methodColumn === null ? [map.method] : rows.map((r) => r.method)).filter((m): m is MeasurementMethod => m !== null));
    for (const method of methods) fileProblems.push(...gapProblems(method, (reader as ReturnType<typeof rowReader>).fields));
  }
  return { headers: headers ?? [], rows, fileProblems };
}
