import JSZip from 'jszip';
import Papa from 'papaparse';
import { buildPlanZip } from '../../../src/lib/report/zip';
import { FORMULA_COMMENT, PLAN_NAME, reportFixture } from './report-fixture';

/** The zip read back with jszip, its CSV files with papaparse. */

const EXPECTED_FILES = [
  'README.txt', 'data-dictionary.csv', 'setup.csv', 'coils.csv', 'axes.csv', 'points.csv', 'readings.csv',
  'residuals.csv', 'set-aside.csv', 'decisions.csv', 'comments.csv', 'fits.csv',
];

const rowsOf = (csv: string) => Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });

describe('buildPlanZip', () => {
  let zip: JSZip;
  const files = new Map<string, string>();

  beforeAll(async () => {
    zip = await JSZip.loadAsync(await buildPlanZip(reportFixture()));
    for (const name of Object.keys(zip.files)) files.set(name, await zip.file(name)!.async('string'));
  });

  it('holds every file, and only those', () => {
    expect([...files.keys()].sort()).toEqual([...EXPECTED_FILES].sort());
  });

  it('README.txt names every file in the zip and the plan', () => {
    const readme = files.get('README.txt')!;
    expect(readme).toContain(PLAN_NAME);
    for (const name of EXPECTED_FILES) expect(readme).toContain(name);
  });

  it('the data dictionary names every column of every CSV file, with a unit and a meaning', () => {
    const dictionary = rowsOf(files.get('data-dictionary.csv')!).data;
    const described = new Set(dictionary.map((row) => `${row.file}|${row.column}`));
    const columns = [...files.keys()].filter((f) => f.endsWith('.csv')).flatMap((file) => {
      const header = Papa.parse<string[]>(files.get(file)!, { preview: 1 }).data[0];
      return header.map((column) => `${file}|${column}`);
    });
    expect(columns.length).toBeGreaterThan(100);
    expect(columns.filter((c) => !described.has(c))).toEqual([]);
    expect([...described].filter((d) => !columns.includes(d))).toEqual([]);
    expect(dictionary.filter((row) => !row.unit || !row.meaning)).toEqual([]);
  });

  it('neutralises formula-looking text (OWASP CSV injection) and keeps negative numbers as numbers', () => {
    const comments = rowsOf(files.get('comments.csv')!).data;
    expect(comments.map((c) => c.body)).toContain(`'${FORMULA_COMMENT}`);
    const readings = rowsOf(files.get('readings.csv')!).data;
    expect(readings.map((r) => r.correction_reason)).toContain("'-3 dB attenuator was not entered");
    const setup = rowsOf(files.get('setup.csv')!).data;
    expect(setup[0].notes).toBe("'+ rig B on the north bench");
    // the fixture's seq 2 reads 3 % low: its residual is written as a plain negative number
    const residuals = rowsOf(files.get('residuals.csv')!).data;
    const seq2 = residuals.find((r) => r.quantity === 'coupling' && r.seqs === '2')!;
    expect(Number(seq2.relative)).toBeCloseTo(-0.03, 12);
    expect(seq2.relative.startsWith('-')).toBe(true);
  });

  it('has every point, every version of every reading and each pose of each quantity', () => {
    const report = reportFixture();
    expect(rowsOf(files.get('points.csv')!).data.map((p) => Number(p.seq))).toEqual(report.points.map((p) => p.seq));
    const readings = rowsOf(files.get('readings.csv')!).data;
    expect(readings).toHaveLength(report.readings.length);
    expect(readings.filter((r) => r.current === 'false').map((r) => r.reading_id)).toEqual(['502']);
    const residuals = rowsOf(files.get('residuals.csv')!).data;
    expect(residuals).toHaveLength(3 * report.reviews.coupling.poses.length);
    expect(residuals.filter((r) => r.set_aside === 'true').map((r) => `${r.quantity}:${r.seqs}`)).toEqual([
      'coupling:4', 'mutualInductance:4', 'efficiency:4',
    ]);
    expect(rowsOf(files.get('fits.csv')!).data.map((f) => `${f.model} ${f.value} ${f.unit}`)).toEqual(['tilt_offset 4.1 degrees']);
  });
});
