#!/usr/bin/env node
/**
 * Load benchmark of the built app on loopback (`npm run load`), in four parts:
 *  1. reads at a working pace: 50 signed-in students of the seeded pad study, one connection each,
 *     each asking for one view a second (far busier than a person clicking through pages), for 60 s
 *     over GET /dashboard, /api/studies, the study's plans, one plan, its readings and its review;
 *     p50/p90/p99 per endpoint and in all, requests/s, non-2xx and errors; target p99 < 100 ms.
 *     The users' seconds are staggered evenly, as independent people's would be.
 *  2. capacity: the same 50 connections without any pause (each sends its next request the moment the
 *     last is answered), 20 s: the most requests/s the machine serves. Latency here is queueing
 *     (Little's law: 50 requests in flight / throughput), so it has no target.
 *  3. solver flood: 5 greedy users with 8 connections each and 20 more users with one each POST
 *     heavy solves (two 200-turn helices at tolerance 1e-9) back to back, waiting out Retry-After when
 *     refused as HTTP clients do, while 25 users read /dashboard once a second; counts of 200 / 429
 *     (a user's share taken) / 503 (queue full), each with Retry-After, and the dashboard's p50/p99
 *     meanwhile; target p99 < 200 ms.
 *  3b. the same flood from runaway clients that ask again the moment they are refused, 15 s: how much
 *     the refusals themselves cost the pages (no target; a rate limit in front of the app is the
 *     usual guard against such clients).
 *  4. the dashboard's first-load JavaScript from the build, and whether three.js or echarts is in it.
 *
 * The load generator runs on the same 2-core machine as the app, MariaDB and the solver threads, and
 * takes its share of the CPU: the figures are an upper bound on what a separate client would see.
 *
 * It runs on an instance of its own ("load": .data/load/, MariaDB 127.0.0.1:3491, SMTP 1028 / inbox
 * 1083, S3 stand-in 4572, app 3191, build in .next-load/; all + COUPLET_PORT_OFFSET) with the same
 * scripts as `npm test`: fresh database, migrations, demo seed, build (skipped when current),
 * `next start`. Everything it started is stopped at the end and on Ctrl-C. A missed latency target
 * is printed as MISSED; the exit code is 1 only when requests failed (socket errors, timeouts, or
 * non-2xx answers where none is expected).
 *
 * First, 10 s of unreported reads and light solves warm the app up (see warmUp); then, before part 1,
 * one connection alone for 10 s gives the cost of a request without queueing.
 *
 * Usage: node scripts/load.mjs [--seconds N] [--capacity-seconds N] [--flood-seconds N] [--runaway-seconds N] [--baseline-seconds N] [--warm-up-seconds N] [--phases 1,2,3,3b,4]
 */
import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import zlib from 'node:zlib';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { createRequire } from 'node:module';
import { fail, info, ok, reportError, setPrefix, step } from './lib/log.mjs';
import { acquireLock, childEnv, getInstance, prepareDirs, readOrCreateSecret, recoverLeftovers, releaseLock, ROOT } from './lib/instance.mjs';
import { databaseUrl, ensureDatabase, startMariaDb } from './lib/mariadb.mjs';
import { migrate, seed } from './lib/database.mjs';
import { clearMailDir, startMail } from './lib/mail.mjs';
import { resetS3Dir, startS3 } from './lib/s3.mjs';
import { buildIfNeeded, startNext } from './lib/next-app.mjs';
import { installSignalHandlers, isShuttingDown, onCleanup, runCleanups } from './lib/processes.mjs';

const require = createRequire(import.meta.url);
const autocannon = require('autocannon');

const arg = (name, fallback) => {
  const i = process.argv.indexOf(name);
  return i > 0 ? Number(process.argv[i + 1]) : fallback;
};
const READ_SECONDS = arg('--seconds', 60);
const CAPACITY_SECONDS = arg('--capacity-seconds', 20);
const FLOOD_SECONDS = arg('--flood-seconds', 30);
const RUNAWAY_SECONDS = arg('--runaway-seconds', 15);
const BASELINE_SECONDS = arg('--baseline-seconds', 10);
const WARM_UP_SECONDS = arg('--warm-up-seconds', 10);
/** Which parts to run (--phases 1,2,3,3b,4); all by default. */
const PHASES = new Set((process.argv.includes('--phases') ? process.argv[process.argv.indexOf('--phases') + 1] : '1,2,3,3b,4').split(','));
const USERS = 50;
const READ_CONNECTIONS = 50;
/** Views a second each reading user asks for (autocannon's connectionRate; it takes whole numbers). */
const USER_RATE = 1;
/** The flood: a few users each opening many connections, and many users with one each. */
const GREEDY_SOLVERS = 5;
const GREEDY_CONNECTIONS = 8;
const SINGLE_SOLVERS = 20;
const FLOOD_READERS = USERS - GREEDY_SOLVERS - SINGLE_SOLVERS;
const READ_P99_TARGET_MS = 100;
const FLOOD_P99_TARGET_MS = 200;
const STUDY = 'Seed-tray pad to buried soil probes';
const PASSWORD = 'load-student-2026';

setPrefix('[couplet load]');

/** Two 200-turn helices at the tightest tolerance the API accepts: the heaviest ordinary solve. */
const HEAVY_SOLVE = {
  transmitter: { kind: 'helix', radius: 0.05, turns: 200, length: 0.3, wireDiameter: 0.001 },
  receiver: { kind: 'helix', radius: 0.05, turns: 200, length: 0.3, wireDiameter: 0.001 },
  placement: { distance: 0.4 },
  circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 },
  tolerance: 1e-9,
};

// ---------------------------------------------------------------------------------------------
// statistics

/** Nearest-rank percentile of sorted values. */
function percentile(sorted, p) {
  if (!sorted.length) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))];
}

class Tally {
  constructor() {
    this.latencies = [];
    /** the status of each latency, in the same order */
    this.order = [];
    this.started = [];
    this.statuses = new Map();
  }
  add(status, ms, at = performance.now()) {
    this.latencies.push(ms);
    this.order.push(status);
    /** when each request started [ms, performance.now() clock] */
    this.started.push(at - ms);
    this.statuses.set(status, (this.statuses.get(status) ?? 0) + 1);
  }
  get count() {
    return this.latencies.length;
  }
  get non2xx() {
    let n = 0;
    for (const [s, c] of this.statuses) if (s < 200 || s > 299) n += c;
    return n;
  }
  summary() {
    const sorted = [...this.latencies].sort((a, b) => a - b);
    return { p50: percentile(sorted, 50), p90: percentile(sorted, 90), p99: percentile(sorted, 99), max: sorted.at(-1) ?? NaN };
  }
}

const fmt = (v) => (Number.isFinite(v) ? v.toFixed(0) : '-');

function table(head, rows) {
  const all = [head, ...rows].map((r) => r.map(String));
  const widths = head.map((_, i) => Math.max(...all.map((r) => r[i].length)));
  const line = (r) => r.map((c, i) => (i === 0 ? c.padEnd(widths[i]) : c.padStart(widths[i]))).join('  ');
  return [line(all[0]), widths.map((w) => '-'.repeat(w)).join('  '), ...all.slice(1).map(line)].join('\n');
}

// ---------------------------------------------------------------------------------------------
// accounts and sign-in

/** Throw-away students of the pad study, written straight into the tables the seed writes. */
async function createStudents(knex) {
  const bcrypt = require('bcryptjs');
  const hash = await bcrypt.hash(PASSWORD, 10);
  const study = await knex('studies').where({ name: STUDY }).first('id');
  if (!study) throw new Error(`the seed has no study "${STUDY}"`);
  const users = [];
  for (let i = 1; i <= USERS; i++) {
    const email = `load.student${String(i).padStart(2, '0')}@couplet.test`;
    const [id] = await knex('users').insert({ email, name: `Load Student ${i}`, password_hash: hash, site_role: 'member' });
    users.push({ id, email });
  }
  await knex('study_members').insert(users.map((u) => ({ study_id: study.id, user_id: u.id, role: 'student' })));
  return { studyId: study.id, users };
}

/** Name=value pairs of Set-Cookie headers, merged into a jar. */
function absorbCookies(jar, response) {
  for (const c of response.headers.getSetCookie()) {
    const [pair] = c.split(';');
    const eq = pair.indexOf('=');
    jar.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
  }
}
const cookieHeader = (jar) => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');

/** next-auth's credentials flow: GET /api/auth/csrf, then POST the form with the CSRF cookie. */
async function signIn(baseUrl, email) {
  const jar = new Map();
  const csrfResponse = await fetch(`${baseUrl}/api/auth/csrf`);
  absorbCookies(jar, csrfResponse);
  const { csrfToken } = await csrfResponse.json();
  const response = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: cookieHeader(jar) },
    body: new URLSearchParams({ csrfToken, email, password: PASSWORD, json: 'true' }),
  });
  absorbCookies(jar, response);
  if (![...jar.keys()].some((k) => k.endsWith('next-auth.session-token'))) {
    throw new Error(`sign-in of ${email} gave no session cookie (HTTP ${response.status}: ${(await response.text()).slice(0, 200)})`);
  }
  // The session cookie alone identifies the user; the CSRF and callback cookies only matter to sign-in.
  return [...jar].filter(([k]) => k.endsWith('next-auth.session-token')).map(([k, v]) => `${k}=${v}`).join('; ');
}

// ---------------------------------------------------------------------------------------------
// load

/**
 * One autocannon instance per connection, each carrying one user's cookie, so every connection is a
 * distinct signed-in user (autocannon's per-request context is reset on each pass of the request list,
 * so it cannot pin a user to a connection). Latencies are recorded per request label.
 */
async function runCannon({ url, requests, cookie, duration, tallies, timeout = 10, rate = 0, delayMs = 0 }) {
  if (delayMs > 0) await new Promise((resolve) => setTimeout(resolve, delayMs));
  return new Promise((resolve, reject) => {
    let removeCleanup = () => {};
    const instance = autocannon(
      {
        url,
        connections: 1,
        pipelining: 1,
        ...(rate > 0 ? { connectionRate: rate } : {}),
        duration,
        timeout,
        headers: { cookie },
        requests: requests.map((r) => ({ ...r, headers: { ...r.headers, cookie } })),
      },
      (error, result) => {
        removeCleanup();
        if (error) reject(error);
        else resolve(result);
      },
    );
    instance.on('response', (client, status, _bytes, ms) => {
      const label = client.requestIterator.currentRequest.label;
      tallies.get(label).add(status, ms);
    });
    removeCleanup = onCleanup('autocannon', () => instance.stop());
  });
}

const sumErrors = (results) => results.reduce((n, r) => n + r.errors + r.timeouts, 0);

/** The reads of parts 1 and 2: the dashboard and the APIs a study's pages load. */
const readEndpoints = ({ studyId, planId }) => [
  { label: 'GET /dashboard', method: 'GET', path: '/dashboard' },
  { label: 'GET /api/studies', method: 'GET', path: '/api/studies' },
  { label: 'GET /api/studies/{id}/plans', method: 'GET', path: `/api/studies/${studyId}/plans` },
  { label: 'GET …/plans/{planId}', method: 'GET', path: `/api/studies/${studyId}/plans/${planId}` },
  { label: 'GET …/plans/{planId}/readings', method: 'GET', path: `/api/studies/${studyId}/plans/${planId}/readings` },
  { label: 'GET …/plans/{planId}/review', method: 'GET', path: `/api/studies/${studyId}/plans/${planId}/review?quantity=coupling` },
];

/**
 * `connections` users reading; with `rate`, each asks `rate` times a second (their seconds staggered
 * evenly), without it each asks again as soon as answered.
 */
async function readPhase(baseUrl, sessions, ids, { connections = READ_CONNECTIONS, seconds: duration = READ_SECONDS, title, target = true, rate = 0 }) {
  const endpoints = readEndpoints(ids);
  const tallies = new Map(endpoints.map((e) => [e.label, new Tally()]));
  const pace = rate > 0 ? `${rate} request(s)/s each` : 'no pause between requests';
  step(`${title.toLowerCase()}: ${connections} user(s), one connection each, ${pace}, ${duration} s over ${endpoints.length} reads…`);
  // Each connection starts at a different point of the list, so every endpoint is hit at every moment.
  const started = performance.now();
  const results = await Promise.all(
    sessions.slice(0, connections).map((cookie, i) => {
      const k = i % endpoints.length;
      const delayMs = rate > 0 ? (1000 * i) / (connections * rate) : 0;
      return runCannon({ url: baseUrl, requests: [...endpoints.slice(k), ...endpoints.slice(0, k)], cookie, duration, tallies, rate, delayMs });
    }),
  );
  // the staggered starts add up to a second that not every user spent reading
  const seconds = (performance.now() - started) / 1000 - (rate > 0 ? 1 / rate : 0);
  const all = new Tally();
  for (const t of tallies.values()) for (let i = 0; i < t.latencies.length; i++) all.latencies.push(t.latencies[i]);
  for (const t of tallies.values()) for (const [s, c] of t.statuses) all.statuses.set(s, (all.statuses.get(s) ?? 0) + c);
  const errors = sumErrors(results);
  const rows = [...tallies, ['all reads', all]].map(([label, t]) => {
    const s = t.summary();
    return [label, t.count, (t.count / seconds).toFixed(1), fmt(s.p50), fmt(s.p90), fmt(s.p99), fmt(s.max), t.non2xx];
  });
  console.log('');
  console.log(`${title}: ${connections} signed-in student(s), ${pace}, ${duration} s, latencies in ms`);
  console.log(table(['endpoint', 'requests', 'req/s', 'p50', 'p90', 'p99', 'max', 'non-2xx'], rows));
  const p99 = all.summary().p99;
  console.log(`socket errors + timeouts: ${errors}`);
  if (target) console.log(`target p99 < ${READ_P99_TARGET_MS} ms for reads: ${p99 < READ_P99_TARGET_MS ? 'met' : 'MISSED'} (p99 ${fmt(p99)} ms)`);
  return { errors, non2xx: all.non2xx, p99, throughput: all.count / seconds, rows };
}

const sleep = (ms) => new Promise((resolve) => setTimeout(resolve, ms));

const SOLVE_LABEL = 'POST /api/solve';

/** An autocannon request posting `body` (JSON text) to /api/solve, tallied under SOLVE_LABEL. */
const solveRequest = (body, more = {}) => ({ label: SOLVE_LABEL, method: 'POST', path: '/api/solve', headers: { 'content-type': 'application/json' }, body, ...more });

/**
 * One POST of `body` to /api/solve over `agent`, with node:http: a plain client costs the shared CPU
 * far less than fetch() (undici with web streams), whose cost on this machine slowed the app it was
 * measuring. Resolves with the status and the Retry-After header.
 */
function postSolve(baseUrl, agent, cookie, body) {
  const url = new URL('/api/solve', baseUrl);
  return new Promise((resolve, reject) => {
    const request = http.request(url, {
      method: 'POST',
      agent,
      timeout: 60_000,
      headers: { cookie, 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) },
    }, (response) => {
      response.resume();
      response.on('end', () => resolve({ status: response.statusCode, retryAfter: response.headers['retry-after'] }));
      response.on('error', reject);
    });
    request.on('timeout', () => request.destroy(new Error('timed out')));
    request.on('error', reject);
    request.end(body);
  });
}

/**
 * One connection posting heavy solves back to back until `until`, the way an HTTP client that honours
 * Retry-After does (RFC 9110, section 10.2.3): after a 429 or 503 it waits the seconds the server named.
 * The connection is kept alive between solves and opened afresh after a wait, as the server closes
 * connections idle for 5 s (Node's keepAliveTimeout) and a POST is not retried on a closed one.
 */
async function politeSolver(baseUrl, cookie, body, until, tally, onRefusal) {
  let errors = 0;
  let agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
  while (performance.now() < until) {
    const started = performance.now();
    let answer;
    try {
      answer = await postSolve(baseUrl, agent, cookie, body);
    } catch {
      errors++;
      continue;
    }
    tally.add(answer.status, performance.now() - started);
    if (answer.status === 429 || answer.status === 503) {
      const seconds = onRefusal(answer.status, answer.retryAfter);
      await sleep(Math.min(seconds * 1000, Math.max(0, until - performance.now())));
      agent.destroy();
      agent = new http.Agent({ keepAlive: true, maxSockets: 1 });
    }
  }
  agent.destroy();
  return { errors, timeouts: 0 };
}

/**
 * Heavy solves from GREEDY_SOLVERS users with GREEDY_CONNECTIONS connections each and SINGLE_SOLVERS
 * users with one, while FLOOD_READERS users read the dashboard USER_RATE times a second. With `polite`,
 * the solvers wait out Retry-After; without, a refused solve is asked again at once, as a runaway
 * script would.
 */
async function floodPhase(baseUrl, sessions, { polite, seconds: duration, title }) {
  const dashboard = { label: 'GET /dashboard', method: 'GET', path: '/dashboard' };
  const body = JSON.stringify(HEAVY_SOLVE);
  const retry = { 429: 0, 503: 0 };
  const noRetry = { 429: 0, 503: 0 };
  const tallies = new Map([[dashboard.label, new Tally()], [SOLVE_LABEL, new Tally()]]);
  const solveConnections = GREEDY_SOLVERS * GREEDY_CONNECTIONS + SINGLE_SOLVERS;
  const behaviour = polite ? 'waiting out Retry-After' : 'ignoring Retry-After';
  step(`${title.toLowerCase()}: ${solveConnections} connections of ${GREEDY_SOLVERS + SINGLE_SOLVERS} users flood POST /api/solve (${behaviour}) while ${FLOOD_READERS} users read /dashboard ${USER_RATE}/s, ${duration} s…`);
  const started = performance.now();
  // Solvers and readers are different users, so the per-user share of the solver is not what keeps
  // the readers' pages quick.
  const solverCookies = [
    ...sessions.slice(0, GREEDY_SOLVERS).flatMap((cookie) => Array(GREEDY_CONNECTIONS).fill(cookie)),
    ...sessions.slice(GREEDY_SOLVERS, GREEDY_SOLVERS + SINGLE_SOLVERS),
  ];
  /** Counts a refusal by whether it carried a usable Retry-After; returns the seconds to wait. */
  const countRetryAfter = (status, value) => {
    if (status !== 503 && status !== 429) return 0;
    const usable = value !== undefined && /^[1-9]\d*$/.test(value);
    (usable ? retry : noRetry)[status]++;
    return usable ? Number(value) : 1;
  };
  const until = performance.now() + duration * 1000;
  // The load generator's own event loop: a stall there would be counted as server latency.
  const generatorDelay = monitorEventLoopDelay({ resolution: 10 });
  generatorDelay.enable();
  const solvers = solverCookies.map((cookie) => (polite
    ? politeSolver(baseUrl, cookie, body, until, tallies.get(SOLVE_LABEL), countRetryAfter)
    : runCannon({
      url: baseUrl,
      requests: [solveRequest(body, { onResponse: (status, _body, _context, headers) => countRetryAfter(status, headers?.['retry-after']) })],
      cookie,
      duration,
      tallies,
      timeout: 60,
    })));
  const readerCookies = sessions.slice(GREEDY_SOLVERS + SINGLE_SOLVERS);
  const readers = readerCookies.map((cookie, i) =>
    runCannon({ url: baseUrl, requests: [dashboard], cookie, duration, tallies, rate: USER_RATE, delayMs: (1000 * i) / (readerCookies.length * USER_RATE) }));
  const [solveResults, readResults] = await Promise.all([Promise.all(solvers), Promise.all(readers)]);
  generatorDelay.disable();
  const seconds = (performance.now() - started) / 1000;
  const s = tallies.get(SOLVE_LABEL);
  const d = tallies.get(dashboard.label);
  const ds = d.summary();
  const solvedLatencies = s.latencies.filter((_, i) => s.order[i] === 200).sort((a, b) => a - b);
  const refusedLatencies = s.latencies.filter((_, i) => s.order[i] !== 200).sort((a, b) => a - b);
  const other = [...s.statuses].filter(([st]) => ![200, 429, 503].includes(st)).map(([st, c]) => `${st}: ${c}`).join(', ') || 'none';
  console.log('');
  console.log(`${title}: ${solveConnections} connections of heavy solves (two 200-turn helices, tolerance 1e-9; ${GREEDY_SOLVERS} users with ${GREEDY_CONNECTIONS} connections, ${SINGLE_SOLVERS} with one; ${behaviour}) + ${FLOOD_READERS} users reading /dashboard ${USER_RATE}/s, ${duration} s`);
  console.log(table(['solve answers', 'count'], [
    ['200', s.statuses.get(200) ?? 0],
    ['429, share taken (with Retry-After / without)', `${s.statuses.get(429) ?? 0} (${retry[429]} / ${noRetry[429]})`],
    ['503, queue full (with Retry-After / without)', `${s.statuses.get(503) ?? 0} (${retry[503]} / ${noRetry[503]})`],
    ['other statuses', other],
    ['socket errors + timeouts', sumErrors(solveResults)],
  ]));
  console.log(`solved (200) latency ms: p50 ${fmt(percentile(solvedLatencies, 50))}, p99 ${fmt(percentile(solvedLatencies, 99))}; ${((s.statuses.get(200) ?? 0) / seconds).toFixed(1)} solves/s`);
  console.log(`refusals (429/503): ${(refusedLatencies.length / seconds).toFixed(1)}/s, answered in p50 ${fmt(percentile(refusedLatencies, 50))} ms, p99 ${fmt(percentile(refusedLatencies, 99))} ms`);
  console.log(`dashboard during the flood: ${d.count} requests (${(d.count / seconds).toFixed(1)}/s), p50 ${fmt(ds.p50)} ms, p90 ${fmt(ds.p90)} ms, p99 ${fmt(ds.p99)} ms, non-2xx ${d.non2xx}, errors ${sumErrors(readResults)}`);
  // when the slowest reads started, from the flood's start: a burst shows as a cluster of times
  const slowest = d.latencies.map((ms, i) => [ms, (d.started[i] - started) / 1000]).sort((a, b) => b[0] - a[0]).slice(0, Math.max(1, Math.ceil(d.count / 100)));
  console.log(`the load generator's event loop meanwhile: delay p99 ${fmt(generatorDelay.percentile(99) / 1e6)} ms, max ${fmt(generatorDelay.max / 1e6)} ms`);
  console.log(`slowest 1 % of those reads (ms @ s after the flood began): ${slowest.map(([ms, at]) => `${fmt(ms)} @ ${at.toFixed(1)}`).join(', ')}`);
  if (polite) console.log(`target dashboard p99 < ${FLOOD_P99_TARGET_MS} ms during the flood: ${ds.p99 < FLOOD_P99_TARGET_MS ? 'met' : 'MISSED'}`);
  // 429 and 503 are the server shedding load as designed; a solve answer of another status, a refusal
  // without Retry-After, or a failed dashboard read is an error.
  const otherCount = [...s.statuses].filter(([st]) => ![200, 429, 503].includes(st)).reduce((n, [, c]) => n + c, 0);
  const errors = sumErrors(solveResults) + sumErrors(readResults) + d.non2xx + otherCount + noRetry[503] + noRetry[429];
  return { errors };
}

// ---------------------------------------------------------------------------------------------
// first-load JavaScript

/**
 * The dashboard's first-load JavaScript: the build's root main files plus the page's entry chunks
 * from its client reference manifest (what the browser loads before the page is interactive).
 */
function firstLoadJs(inst) {
  const dist = path.join(inst.root, inst.distDir);
  const files = new Set();
  const buildManifest = JSON.parse(fs.readFileSync(path.join(dist, 'build-manifest.json'), 'utf8'));
  for (const f of [...(buildManifest.rootMainFiles ?? []), ...(buildManifest.polyfillFiles ?? [])]) if (f.endsWith('.js')) files.add(f);
  const polyfills = new Set(buildManifest.polyfillFiles ?? []); // loaded only by browsers without modules
  const appManifestFile = path.join(dist, 'app-build-manifest.json');
  let source;
  if (fs.existsSync(appManifestFile)) {
    const pages = JSON.parse(fs.readFileSync(appManifestFile, 'utf8')).pages ?? {};
    const key = Object.keys(pages).find((k) => /\/dashboard\/page$/.test(k));
    for (const f of pages[key] ?? []) if (f.endsWith('.js')) files.add(f);
    source = `app-build-manifest.json (${key})`;
  } else {
    const manifest = path.join(dist, 'server', 'app', '(app)', 'dashboard', 'page_client-reference-manifest.js');
    const text = fs.readFileSync(manifest, 'utf8');
    const sandbox = { globalThis: {} };
    sandbox.globalThis = sandbox;
    new Function('globalThis', 'self', text)(sandbox, sandbox);
    const entries = Object.values(sandbox.__RSC_MANIFEST ?? {})[0]?.entryJSFiles ?? {};
    for (const list of Object.values(entries)) for (const f of list) if (f.endsWith('.js')) files.add(f);
    source = path.relative(inst.root, manifest);
  }
  const rows = [];
  let raw = 0;
  let gzip = 0;
  const markers = { three: [], echarts: [] };
  for (const f of files) {
    const full = path.join(dist, f.replace(/^\/?_next\//, ''));
    const buf = fs.readFileSync(full);
    const gz = zlib.gzipSync(buf, { level: 9 }).length;
    if (!polyfills.has(f)) {
      raw += buf.length;
      gzip += gz;
    }
    const text = buf.toString('utf8');
    // three.js names its build and its revision; echarts registers itself under these names.
    if (/THREE\.WebGLRenderer|WebGLRenderer|REVISION\s*=\s*["']\d+|__THREE__/.test(text)) markers.three.push(f);
    if (/echarts|ECharts|zrender/.test(text)) markers.echarts.push(f);
    rows.push([f, (buf.length / 1024).toFixed(1), (gz / 1024).toFixed(1), polyfills.has(f) ? 'polyfill (nomodule, not counted)' : '']);
  }
  console.log('');
  console.log(`Phase 4 — first-load JavaScript of /dashboard (from ${source})`);
  console.log(table(['chunk', 'kB', 'kB gzip', 'note'], rows));
  console.log(table(['route', 'first-load JS kB', 'kB gzip', 'three.js', 'echarts'], [[
    '/dashboard', (raw / 1024).toFixed(1), (gzip / 1024).toFixed(1),
    markers.three.length ? `PRESENT (${markers.three.join(', ')})` : 'absent',
    markers.echarts.length ? `PRESENT (${markers.echarts.join(', ')})` : 'absent',
  ]]));
  return { raw, gzip, markers };
}

// ---------------------------------------------------------------------------------------------
// warm-up

/** The light solve of the warm-up: two single loops, answered in milliseconds. */
const LIGHT_SOLVE = {
  ...HEAVY_SOLVE,
  transmitter: { kind: 'loop', radius: 0.05, wireDiameter: 0.001 },
  receiver: { kind: 'loop', radius: 0.05, wireDiameter: 0.001 },
  tolerance: 1e-6,
};

/**
 * Brings the app to the state of a server that has been in use a while, which is what the parts
 * measure: V8 compiles a path for speed only after running it many times, and the database pool
 * grows to its working size. A fresh server's first second of heavy traffic is several times slower
 * than the next (25 first dashboards and a first flood together stalled it for about a second).
 * For WARM_UP_SECONDS, 25 users read every endpoint of part 1 without pause while two more users
 * post light solves on 8 connections each: the same intake as a heavy solve (session, share, body,
 * validation), answered or refused for the share. Nothing of it is reported; a failure stops the run.
 */
async function warmUp(baseUrl, sessions, ids) {
  step(`warming up for ${WARM_UP_SECONDS} s: 25 users reading, 16 connections posting light solves…`);
  const endpoints = readEndpoints(ids);
  const tallies = new Map([...endpoints.map((e) => [e.label, new Tally()]), [SOLVE_LABEL, new Tally()]]);
  const solve = solveRequest(JSON.stringify(LIGHT_SOLVE));
  const readers = sessions.slice(0, 25).map((cookie, i) => {
    const k = i % endpoints.length;
    return runCannon({ url: baseUrl, requests: [...endpoints.slice(k), ...endpoints.slice(0, k)], cookie, duration: WARM_UP_SECONDS, tallies });
  });
  const solvers = sessions.slice(25, 27).flatMap((cookie) => Array.from({ length: 8 }, () => runCannon({ url: baseUrl, requests: [solve], cookie, duration: WARM_UP_SECONDS, tallies })));
  const results = await Promise.all([...readers, ...solvers]);
  const unexpected = [...tallies].flatMap(([label, t]) => [...t.statuses].filter(([status]) => status !== 200 && !(label === SOLVE_LABEL && status === 429)).map(([status, n]) => `${label} ${status} ×${n}`));
  if (sumErrors(results) || unexpected.length) throw new Error(`the warm-up failed: ${sumErrors(results)} socket errors or timeouts; ${unexpected.join(', ') || 'no unexpected statuses'}`);
  // the light solves still queued finish in milliseconds; the parts start with an idle solver
  await sleep(1000);
  ok(`warm: ${[...tallies.values()].reduce((n, t) => n + t.count, 0)} requests answered`);
}

// ---------------------------------------------------------------------------------------------

async function main() {
  const inst = getInstance('load');
  prepareDirs(inst);
  const busy = acquireLock(inst);
  if (busy) {
    fail(`another load run is going (pid ${busy}); wait for it`);
    process.exit(1);
  }
  onCleanup('instance lock', () => releaseLock(inst));
  installSignalHandlers();
  await recoverLeftovers(inst);

  const password = readOrCreateSecret(path.join(inst.dir, 'db-password'), 18);
  const nextauthSecret = readOrCreateSecret(path.join(inst.dir, 'nextauth-secret'), 32);
  await startMariaDb(inst);
  const url = databaseUrl(inst, password);
  const env = childEnv(inst, { databaseUrl: url, mailStandIn: true, s3StandIn: true, nextauthSecret });
  await ensureDatabase(inst, { password, recreate: true });
  await migrate(inst, env);
  await seed(inst, env);
  clearMailDir(inst);
  await startMail(inst, env);
  resetS3Dir(inst);
  await startS3(inst, env);

  const knex = require('knex')({ client: 'mysql2', connection: url, pool: { min: 0, max: 2 } });
  onCleanup('database pool', () => knex.destroy());
  step(`creating ${USERS} throw-away students of "${STUDY}"…`);
  const { studyId, users } = await createStudents(knex);
  // The plan with the most readings: the heaviest readings list and review of the demo data.
  const plan = await knex('sweep_plans as p').leftJoin('readings as r', 'r.plan_id', 'p.id').where('p.study_id', studyId)
    .groupBy('p.id').orderByRaw('count(r.id) desc').first('p.id', knex.raw('count(r.id) as readings'));
  ok(`students created; plan ${plan.id} has ${plan.readings} readings`);

  await buildIfNeeded(inst, env);
  await startNext(inst, env);

  // Successful sign-ins are not counted by the limiter (it counts failures only), so 50 in a row are fine.
  step(`signing ${USERS} students in through next-auth's credentials flow…`);
  const sessions = [];
  for (const u of users) sessions.push(await signIn(inst.appUrl, u.email));
  ok(`${sessions.length} sessions`);
  const ids = { studyId, planId: plan.id };
  await warmUp(inst.appUrl, sessions, ids);

  const started = new Date().toISOString();
  // One user alone first: the cost of a request without queueing, to read the loaded figures against.
  const none = { errors: 0, non2xx: 0 };
  const alone = PHASES.has('1') ? await readPhase(inst.appUrl, sessions, ids, { connections: 1, seconds: BASELINE_SECONDS, title: 'Baseline — one connection', target: false }) : none;
  const reads = PHASES.has('1') ? await readPhase(inst.appUrl, sessions, ids, { title: 'Phase 1 — reads at a working pace', rate: USER_RATE }) : none;
  const capacity = PHASES.has('2') ? await readPhase(inst.appUrl, sessions, ids, { seconds: CAPACITY_SECONDS, title: 'Phase 2 — capacity, no pause', target: false }) : none;
  if (PHASES.has('2')) console.log(`capacity: ${capacity.throughput.toFixed(0)} requests/s with ${READ_CONNECTIONS} requests always in flight`);
  const flood = PHASES.has('3') ? await floodPhase(inst.appUrl, sessions, { polite: true, seconds: FLOOD_SECONDS, title: 'Phase 3 — solver flood' }) : none;
  // the queue drains before the next part, so it starts from the same state
  if (PHASES.has('3') && PHASES.has('3b')) await sleep(15_000);
  const runaway = PHASES.has('3b') ? await floodPhase(inst.appUrl, sessions, { polite: false, seconds: RUNAWAY_SECONDS, title: 'Phase 3b — runaway clients' }) : none;
  if (PHASES.has('4')) firstLoadJs(inst);

  console.log('');
  console.log(`started ${started}; ${process.version}; load average at the end ${(await import('node:os')).loadavg().map((l) => l.toFixed(2)).join(' ')}`);
  const errors = alone.errors + alone.non2xx + reads.errors + reads.non2xx + capacity.errors + capacity.non2xx + flood.errors + runaway.errors;
  if (errors) fail(`${errors} failed requests (errors, timeouts or unexpected statuses)`);
  else ok('no failed requests');
  return errors ? 1 : 0;
}

let code = 1;
try {
  code = await main();
} catch (error) {
  if (isShuttingDown()) await new Promise(() => {});
  reportError(error, ROOT);
}
await runCleanups();
process.exit(code);
