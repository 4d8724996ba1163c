import JSZip from 'jszip';
import { PLAN_STATE_LABELS } from '../plans/states';
import { csvText, dictionaryTable, type AnyCsvTable } from './csv';
import { planTables } from './csv-plan-tables';
import { reviewTables } from './csv-review-tables';
import { formatWhen } from './format';
import { BENCH_SAFETY_LINE, solverVersions } from './notes';
import type { PlanReport } from './types';

/**
 * A plan's data as a zip of CSV files with a data dictionary and a README, for analysis outside
 * Couplet. Every file is written from the report alone, so the zip and the PDF agree.
 */

export const README_FILE = 'README.txt';

/** The CSV files in the order README.txt lists them, the dictionary last. */
export function reportTables(report: PlanReport): AnyCsvTable[] {
  const tables = [...planTables(report), ...reviewTables(report)];
  return [...tables, dictionaryTable(tables)];
}

function readme(report: PlanReport, tables: readonly AnyCsvTable[]): string {
  const width = Math.max(...tables.map((t) => t.file.length), README_FILE.length);
  const list = [{ file: README_FILE, about: 'This file.' }, ...tables].map((t) => `  ${t.file.padEnd(width)}  ${t.about}`);
  return [
    `Couplet: data of the plan "${report.plan.name}"`,
    `Study: ${report.study.name}`,
    `State: ${PLAN_STATE_LABELS[report.plan.state]}; ${report.plan.pointCount.toLocaleString('en')} points`,
    `Generated: ${formatWhen(report.generatedAt)}; predictions by solver ${solverVersions(report)}`,
    '',
    'Files:',
    ...list,
    '',
    'Conventions:',
    '  - Comma-separated, UTF-8, one header line; data-dictionary.csv gives the unit and meaning of every column.',
    '  - Values are SI (metres, henries, ohms, hertz, watts), except angles in degrees; k and the efficiency are',
    '    fractions, and so are relative errors (0.05 is 5 %). Uncertainties are standard uncertainties (coverage factor 1).',
    '  - An empty cell means no value. Times are ISO 8601 in UTC.',
    '  - Text that begins with =, +, -, @ or a tab is written with a leading apostrophe so that a spreadsheet',
    '    does not run it as a formula; remove the apostrophe to read the text as it was entered.',
    '',
    BENCH_SAFETY_LINE,
    '',
  ].join('\r\n');
}

export async function buildPlanZip(report: PlanReport): Promise<Buffer> {
  const tables = reportTables(report);
  const zip = new JSZip();
  // every entry carries the report's time, so the same report gives the same archive
  const date = new Date(report.generatedAt);
  zip.file(README_FILE, readme(report, tables), { date });
  for (const table of tables) zip.file(table.file, csvText(table), { date });
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE', compressionOptions: { level: 6 }, platform: 'UNIX' });
}
