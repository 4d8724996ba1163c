'use client';

import { useMemo, useState } from 'react';
import { useSWRConfig } from 'swr';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { FieldShell } from '@/components/ui/field';
import { readingColumnMapKey, useReadingColumnMap } from '@/hooks/use-reading-column-map';
import { ApiError, fetchJson } from '@/lib/client/fetch-json';
import type { ReadingImportReport, ReadingImportResult } from '@/lib/data/reading-import';
import type { FieldIssue } from '@/lib/http/errors';
import { guessMapping, type CsvColumnMap } from '@/lib/readings/csv-mapping';
import { CSV_MAX_BYTES } from '@/lib/validations/reading-import';
import { csvHeaders, methodsInColumn } from './csv-file';
import { CsvImportReport, issueProblems, ProblemTable } from './csv-import-report';
import { CsvMappingTable } from './csv-mapping-table';

interface CsvImportProps {
  studyId: number;
  planId: number;
  /** the viewer may log readings on this plan now (role, plan on the bench, cautions acknowledged) */
  canImport: boolean;
  onImported?: (count: number) => void;
}

interface ChosenFile {
  name: string;
  text: string;
  headers: string[];
}

type Outcome = { tone: 'success'; message: string } | { tone: 'error'; message: string; issues: FieldIssue[] };

const UNREACHABLE = 'Couplet could not be reached. Check your connection and try again.';

/**
 * Many readings from one CSV: choose the file, check the prefilled column mapping, check every row
 * on the server, then import all of them or none. The mapping is remembered for the study.
 */
export function CsvImport({ studyId, planId, canImport, onImported }: CsvImportProps) {
  const { columnMap } = useReadingColumnMap(studyId);
  const { mutate } = useSWRConfig();
  const [file, setFile] = useState<ChosenFile | null>(null);
  const [mapping, setMapping] = useState<CsvColumnMap | null>(null);
  const [report, setReport] = useState<ReadingImportReport | null>(null);
  const [busy, setBusy] = useState<'check' | 'import' | null>(null);
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [fileError, setFileError] = useState<string | undefined>();
  // a new key empties the file input after an import
  const [inputKey, setInputKey] = useState(0);
  const methodsInFile = useMemo(() => (file && mapping?.methodColumn ? methodsInColumn(file.text, mapping.methodColumn) : []), [file, mapping?.methodColumn]);

  if (!canImport) return <p className="text-sm text-ink-600">Readings are imported by students and researchers while the plan is on the bench, once the cautions are acknowledged.</p>;

  const choose = async (chosen: File | undefined) => {
    setReport(null);
    setOutcome(null);
    setFileError(undefined);
    if (!chosen) return setFile(null);
    if (chosen.size > CSV_MAX_BYTES) {
      setFile(null);
      return setFileError(`The file is larger than ${CSV_MAX_BYTES / 1024 / 1024} MB; import it in parts.`);
    }
    const text = await chosen.text();
    const headers = csvHeaders(text);
    if (headers.length === 0) {
      setFile(null);
      return setFileError('The file is empty: it needs a header row and one row per reading.');
    }
    setFile({ name: chosen.name, text, headers });
    setMapping(guessMapping(headers, columnMap?.mapping ?? null));
  };

  const changeMapping = (next: CsvColumnMap) => {
    setMapping(next);
    setReport(null);
    setOutcome(null);
  };

  const send = async (commit: boolean) => {
    if (!file || !mapping) return;
    setBusy(commit ? 'import' : 'check');
    setOutcome(null);
    try {
      const url = `/api/studies/${studyId}/plans/${planId}/readings/import`;
      const body = { csv: file.text, fileName: file.name, mapping, commit };
      if (!commit) {
        setReport((await fetchJson<{ preview: ReadingImportReport }>(url, { method: 'POST', body })).preview);
        return;
      }
      const { import: result } = await fetchJson<{ import: ReadingImportResult }>(url, { method: 'POST', body });
      setFile(null);
      setReport(null);
      setInputKey((k) => k + 1);
      setOutcome({ tone: 'success', message: `Imported ${result.count.toLocaleString('en')} readings from ${file.name}.` });
      await mutate(readingColumnMapKey(studyId));
      await mutate((key) => typeof key === 'string' && key.startsWith(`/api/studies/${studyId}/plans/${planId}`));
      onImported?.(result.count);
    } catch (failure) {
      if (commit) setReport(null);
      setOutcome(failure instanceof ApiError ? { tone: 'error', message: failure.message, issues: failure.issues } : { tone: 'error', message: UNREACHABLE, issues: [] });
    } finally {
      setBusy(null);
    }
  };

  const ready = report !== null && report.total > 0 && report.withProblems === 0 && report.fileProblems.length === 0;
  return (
    <div className="space-y-5">
      <FieldShell label="CSV file" hint="A header row naming the columns, then one reading per row: a filled-in copy of the run sheet works. At most 8 MB." error={fileError}>
        {(control) => (
          <input
            {...control}
            key={inputKey}
            type="file"
            accept=".csv,text/csv,text/plain"
            className="block text-sm text-ink-700 file:mr-3 file:rounded-md file:border file:border-ink-300 file:bg-white file:px-3 file:py-1.5 file:text-sm"
            onChange={(e) => void choose(e.target.files?.[0])}
          />
        )}
      </FieldShell>

      {file && mapping && (
        <>
          <p className="text-sm text-ink-600">
            {file.name}: {file.headers.length} columns.{' '}
            {columnMap ? 'The mapping is prefilled from the one this study used last; check it.' : 'The mapping is guessed from the column names; check it.'}
          </p>
          <CsvMappingTable headers={file.headers} mapping={mapping} methodsInFile={methodsInFile} onChange={changeMapping} />
          <div className="flex flex-wrap gap-3">
            <Button onClick={() => void send(false)} disabled={busy !== null}>
              {busy === 'check' ? 'Checking…' : 'Check the file'}
            </Button>
            <Button variant="primary" onClick={() => void send(true)} disabled={!ready || busy !== null}>
              {busy === 'import' ? 'Importing…' : ready ? `Import ${report.total.toLocaleString('en')} readings` : 'Import readings'}
            </Button>
          </div>
        </>
      )}

      {outcome?.tone === 'success' && <Alert tone="success">{outcome.message}</Alert>}
      {outcome?.tone === 'error' && (
        <Alert tone="error" title={outcome.message}>
          {outcome.issues.length > 0 ? <ProblemTable problems={issueProblems(outcome.issues)} /> : null}
        </Alert>
      )}
      {report && <CsvImportReport report={report} />}
    </div>
  );
}
