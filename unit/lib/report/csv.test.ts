import Papa from 'papaparse';
import { csvText, dictionaryTable, FORMULA_START, type CsvTable } from '../../../src/lib/report/csv';

/**
 * CSV as RFC 4180 writes it (quotes around cells with commas, quotes or line breaks; quotes doubled),
 * read back with papaparse's parser, and the OWASP "CSV injection" advice: cells that begin with
 * =, +, -, @, tab or carriage return get a leading apostrophe (common practice).
 */

interface Row {
  text: string;
  number: number | null;
}

const table = (rows: Row[]): CsvTable<Row> => ({
  file: 'test.csv',
  about: 'A test file.',
  columns: [
    { name: 'text', unit: 'text', meaning: 'Some text.', value: (r) => r.text },
    { name: 'number_m', unit: 'm', meaning: 'A length.', value: (r) => r.number },
  ],
  rows,
});

const parse = (csv: string) => Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;

describe('csvText', () => {
  it('writes the header, then one line per row, CRLF between them', () => {
    const csv = csvText(table([{ text: 'a', number: 1 }, { text: 'b', number: null }]));
    expect(csv).toBe('text,number_m\r\na,1\r\nb,');
  });

  it('quotes commas, quotes and line breaks so the cell reads back as written (RFC 4180)', () => {
    const tricky = 'Second line follows,\nwith a comma and "quotes".';
    const csv = csvText(table([{ text: tricky, number: 2 }]));
    expect(csv).toContain('"Second line follows,\nwith a comma and ""quotes""."');
    expect(parse(csv)[1]).toEqual([tricky, '2']);
  });

  it.each([
    ['=HYPERLINK("http://example.invalid","open")'],
    ['+SUM(A1:A9)'],
    ['-2+3+cmd|\' /C calc\'!A0'],
    ['@SUM(A1)'],
    ['\t=1+1'],
    ['\r=1+1'],
    ['=1+1\nsecond line'],
  ])('neutralises the formula-looking cell %j with a leading apostrophe', (text) => {
    const cell = parse(csvText(table([{ text, number: null }])))[1][0];
    expect(cell).toBe(`'${text}`);
  });

  it('leaves numbers, number-only text and the unit "-" as they are', () => {
    const csv = csvText(table([{ text: '-', number: -0.012 }, { text: '-1.5e-9', number: -3 }]));
    expect(parse(csv).slice(1)).toEqual([['-', '-0.012'], ['-1.5e-9', '-3']]);
    expect(FORMULA_START.test('-1+1')).toBe(true);
  });
});

describe('dictionaryTable', () => {
  it('has one row per column of every table and of itself', () => {
    const dictionary = dictionaryTable([table([])]);
    const rows = parse(csvText(dictionary));
    expect(rows[0]).toEqual(['file', 'column', 'unit', 'meaning']);
    expect(rows.slice(1).map((r) => `${r[0]}:${r[1]}`)).toEqual([
      'test.csv:text', 'test.csv:number_m',
      'data-dictionary.csv:file', 'data-dictionary.csv:column', 'data-dictionary.csv:unit', 'data-dictionary.csv:meaning',
    ]);
    expect(rows[2]).toEqual(['test.csv', 'number_m', 'm', 'A length.']);
  });
});
