// The Next.js app: production build (skipped when its inputs are unchanged), `next start` or
// `next dev` as a background service, and the wait for GET /api/health.
import fs from 'node:fs';
import path from 'node:path';
import { StepError, ok, step, info, rel } from './log.mjs';
import { hashTree, readStamp, writeStamp } from './fingerprint.mjs';
import { hasExited, httpGet, onCleanup, portInUse, removeFile, runStep, startService, stopTree, waitFor } from './processes.mjs';

// Everything that changes the build output. database/ is not bundled (migrations run via knex).
const BUILD_INPUTS = [
  'src',
  'public',
  'next.config.js',
  'tailwind.config.ts',
  'postcss.config.mjs',
  'package-lock.json',
  'package.json',
  'knexfile.ts',
];

const nextBin = (inst) => path.join(inst.root, 'node_modules', '.bin', 'next');
const distDir = (inst) => path.join(inst.root, inst.distDir);
const stampFile = (inst) => path.join(distDir(inst), '.couplet-build-hash');

/**
 * tsconfig.json as it matters for the build. `next build` itself rewrites the file (formatting, and
 * `include` entries for each distDir's generated types), so the dev and test builds would keep
 * invalidating each other's hash: ignore formatting and those generated entries.
 */
function tsconfigForHash(root) {
  let raw;
  try {
    raw = fs.readFileSync(path.join(root, 'tsconfig.json'), 'utf8');
  } catch {
    return 'missing';
  }
  try {
    const cfg = JSON.parse(raw);
    if (Array.isArray(cfg.include)) cfg.include = cfg.include.filter((p) => !/^\.next[^/]*\//.test(p)).sort();
    return JSON.stringify(cfg);
  } catch {
    return raw; // comments or trailing commas: hash it as it is
  }
}

/** Variables next.config.js reads at build time: the file store's origin goes into the CSP. */
const CONFIG_ENV = ['S3_PUBLIC_URL', 'S3_ENDPOINT', 'S3_BUCKET', 'S3_FORCE_PATH_STYLE'];

function buildHash(inst, env) {
  // .env files and NEXT_PUBLIC_* variables are baked into the bundle at build time.
  const envFiles = fs.readdirSync(inst.root).filter((f) => /^\.env/.test(f));
  const publicEnv = Object.keys(process.env)
    .filter((k) => k.startsWith('NEXT_PUBLIC_'))
    .sort()
    .map((k) => `${k}=${process.env[k]}`)
    .join('\n');
  const configEnv = CONFIG_ENV.map((k) => `${k}=${env[k] ?? ''}`).join('\n');
  return hashTree(inst.root, [...BUILD_INPUTS, ...envFiles.sort()], `${inst.distDir}\n${publicEnv}\n${configEnv}\n${tsconfigForHash(inst.root)}\n`);
}

function requireAppFiles(inst, stepName) {
  const missing = ['next.config.js', 'src/app'].filter((f) => !fs.existsSync(path.join(inst.root, f)));
  if (missing.length) {
    throw new StepError(stepName, `missing ${missing.join(' and ')}`, {
      hint: 'the Next.js app (App Router under src/app, next.config.js) is not there yet',
    });
  }
}

/** `next build` into the instance's distDir, unless the stored hash says the build is current. */
export async function buildIfNeeded(inst, env) {
  requireAppFiles(inst, 'next build');
  const before = buildHash(inst, env);
  if (readStamp(stampFile(inst)) === before && fs.existsSync(path.join(distDir(inst), 'BUILD_ID'))) {
    ok(`Next build in ${inst.distDir}/ is up to date`);
    return;
  }
  step(`building the app (next build → ${inst.distDir}/, about a minute)…`);
  const logFile = path.join(inst.logsDir, 'next-build.log');
  removeFile(stampFile(inst)); // an interrupted build must not look current
  await runStep({
    title: 'next build',
    cmd: nextBin(inst),
    args: ['build'],
    env: { ...env, NODE_ENV: 'production' },
    cwd: inst.root,
    logFile,
    hint: `full output in ${rel(inst.root, logFile)}`,
  });
  if (!fs.existsSync(path.join(distDir(inst), 'BUILD_ID'))) {
    throw new StepError('next build', `the build finished but ${inst.distDir}/BUILD_ID does not exist`, {
      hint: "next.config.js must set distDir: process.env.COUPLET_DIST_DIR || '.next'",
    });
  }
  // The hash from before the build: a source edited while it ran must trigger the next build.
  writeStamp(stampFile(inst), before);
  ok('build finished');
}

/**
 * Start `next start` (or `next dev` with dev: true) on the instance's port and wait until
 * GET /api/health answers 200. Returns { child, logFile, logOffset }.
 */
export async function startNext(inst, env, { dev = false } = {}) {
  requireAppFiles(inst, dev ? 'next dev' : 'next start');
  if (await portInUse(inst.appPort)) {
    throw new StepError('start Next', `port ${inst.appPort} on 127.0.0.1 is already in use by another program`, {
      hint: `find it with: ss -ltnp 'sport = :${inst.appPort}'`,
    });
  }
  const logFile = path.join(inst.logsDir, 'next.log');
  const pidFile = path.join(inst.runDir, 'next.pid');
  let logOffset = 0;
  try {
    logOffset = fs.statSync(logFile).size;
  } catch {}
  step(`starting the app (next ${dev ? 'dev' : 'start'}) on ${inst.appUrl}…`);
  const childEnv = { ...env };
  if (dev) delete childEnv.NODE_ENV; // next dev sets development itself
  else childEnv.NODE_ENV = 'production';
  const child = startService({
    title: `next ${dev ? 'dev' : 'start'}`,
    cmd: nextBin(inst),
    args: [dev ? 'dev' : 'start', '-H', '127.0.0.1', '-p', String(inst.appPort)],
    env: childEnv,
    cwd: inst.root,
    logFile,
    pidFile,
  });
  onCleanup('Next', async () => {
    if (!hasExited(child)) info('stopping the app…');
    await stopTree(child.pid, { timeoutMs: 15000 });
    removeFile(pidFile);
  });

  // next dev compiles the route on first request: allow it more time.
  const timeoutMs = dev ? 240000 : 90000;
  let last = 'no answer';
  const healthy = await waitFor(
    async () => {
      try {
        const r = await httpGet(`${inst.appUrl}/api/health`, 30000);
        last = `HTTP ${r.status}`;
        return r.status === 200;
      } catch (e) {
        last = e.code || e.message;
        return false;
      }
    },
    {
      what: 'start Next',
      timeoutMs,
      intervalMs: 500,
      check: () => {
        if (hasExited(child)) {
          throw new StepError('start Next', `next exited (code ${child.exitCode ?? child.signalCode}) while starting`, {
            logs: [{ file: logFile, from: logOffset }],
          });
        }
      },
    },
  );
  if (!healthy) {
    throw new StepError('start Next', `GET ${inst.appUrl}/api/health did not answer 200 within ${timeoutMs / 1000} s (last: ${last})`, {
      logs: [{ file: logFile, from: logOffset }],
      hint: 'the app must serve GET /api/health with 200 (src/app/api/health/route.ts)',
    });
  }
  ok(`app is up (pid ${child.pid}) at ${inst.appUrl}`);
  return { child, logFile, logOffset };
}
