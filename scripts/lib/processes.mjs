// Child processes: foreground steps (npm ci, knex, next build, jest, ...) and background services
// (MariaDB, mail stand-in, Next). Every child is spawned detached, i.e. as the leader of its own
// process group, so that
//   - a terminal Ctrl-C reaches only this orchestrator, which then stops things in a sane order
//     (app first, database last) instead of everything dying at once;
//   - stopping a child also stops its workers (next start, jest and playwright fork), by signalling
//     the whole group.
// Children also carry COUPLET_INSTANCE_DIR in their environment: after a run was killed with
// SIGKILL the next run finds its orphans by that marker, even without pid files.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import http from 'node:http';
import path from 'node:path';
import { StepError, info, warn } from './log.mjs';

export const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

// ---------------------------------------------------------------------------------------------
// /proc helpers

function procStat(pid) {
  try {
    const s = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name (field 2) may contain spaces and parentheses: parse after the last ')'.
    const rest = s.slice(s.lastIndexOf(')') + 2).split(' ');
    return { state: rest[0], ppid: Number(rest[1]), pgrp: Number(rest[2]) };
  } catch {
    return null;
  }
}

function allPids() {
  try {
    return fs.readdirSync('/proc').filter((d) => /^\d+$/.test(d)).map(Number);
  } catch {
    return [];
  }
}

/** Alive and not a zombie (PID 1 here may not reap orphans quickly, so zombies count as dead). */
export function isAlive(pid) {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
  } catch (e) {
    if (e.code !== 'EPERM') return false;
  }
  const st = procStat(pid);
  return st ? st.state !== 'Z' && st.state !== 'X' : true;
}

export function processEnv(pid) {
  try {
    return fs.readFileSync(`/proc/${pid}/environ`, 'utf8').split('\0');
  } catch {
    return [];
  }
}

export function processCmdline(pid) {
  try {
    return fs.readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').join(' ').trim();
  } catch {
    return '';
  }
}

/** Live members of a process group. */
export function groupMembers(pgid) {
  return allPids().filter((p) => {
    const st = procStat(p);
    return st && st.pgrp === pgid && st.state !== 'Z' && st.state !== 'X';
  });
}

/** This process and its ancestors: never to be treated as orphans. */
function selfAndAncestors() {
  const seen = new Set();
  let pid = process.pid;
  while (pid > 1 && !seen.has(pid)) {
    seen.add(pid);
    const st = procStat(pid);
    if (!st) break;
    pid = st.ppid;
  }
  return seen;
}

/** Live processes whose environment contains exactly KEY=VALUE. */
export function findProcessesWithEnv(key, value) {
  const needle = `${key}=${value}`;
  const skip = selfAndAncestors();
  return allPids().filter((pid) => !skip.has(pid) && isAlive(pid) && processEnv(pid).includes(needle));
}

// ---------------------------------------------------------------------------------------------
// pid files

export function readPidFile(file) {
  try {
    const n = parseInt(fs.readFileSync(file, 'utf8').trim(), 10);
    return n > 0 ? n : null;
  } catch {
    return null;
  }
}
export function writePidFile(file, pid) {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, `${pid}\n`);
}
export function removeFile(file) {
  try {
    fs.unlinkSync(file);
  } catch {}
}

// ---------------------------------------------------------------------------------------------
// stopping

function signal(pid, sig) {
  const ownGroup = procStat(process.pid)?.pgrp;
  // Signal the whole group when pid leads one (everything we spawn does), never our own group.
  if (pid !== ownGroup && groupMembers(pid).length) {
    try {
      process.kill(-pid, sig);
      return;
    } catch {}
  }
  try {
    process.kill(pid, sig);
  } catch {}
}

function treeAlive(pid) {
  return isAlive(pid) || groupMembers(pid).length > 0;
}

/**
 * Stop a process and its group: `sig` first (SIGTERM lets MariaDB and Next shut down cleanly),
 * SIGKILL when it is still there after `timeoutMs`. Resolves once nothing of it is left.
 */
export async function stopTree(pid, { sig = 'SIGTERM', timeoutMs = 15000 } = {}) {
  if (!pid || !treeAlive(pid)) return true;
  signal(pid, sig);
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (!treeAlive(pid)) return true;
    await sleep(100);
  }
  warn(`process ${pid} did not stop after ${sig} within ${timeoutMs / 1000}s: killing it`);
  signal(pid, 'SIGKILL');
  for (let i = 0; i < 50 && treeAlive(pid); i++) await sleep(100);
  return !treeAlive(pid);
}

// ---------------------------------------------------------------------------------------------
// cleanup and signals

const cleanups = [];
const foreground = new Set();
const services = new Set();
let cleanupRun = null;
let shuttingDown = false;

/** Register a stop function; they run in reverse order of registration (app before database). */
export function onCleanup(label, fn) {
  const entry = { label, fn };
  cleanups.push(entry);
  return () => {
    const i = cleanups.indexOf(entry);
    if (i >= 0) cleanups.splice(i, 1);
  };
}

/** Run all cleanups once; concurrent callers share the same run. */
export function runCleanups() {
  cleanupRun ??= (async () => {
    await Promise.all([...foreground].map((c) => stopTree(c.pid, { timeoutMs: 10000 })));
    while (cleanups.length) {
      const e = cleanups.pop();
      try {
        await e.fn();
      } catch (err) {
        warn(`while stopping ${e.label}: ${err.message}`);
      }
    }
  })();
  return cleanupRun;
}

export const isShuttingDown = () => shuttingDown;

/** Stop everything and exit; used by the signal handlers and the top-level error handler. */
export async function shutdown(code) {
  shuttingDown = true;
  await runCleanups();
  process.exit(code);
}

/**
 * Ctrl-C / SIGTERM / SIGHUP: stop every process this command started, then exit 130/143/129.
 * A second signal stops waiting and SIGKILLs what is left.
 */
export function installSignalHandlers() {
  const codes = { SIGINT: 130, SIGTERM: 143, SIGHUP: 129 };
  for (const sig of Object.keys(codes)) {
    process.on(sig, () => {
      if (shuttingDown) {
        warn(`${sig} again: killing what is left without waiting`);
        for (const c of [...foreground, ...services]) if (c.pid) signal(c.pid, 'SIGKILL');
        process.exit(codes[sig]);
      }
      console.log('');
      info(`${sig} received: stopping everything this command started…`);
      shutdown(codes[sig]);
    });
  }
}

// ---------------------------------------------------------------------------------------------
// running

/**
 * Run a foreground step to completion. Output goes live to the terminal (when `live`) and always
 * to `logFile`, whose tail is shown if the step fails. Resolves { code, stdout }; rejects with a
 * StepError on a non-zero exit unless `allowFailure`. `input` is written to the child's stdin.
 */
export function runStep({ title, cmd, args = [], env = process.env, cwd, logFile, live = true, allowFailure = false, hint = '', input }) {
  return new Promise((resolve, reject) => {
    if (shuttingDown) return reject(new StepError(title, 'interrupted'));
    let log = null;
    if (logFile) {
      fs.mkdirSync(path.dirname(logFile), { recursive: true });
      log = fs.openSync(logFile, 'w');
      fs.writeSync(log, `$ ${cmd} ${args.join(' ')}\n`);
    }
    const child = spawn(cmd, args, { cwd, env, detached: true, stdio: [input === undefined ? 'ignore' : 'pipe', 'pipe', 'pipe'] });
    foreground.add(child);
    // stdin carries e.g. SQL with a password, which must not show up in `ps` as an argument.
    if (input !== undefined) {
      child.stdin.on('error', () => {});
      child.stdin.end(input);
    }
    let stdout = '';
    const pipeTo = (stream, out) => (d) => {
      if (stream === 'stdout' && stdout.length < 1 << 20) stdout += d;
      if (live) out.write(d);
      if (log !== null) fs.writeSync(log, d);
    };
    child.stdout.on('data', pipeTo('stdout', process.stdout));
    child.stderr.on('data', pipeTo('stderr', process.stderr));
    let spawnError = null;
    child.on('error', (e) => (spawnError = e));
    child.on('close', (code, sig) => {
      foreground.delete(child);
      if (log !== null) fs.closeSync(log);
      if (spawnError) {
        return reject(new StepError(title, `could not run ${cmd}: ${spawnError.message}`, { hint }));
      }
      if (code === 0 || allowFailure) return resolve({ code: code ?? 128, signal: sig, stdout });
      const how = sig ? `was killed by ${sig}` : `exited with code ${code}`;
      reject(new StepError(title, `${path.basename(cmd)} ${how}`, { logs: logFile ? [logFile] : [], hint }));
    });
  });
}

/**
 * Start a long-running service in the background. stdout/stderr go straight to `logFile` (not
 * through us), so the service is unaffected if this orchestrator is killed. Writes `pidFile`.
 */
export function startService({ title, cmd, args = [], env = process.env, cwd, logFile, pidFile }) {
  fs.mkdirSync(path.dirname(logFile), { recursive: true });
  const fd = fs.openSync(logFile, 'a');
  fs.writeSync(fd, `\n==== ${new Date().toISOString()} ${title}: ${cmd} ${args.join(' ')}\n`);
  const child = spawn(cmd, args, { cwd, env, detached: true, stdio: ['ignore', fd, fd] });
  fs.closeSync(fd);
  if (!child.pid) {
    throw new StepError(title, `could not start ${cmd}`, { logs: [logFile] });
  }
  services.add(child);
  child.on('exit', () => services.delete(child));
  child.on('error', () => {});
  if (pidFile) writePidFile(pidFile, child.pid);
  return child;
}

/** True when the child has exited (we spawned it, so Node tracks its exit). */
export const hasExited = (child) => child.exitCode !== null || child.signalCode !== null;

/**
 * Poll `probe` until it returns a truthy value. `check` runs before each probe and may throw
 * (e.g. "the server process exited") to give up early.
 */
export async function waitFor(probe, { timeoutMs, intervalMs = 250, check = () => {}, what }) {
  const deadline = Date.now() + timeoutMs;
  let last;
  while (Date.now() < deadline) {
    if (shuttingDown) throw new StepError(what, 'interrupted');
    check();
    try {
      last = await probe();
      if (last && last.ok !== false) return last;
    } catch (e) {
      last = e;
    }
    await sleep(intervalMs);
  }
  return null;
}

/** Is something accepting TCP connections on host:port? */
export function portInUse(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const sock = net.connect({ port, host });
    const done = (v) => {
      sock.destroy();
      resolve(v);
    };
    sock.setTimeout(1000, () => done(true));
    sock.once('connect', () => done(true));
    sock.once('error', () => done(false));
  });
}

/** Minimal HTTP GET (no dependencies): resolves { status, body } or rejects on connection errors. */
export function httpGet(url, timeoutMs = 5000) {
  return new Promise((resolve, reject) => {
    const req = http.get(url, { timeout: timeoutMs }, (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (d) => (body += d));
      res.on('end', () => resolve({ status: res.statusCode, body }));
    });
    req.on('timeout', () => req.destroy(new Error('timeout')));
    req.on('error', reject);
  });
}
