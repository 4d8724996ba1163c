// Console output for the orchestration scripts: one prefix, optional colour, and the error type
// that carries "which step failed and where its log is" up to the top-level handler.
import fs from 'node:fs';
import path from 'node:path';

const colour = process.stdout.isTTY && !process.env.NO_COLOR;
const paint = (code) => (s) => (colour ? `\x1b[${code}m${s}\x1b[0m` : String(s));
export const bold = paint('1');
export const red = paint('31');
export const green = paint('32');
export const yellow = paint('33');
export const dim = paint('2');

let prefix = '[couplet]';
export function setPrefix(p) {
  prefix = p;
}

export function info(msg) {
  console.log(`${dim(prefix)} ${msg}`);
}
export function step(msg) {
  console.log(`${dim(prefix)} ${bold('▶')} ${msg}`);
}
export function ok(msg) {
  console.log(`${dim(prefix)} ${green('✓')} ${msg}`);
}
export function warn(msg) {
  console.warn(`${dim(prefix)} ${yellow('!')} ${msg}`);
}
export function fail(msg) {
  console.error(`${dim(prefix)} ${red('✗')} ${msg}`);
}

/** Paths are printed relative to the repo root when possible: shorter and copy-pasteable. */
export function rel(root, p) {
  const r = path.relative(root, p);
  return r && !r.startsWith('..') ? r : p;
}

/**
 * Last `n` lines of a (possibly large) log file, reading only its end, and nothing before byte
 * `from` (logs that are appended to across runs: show only this run's part).
 */
export function tailFile(file, n = 40, from = 0) {
  try {
    const fd = fs.openSync(file, 'r');
    try {
      const size = fs.fstatSync(fd).size;
      const start = Math.max(from <= size ? from : 0, size - 64 * 1024);
      const len = size - start;
      const buf = Buffer.alloc(len);
      fs.readSync(fd, buf, 0, len, start);
      // Strip ANSI colour codes so the tail is readable in any terminal or CI log.
      const text = buf.toString('utf8').replace(/\x1b\[[0-9;]*[A-Za-z]/g, '');
      return text.split(/\r?\n/).filter((l, i, a) => !(i === a.length - 1 && l === '')).slice(-n);
    } finally {
      fs.closeSync(fd);
    }
  } catch {
    return [];
  }
}

/**
 * A failed step. `logs` are files (or { file, from } to skip earlier runs' lines) whose tails are
 * printed by the top-level handler,
 * `hint` is a sentence telling the developer what to do about it.
 */
export class StepError extends Error {
  constructor(stepName, message, { logs = [], hint = '', exitCode = 1 } = {}) {
    super(message);
    this.stepName = stepName;
    this.logs = logs;
    this.hint = hint;
    this.exitCode = exitCode;
  }
}

/** Print a StepError (or any error) with the tails of its logs. */
export function reportError(err, root) {
  if (err instanceof StepError) {
    fail(`${bold(`Step "${err.stepName}" failed:`)} ${err.message}`);
    for (const entry of err.logs) {
      const { file, from = 0 } = typeof entry === 'string' ? { file: entry } : entry;
      const lines = tailFile(file, 30, from);
      if (!lines.length) continue;
      console.error(dim(`---- last ${lines.length} lines of ${rel(root, file)} ----`));
      for (const l of lines) console.error(dim('| ') + l);
      console.error(dim('---- end ----'));
    }
    if (err.hint) console.error(`${yellow('hint:')} ${err.hint}`);
  } else {
    fail(err && err.stack ? err.stack : String(err));
  }
}
