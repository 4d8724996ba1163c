import 'server-only';
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db';
import type { SessionUser } from '../auth/session-user';
import { HttpError, type FieldIssue } from '../http/errors';
import { parseReadingsCsv, type CsvColumnMap, type CsvProblem, type CsvReadingRow } from '../readings/csv-mapping';
import type { ReadingImportRequest } from '../validations/reading-import';
import { METHOD_SPECS } from '../../physics/measurement/methods';
import type { Derivation } from '../../physics/measurement/types';
import { recordAudit } from './audit';
import { saveColumnMap } from './reading-column-maps';
import { deriveAtPoint, openBench, readingRow, refuseSecondReading, type BenchContext, type BenchPoint } from './readings';

/**
 * Many first readings at once from a CSV (students fill measured values into a copy of the run sheet).
 * The preview and the import run the same checks in one transaction on the open bench: the file and
 * its mapping (src/lib/readings/csv-mapping.ts), then each row against the plan (the point exists, the
 * repeat matches, no second reading of a point and method in the file or in the database), then the
 * server's derivation. The import is all or nothing: one row with a problem and nothing is stored.
 */

/** Rows without problems a preview shows (every row is counted). */
export const PREVIEW_GOOD_ROWS = 50;
/** Rows with problems a report lists at most, so a file with a wrong unit in every row stays readable. */
export const REPORTED_PROBLEM_ROWS = 500;
/** Rows per INSERT: about 20,000 placeholders, well under MariaDB's 65,535. */
const INSERT_BATCH = 1000;

export interface DerivedSummary {
  /** [H] */
  mutualInductance: number | null;
  coupling: number | null;
  efficiency: number | null;
  warnings: string[];
}

export interface ImportRowReport {
  line: number;
  seq: number | null;
  method: CsvReadingRow['method'];
  problems: CsvProblem[];
  /** null for a row with problems */
  derived: DerivedSummary | null;
}

export interface ReadingImportReport {
  /** the rows with problems (at most REPORTED_PROBLEM_ROWS) and the first PREVIEW_GOOD_ROWS good ones, in file order */
  rows: ImportRowReport[];
  /** data rows in the file */
  total: number;
  withProblems: number;
  /** rows with problems beyond those listed */
  unlistedProblemRows: number;
  /** problems of the file or the mapping as a whole */
  fileProblems: CsvProblem[];
}

export interface ReadingImportResult {
  importId: string;
  count: number;
}

/** A refused import: 422 with an issue per problem (`rows.<line>.raw.rxVoltage`) and the whole report. */
export class ReadingImportRefused extends HttpError {
  constructor(readonly report: ReadingImportReport) {
    const issues: FieldIssue[] = [
      ...report.fileProblems.map((p) => ({ path: p.field, message: p.message })),
      ...report.rows.flatMap((row) => row.problems.map((p) => ({ path: `rows.${row.line}.${p.field}`, message: p.message }))),
    ];
    const what = report.withProblems > 0 ? `${report.withProblems.toLocaleString('en')} of ${report.total.toLocaleString('en')} rows need attention` : 'The file needs attention';
    // the report travels in the 422's body, so the page shows the refused rows as the check does
    super(422, `${what}; nothing was imported.`, issues, {}, { report });
    this.name = 'ReadingImportRefused';
  }
}

interface CheckedRow {
  row: CsvReadingRow;
  point: BenchPoint | null;
  problems: CsvProblem[];
  derived: Derivation | null;
}

/** The plan-dependent checks and the derivation of every row; no query per row. */
function checkRows(context: BenchContext, rows: CsvReadingRow[], mapping: CsvColumnMap): CheckedRow[] {
  const seen = new Map<string, number>();
  const seqColumn = mapping.seqColumn;
  const columnOf = (field: string) => (field.startsWith('raw.') ? mapping.fields[field.slice(4)]?.column ?? null : null);
  return rows.map((row) => {
    const problems = [...row.problems];
    const point = row.seq === null ? null : context.pointsBySeq.get(row.seq) ?? null;
    if (row.seq !== null && !point) {
      problems.push({ field: 'seq', column: seqColumn, message: `This plan has no point ${row.seq}; its points are 1 to ${context.pointsBySeq.size}.` });
    }
    if (point && row.repeat !== null && row.repeat !== point.repeatIndex) {
      problems.push({ field: 'repeat', column: mapping.repeatColumn, message: `Point ${point.seq} is repeat ${point.repeatIndex} on the run sheet, not ${row.repeat}; check the seq.` });
    }
    if (point && row.method) {
      const key = `${point.id}:${row.method}`;
      const first = seen.get(key);
      if (first === undefined) seen.set(key, row.line);
      else problems.push({ field: 'seq', column: seqColumn, message: `Point ${point.seq} has a reading by ${METHOD_SPECS[row.method].label.toLowerCase()} on line ${first} already; keep one per point and method.` });
      try {
        refuseSecondReading(point, row.method);
      } catch (error) {
        if (!(error instanceof HttpError)) throw error;
        problems.push({ field: 'seq', column: seqColumn, message: error.message });
      }
    }
    let derived: Derivation | null = null;
    if (problems.length === 0 && point && row.input) {
      try {
        derived = deriveAtPoint(point, row.input);
      } catch (error) {
        if (!(error instanceof HttpError) || error.status !== 422) throw error;
        problems.push(...error.issues.map((issue) => ({ field: issue.path, column: columnOf(issue.path), message: issue.message })));
      }
    }
    return { row, point, problems, derived };
  });
}

const summary = (derived: Derivation): DerivedSummary => ({
  mutualInductance: derived.mutualInductance?.value ?? null,
  coupling: derived.coupling?.value ?? null,
  efficiency: derived.efficiency?.value ?? null,
  warnings: derived.warnings,
});

function buildReport(checked: CheckedRow[], fileProblems: CsvProblem[]): ReadingImportReport {
  const rows: ImportRowReport[] = [];
  let good = 0;
  let bad = 0;
  for (const { row, problems, derived } of checked) {
    const listed = problems.length > 0 ? bad++ < REPORTED_PROBLEM_ROWS : good++ < PREVIEW_GOOD_ROWS;
    if (listed) rows.push({ line: row.line, seq: row.seq, method: row.method, problems, derived: derived && summary(derived) });
  }
  return { rows, total: checked.length, withProblems: bad, unlistedProblemRows: Math.max(0, bad - REPORTED_PROBLEM_ROWS), fileProblems };
}

type ImportInput = Pick<ReadingImportRequest, 'csv' | 'mapping'> & { fileName?: string };

async function examine(trx: Knex.Transaction, actor: SessionUser, studyId: number, planId: number, input: ImportInput) {
  const context = await openBench(trx, actor, studyId, planId);
  const parsed = parseReadingsCsv(input.csv, input.mapping);
  const checked = checkRows(context, parsed.rows, input.mapping);
  return { context, checked, report: buildReport(checked, parsed.fileProblems) };
}

/** What the import would store, and every problem that would stop it; stores nothing (students and researchers, plan on the bench). */
export async function previewReadingImport(actor: SessionUser, studyId: number, planId: number, input: ImportInput): Promise<ReadingImportReport> {
  return db.transaction(async (trx) => (await examine(trx, actor, studyId, planId, input)).report);
}

/**
 * Stores every row as the first version of its point's reading by its method, under one import id,
 * remembers the mapping for the study and writes one audit row; with any problem, stores nothing
 * and throws ReadingImportRefused (422) with the report.
 */
export async function commitReadingImport(actor: SessionUser, studyId: number, planId: number, input: ImportInput): Promise<ReadingImportResult> {
  return db.transaction(async (trx) => {
    const { context, checked, report } = await examine(trx, actor, studyId, planId, input);
    if (report.withProblems > 0 || report.fileProblems.length > 0) throw new ReadingImportRefused(report);
    const importId = randomUUID();
    const rows = checked.map(({ row, point, derived }) =>
      readingRow(context, point!, row.input!, derived!, actor.id, { version: 1, source: 'csv', importId }),
    );
    await trx.batchInsert('readings', rows, INSERT_BATCH);
    await saveColumnMap(trx, studyId, input.mapping, actor.id);
    const fileName = input.fileName?.trim() || null;
    await recordAudit(trx, {
      studyId, actorId: actor.id, action: 'readings.import', targetTable: 'sweep_plans', targetId: planId,
      details: { plan: context.planName, count: rows.length, importId, fileName },
    });
    return { importId, count: rows.length };
  });
}
