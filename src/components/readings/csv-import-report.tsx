import { Table, Td, Th } from '@/components/ui/table';
import type { ReadingImportReport } from '@/lib/data/reading-import';
import type { FieldIssue } from '@/lib/http/errors';
import { METHOD_SPECS } from '@/physics/measurement/methods';
import { formatQuantityValue } from './format-measured';

/** Good rows the check shows with their derived values, so a unit slip (M a thousand times off) shows. */
const SAMPLE_ROWS = 8;

export interface ProblemLine {
  line: number | null;
  seq: number | null;
  /** the column's header, or where in the reading or mapping */
  where: string;
  message: string;
}

const count = (n: number) => n.toLocaleString('en');

/** The problems of a report, one line each. */
export function reportProblems(report: ReadingImportReport): ProblemLine[] {
  return [
    ...report.fileProblems.map((p) => ({ line: null, seq: null, where: p.column ?? p.field, message: p.message })),
    ...report.rows.flatMap((row) => row.problems.map((p) => ({ line: row.line, seq: row.seq, where: p.column ?? p.field, message: p.message }))),
  ];
}

/** The problems of a refused import, from its issues ("rows.17.raw.rxVoltage" is line 17). */
export function issueProblems(issues: FieldIssue[]): ProblemLine[] {
  return issues.map((issue) => {
    const match = /^rows\.(\d+)\.(.+)$/.exec(issue.path);
    return match ? { line: Number(match[1]), seq: null, where: match[2], message: issue.message } : { line: null, seq: null, where: issue.path, message: issue.message };
  });
}

export function ProblemTable({ problems, unlisted = 0 }: { problems: ProblemLine[]; unlisted?: number }) {
  return (
    <div className="space-y-2">
      <Table caption="Problems to fix before the import">
        <thead>
          <tr>
            <Th dense>Line</Th>
            <Th dense>Seq</Th>
            <Th dense>Field</Th>
            <Th dense>Problem</Th>
          </tr>
        </thead>
        <tbody>
          {problems.map((p, i) => (
            <tr key={i}>
              <Td dense className="tabular-nums">{p.line ?? 'file'}</Td>
              <Td dense className="tabular-nums">{p.seq ?? '—'}</Td>
              <Td dense>{p.where}</Td>
              <Td dense>{p.message}</Td>
            </tr>
          ))}
        </tbody>
      </Table>
      {unlisted > 0 && <p className="text-xs text-ink-500">{count(unlisted)} more rows with problems are not listed; fix these and check again.</p>}
    </div>
  );
}

/** Counts, the problems, and the first good rows with what the server derived from them. */
export function CsvImportReport({ report }: { report: ReadingImportReport }) {
  const problems = reportProblems(report);
  const sample = report.rows.filter((row) => row.problems.length === 0).slice(0, SAMPLE_ROWS);
  const ready = report.total - report.withProblems;
  return (
    <div className="space-y-4">
      <p role="status" className="text-sm text-ink-700">
        {count(report.total)} rows: {count(ready)} ready, {count(report.withProblems)} with problems
        {report.fileProblems.length > 0 &&
          `, and ${count(report.fileProblems.length)} ${report.fileProblems.length === 1 ? 'problem' : 'problems'} with the file or its mapping`}.
      </p>
      {problems.length > 0 && <ProblemTable problems={problems} unlisted={report.unlistedProblemRows} />}
      {sample.length > 0 && (
        <Table caption="First rows as they will be stored">
          <thead>
            <tr>
              <Th dense>Line</Th>
              <Th dense>Seq</Th>
              <Th dense>Method</Th>
              <Th dense>M</Th>
              <Th dense>k</Th>
              <Th dense>Efficiency</Th>
              <Th dense>Warnings</Th>
            </tr>
          </thead>
          <tbody>
            {sample.map((row) => (
              <tr key={row.line}>
                <Td dense className="tabular-nums">{row.line}</Td>
                <Td dense className="tabular-nums">{row.seq}</Td>
                <Td dense>{row.method ? METHOD_SPECS[row.method].label : '—'}</Td>
                <Td dense className="tabular-nums">{formatQuantityValue(row.derived?.mutualInductance, 'mutualInductance')}</Td>
                <Td dense className="tabular-nums">{formatQuantityValue(row.derived?.coupling, 'coupling')}</Td>
                <Td dense className="tabular-nums">{formatQuantityValue(row.derived?.efficiency, 'efficiency')}</Td>
                <Td dense className="text-xs text-ink-600">{row.derived?.warnings.join(' ') || '—'}</Td>
              </tr>
            ))}
          </tbody>
        </Table>
      )}
    </div>
  );
}
