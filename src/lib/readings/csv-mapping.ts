import { DEFAULT_ACCURACY } from '../../physics/measurement/methods';
import type { CsvColumnMap } from '../validations/reading-import';
import { csvRawField, siUnit, unitFactor } from './csv-fields';
import { headerSplits, isPlannedColumn, targetOfName, type CsvTarget } from './csv-header-names';

export type { CsvColumnMap, CsvColumnMapInput } from '../validations/reading-import';
export { parseReadingsCsv, MAX_IMPORT_ROWS } from './csv-parse';
export type { CsvProblem, CsvReadingInput, CsvReadingRow, ParsedReadingsCsv } from './csv-parse';

/**
 * The mapping of a readings CSV: which column holds the point's seq, the repeat, the method (one for
 * the file, or a column naming each row's), each raw input with the unit of its bare numbers, and the
 * circumstances. Pure: the browser prefills its mapping table with guessMapping, and the server and
 * the browser read files with parseReadingsCsv (csv-parse.ts).
 */

type CircumstanceColumn = 'instrument' | 'calibration' | 'temperatureC' | 'setupNotes';
const CIRCUMSTANCE_COLUMNS: readonly CircumstanceColumn[] = ['instrument', 'calibration', 'temperatureC', 'setupNotes'];

/** A mapping with nothing chosen yet. */
export function emptyMapping(): CsvColumnMap {
  return {
    seqColumn: '',
    repeatColumn: null,
    method: null,
    methodColumn: null,
    fields: {},
    circumstances: { instrument: null, calibration: null, temperatureC: null, setupNotes: null, accuracy: { ...DEFAULT_ACCURACY } },
  };
}

/** What one header cell is taken to hold, with the unit its name gives (raw inputs only). */
function readHeader(header: string): { target: CsvTarget; unit: string } | null {
  if (isPlannedColumn(header)) return null;
  for (const { name, unit } of headerSplits(header)) {
    const target = targetOfName(name);
    if (!target) continue;
    if (!target.startsWith('raw:')) return { target, unit: '' };
    const field = csvRawField(target.slice(4))!;
    if (unit === '') return { target, unit: siUnit(field.kind) };
    if (unitFactor(field.kind, unit) !== null) return { target, unit };
  }
  return null;
}

/** The mapping the header names suggest; each column is used once, the leftmost match wins. */
function guessFromNames(headers: readonly string[]): CsvColumnMap {
  const map = emptyMapping();
  const taken = new Set<CsvTarget>();
  for (const header of headers) {
    const read = header.trim() === '' ? null : readHeader(header);
    if (!read || taken.has(read.target)) continue;
    taken.add(read.target);
    const column = header.trim();
    if (read.target.startsWith('raw:')) map.fields[read.target.slice(4)] = { column, unit: read.unit };
    else if (read.target === 'seq') map.seqColumn = column;
    else if (read.target === 'repeat') map.repeatColumn = column;
    else if (read.target === 'method') map.methodColumn = column;
    else map.circumstances[read.target as CircumstanceColumn] = column;
  }
  return map;
}

/**
 * A mapping for a file with these headers: the remembered mapping's choices wherever the file has
 * their columns, the header names' suggestions for the rest. The seq column stays '' when nothing
 * fits, and the method null when neither a column nor the remembered mapping names one.
 */
export function guessMapping(headers: readonly string[], remembered?: CsvColumnMap | null): CsvColumnMap {
  const guessed = guessFromNames(headers);
  if (!remembered) return guessed;
  const present = new Set(headers.map((h) => h.trim()));
  const has = (column: string | null): column is string => column !== null && present.has(column);

  const fields: CsvColumnMap['fields'] = {};
  const used = new Set<string>();
  for (const [key, field] of Object.entries(remembered.fields)) {
    if (field && has(field.column) && csvRawField(key)) {
      fields[key] = { ...field };
      used.add(field.column);
    }
  }
  for (const [key, field] of Object.entries(guessed.fields)) {
    if (field && !(key in fields) && !used.has(field.column)) fields[key] = field;
  }
  const methodColumn = has(remembered.methodColumn) ? remembered.methodColumn : guessed.methodColumn;
  const circumstances = { ...guessed.circumstances, accuracy: { ...remembered.circumstances.accuracy } };
  for (const key of CIRCUMSTANCE_COLUMNS) {
    const column = remembered.circumstances[key];
    if (has(column)) circumstances[key] = column;
  }
  return {
    seqColumn: has(remembered.seqColumn) ? remembered.seqColumn : guessed.seqColumn,
    repeatColumn: has(remembered.repeatColumn) ? remembered.repeatColumn : guessed.repeatColumn,
    method: methodColumn === null ? remembered.method : null,
    methodColumn,
    fields,
    circumstances,
  };
}
