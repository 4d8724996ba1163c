// npm dependencies: `npm ci` when node_modules is missing or package-lock.json changed since the
// last install. The lock's hash is stored in node_modules itself, so deleting node_modules (or a
// fresh clone) naturally triggers a reinstall.
import fs from 'node:fs';
import path from 'node:path';
import { StepError, info, ok, step, rel } from './log.mjs';
import { hashTree, readStamp, writeStamp } from './fingerprint.mjs';
import { isAlive, readPidFile, removeFile, runStep, sleep, onCleanup } from './processes.mjs';

// Binaries the orchestration itself calls; if one is missing the install is incomplete.
const REQUIRED_BINS = ['next', 'knex', 'jest', 'playwright'];

function lockHash(root) {
  // Node's major version is part of the hash: native prebuilt packages are per-ABI.
  return hashTree(root, ['package-lock.json'], `node-${process.versions.node.split('.')[0]}\0`);
}

/**
 * `npm start` and `npm test` may start at the same moment; only one of them may run npm ci
 * (two concurrent installs into one node_modules corrupt it). A tiny pid lock in .data/.
 */
async function withInstallLock(root, fn) {
  const file = path.join(root, '.data', 'npm-install.pid');
  fs.mkdirSync(path.dirname(file), { recursive: true });
  for (;;) {
    try {
      fs.writeFileSync(file, `${process.pid}\n`, { flag: 'wx' });
      break;
    } catch (e) {
      if (e.code !== 'EEXIST') throw e;
      const pid = readPidFile(file);
      if (!pid || !isAlive(pid)) {
        removeFile(file);
        continue;
      }
      info(`waiting for another install (pid ${pid}) to finish…`);
      await sleep(2000);
    }
  }
  const release = onCleanup('npm install lock', () => removeFile(file));
  try {
    return await fn();
  } finally {
    removeFile(file);
    release();
  }
}

/**
 * A developer who ran `npm install` has a node_modules that matches the lock although our stamp is
 * missing or old. npm records what it installed in node_modules/.package-lock.json: if that lists
 * exactly the lock's packages and versions (platform-specific optional ones may be absent) and they
 * are all on disk, adopt the tree instead of reinstalling everything.
 */
function installedTreeMatchesLock(root) {
  try {
    const lock = JSON.parse(fs.readFileSync(path.join(root, 'package-lock.json'), 'utf8')).packages;
    const installed = JSON.parse(fs.readFileSync(path.join(root, 'node_modules', '.package-lock.json'), 'utf8')).packages;
    if (!lock || !installed) return false;
    for (const [key, entry] of Object.entries(lock)) {
      if (!key) continue; // the root project itself
      const got = installed[key];
      if (!got ? !entry.optional : got.version !== entry.version) return false;
    }
    for (const [key, entry] of Object.entries(installed)) {
      if (!lock[key] || lock[key].version !== entry.version) return false;
      if (!fs.existsSync(path.join(root, key))) return false;
    }
    return true;
  } catch {
    return false;
  }
}

export function depsUpToDate(root) {
  const stamp = path.join(root, 'node_modules', '.couplet-lock-hash');
  if (!fs.existsSync(path.join(root, 'package-lock.json'))) return false;
  if (!REQUIRED_BINS.every((b) => fs.existsSync(path.join(root, 'node_modules', '.bin', b)))) return false;
  return readStamp(stamp) === lockHash(root);
}

export async function ensureNodeModules(root, logsDir, baseEnv = process.env) {
  if (depsUpToDate(root)) {
    ok('npm dependencies are up to date');
    return;
  }
  const binsPresent = REQUIRED_BINS.every((b) => fs.existsSync(path.join(root, 'node_modules', '.bin', b)));
  if (binsPresent && installedTreeMatchesLock(root)) {
    writeStamp(path.join(root, 'node_modules', '.couplet-lock-hash'), lockHash(root));
    ok('npm dependencies match package-lock.json (installed by npm install)');
    return;
  }
  await withInstallLock(root, async () => {
    if (depsUpToDate(root)) return; // the other run installed them meanwhile
    const hasLock = fs.existsSync(path.join(root, 'package-lock.json'));
    const args = hasLock ? ['ci', '--no-audit', '--no-fund'] : ['install', '--no-audit', '--no-fund'];
    const why = !fs.existsSync(path.join(root, 'node_modules'))
      ? 'node_modules is missing'
      : 'package-lock.json changed since the last install (or the install was incomplete)';
    step(`npm ${args[0]} (${why})…`);
    const logFile = path.join(logsDir, 'npm-install.log');
    // Never download browsers: e2e tests use Debian's /usr/bin/chromium. And no NODE_ENV from the
    // shell: NODE_ENV=production would make npm skip the devDependencies (jest, playwright, ...).
    const env = { ...baseEnv, PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: '1' };
    delete env.NODE_ENV;
    await runStep({
      title: `npm ${args[0]}`,
      cmd: 'npm',
      args,
      cwd: root,
      logFile,
      env,
      hint: `see ${rel(root, logFile)}; the npm registry must be reachable`,
    });
    const missing = REQUIRED_BINS.filter((b) => !fs.existsSync(path.join(root, 'node_modules', '.bin', b)));
    if (missing.length) {
      throw new StepError(`npm ${args[0]}`, `installed, but node_modules/.bin lacks ${missing.join(', ')}`, {
        hint: 'package.json must list next, knex, jest and @playwright/test',
      });
    }
    writeStamp(path.join(root, 'node_modules', '.couplet-lock-hash'), lockHash(root));
    ok('npm dependencies installed');
  });
}
