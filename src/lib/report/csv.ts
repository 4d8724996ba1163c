import Papa from 'papaparse';

/**
 * CSV files with their own data dictionary: one column list writes each file's header, its rows and
 * its lines in data-dictionary.csv, so the three cannot disagree (as the run sheet does in
 * src/lib/data/plan-points.ts, whose columns points.csv reuses).
 */

export type CsvValue = string | number | boolean | null | undefined;

export interface CsvColumn<T> {
  name: string;
  /** SI unit, "-" for a number without one, "text" / "ISO 8601" / "true/false" for the rest */
  unit: string;
  meaning: string;
  value: (row: T) => CsvValue;
}

export interface CsvTable<T> {
  file: string;
  /** one line for README.txt */
  about: string;
  columns: readonly CsvColumn<T>[];
  rows: readonly T[];
}

/** Any table, whatever its row type (only the writer looks inside rows). */
export type AnyCsvTable = CsvTable<any>;

/** Checks a table's columns against its rows, then forgets the row type so tables can share a list. */
export const csvTable = <T>(table: CsvTable<T>): AnyCsvTable => table;

/**
 * Text cells that a spreadsheet would read as a formula (=, +, -, @, tab or carriage return first) get
 * a leading apostrophe and quotes, the OWASP advice against CSV injection (common practice). Numbers are
 * written as numbers, so a negative residual stays -0.012; text that is only a number, or the unit "-"
 * of the dictionaries, cannot run and is left alone. Not anchored at the end, unlike papaparse's
 * default, so a formula followed by a line break is caught too.
 */
export const FORMULA_START = /^(?!-$|[-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?$)[=+\-@\t\r]/;

/** RFC 4180 line ends, as spreadsheets expect. */
const NEWLINE = '\r\n';

/** The file's text: header, then one line per row; quotes, commas and line breaks are quoted. */
export function csvText<T>(table: CsvTable<T>): string {
  return Papa.unparse(
    { fields: table.columns.map((c) => c.name), data: table.rows.map((row) => table.columns.map((c) => c.value(row) ?? '')) },
    { escapeFormulae: FORMULA_START, newline: NEWLINE },
  );
}

export interface DictionaryEntry {
  file: string;
  column: string;
  unit: string;
  meaning: string;
}

export const DICTIONARY_FILE = 'data-dictionary.csv';

const DICTIONARY_COLUMNS: readonly CsvColumn<DictionaryEntry>[] = [
  { name: 'file', unit: 'text', meaning: 'The CSV file the column is in.', value: (e) => e.file },
  { name: 'column', unit: 'text', meaning: 'The column name as written in the file\u2019s header.', value: (e) => e.column },
  { name: 'unit', unit: 'text', meaning: 'Unit of the column\u2019s values: SI, "-" for a number without unit, or the kind of text.', value: (e) => e.unit },
  { name: 'meaning', unit: 'text', meaning: 'What the column holds.', value: (e) => e.meaning },
];

/** The dictionary of every column of `tables` and of itself. */
export function dictionaryTable(tables: readonly AnyCsvTable[]): CsvTable<DictionaryEntry> {
  const entries = (file: string, columns: readonly { name: string; unit: string; meaning: string }[]) => columns.map((c) => ({ file, column: c.name, unit: c.unit, meaning: c.meaning }));
  return {
    file: DICTIONARY_FILE,
    about: 'This data dictionary: for every column of every CSV file, its unit and meaning.',
    columns: DICTIONARY_COLUMNS,
    rows: [...tables.flatMap((t) => entries(t.file, t.columns)), ...entries(DICTIONARY_FILE, DICTIONARY_COLUMNS)],
  };
}
