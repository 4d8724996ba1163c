// Reads the machine-readable results of jest and playwright and turns them into the summary that
// ends `npm test`. Counts come from the JSON files, never from scraping terminal output.
import fs from 'node:fs';

function readJson(file) {
  try {
    return JSON.parse(fs.readFileSync(file, 'utf8'));
  } catch {
    return null;
  }
}

/**
 * { passed, failed, skipped, notes[] } for a jest --json output file. A test file that could not
 * run at all (syntax error, failing import) has no test results, so it counts as one failure.
 */
export function jestCounts(file, exitCode) {
  const r = readJson(file);
  if (!r) return null;
  const notes = [];
  let failed = r.numFailedTests || 0;
  const broken = r.numRuntimeErrorTestSuites || 0;
  if (broken) {
    failed += broken;
    notes.push(`${broken} test file(s) failed to run`);
  }
  if (exitCode && !failed) {
    failed = 1;
    notes.push(r.numTotalTests ? `jest exited with code ${exitCode}` : 'no tests found');
  }
  return { passed: r.numPassedTests || 0, failed, skipped: (r.numPendingTests || 0) + (r.numTodoTests || 0), notes };
}

/** Same for playwright's JSON reporter; flaky tests passed on retry and count as passed. */
export function playwrightCounts(file, exitCode) {
  const r = readJson(file);
  if (!r || !r.stats) return null;
  const s = r.stats;
  const notes = [];
  let failed = s.unexpected || 0;
  if (s.flaky) notes.push(`${s.flaky} flaky (passed on retry)`);
  const errors = (r.errors || []).length;
  if (errors && !failed) {
    failed = errors;
    notes.push(`${errors} error(s) outside tests`);
  }
  if (exitCode && !failed) {
    failed = 1;
    notes.push(`playwright exited with code ${exitCode}`);
  }
  return { passed: (s.expected || 0) + (s.flaky || 0), failed, skipped: s.skipped || 0, notes };
}

export const formatCounts = (c) => `${c.passed} passed, ${c.failed} failed${c.skipped ? `, ${c.skipped} skipped` : ''}`;
