// Debian packages the stack needs but npm cannot provide: MariaDB's server and (for e2e tests)
// Debian's chromium. Installed with apt-get when running as root; otherwise we say what to install.
import fs from 'node:fs';
import path from 'node:path';
import { StepError, ok, step, rel } from './log.mjs';
import { runStep } from './processes.mjs';

const SEARCH_DIRS = () => [...(process.env.PATH || '').split(':').filter(Boolean), '/usr/sbin', '/usr/local/sbin', '/usr/bin', '/sbin'];

/** First executable called one of `names` in PATH or the sbin dirs (mariadbd lives in /usr/sbin). */
export function findExecutable(...names) {
  for (const name of names) {
    for (const dir of SEARCH_DIRS()) {
      const p = path.join(dir, name);
      try {
        fs.accessSync(p, fs.constants.X_OK);
        if (fs.statSync(p).isFile()) return p;
      } catch {}
    }
  }
  return null;
}

export const CHROMIUM = '/usr/bin/chromium';

const PACKAGES = {
  'mariadb-server': () =>
    findExecutable('mariadbd') && findExecutable('mariadb-install-db') && findExecutable('mariadb-admin') && findExecutable('mariadb'),
  chromium: () => fs.existsSync(CHROMIUM),
};

/**
 * Make sure the named Debian packages are installed. One apt-get run for all that are missing, so
 * `apt-get update` happens at most once.
 */
export async function ensureSystemPackages(names, { root, logsDir }) {
  const missing = names.filter((n) => !PACKAGES[n]());
  if (!missing.length) {
    ok(`system packages present: ${names.join(', ')}`);
    return;
  }
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  const aptGet = findExecutable('apt-get');
  if (!isRoot || !aptGet) {
    throw new StepError('system packages', `missing: ${missing.join(', ')}`, {
      hint: aptGet
        ? `install them once as root, then run this command again:\n  sudo apt-get update && sudo apt-get install -y ${missing.join(' ')}`
        : `this machine has no apt-get; install the equivalent of Debian's ${missing.join(' and ')} ` +
          `(mariadbd, mariadb-install-db, mariadb-admin, mariadb${missing.includes('chromium') ? `; chromium at ${CHROMIUM}` : ''})`,
      exitCode: 1,
    });
  }
  const logFile = path.join(logsDir, 'apt-get.log');
  step(`installing Debian packages: ${missing.join(', ')} (apt-get, about a minute)…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  // Wait for a dpkg lock held by another apt run instead of failing at once.
  const lockWait = ['-o', 'DPkg::Lock::Timeout=600'];
  const hint = `see ${rel(root, logFile)}`;
  await runStep({ title: 'apt-get update', cmd: aptGet, args: [...lockWait, 'update'], env, logFile, live: false, hint });
  await runStep({
    title: `apt-get install ${missing.join(' ')}`,
    cmd: aptGet,
    args: [...lockWait, 'install', '-y', ...missing],
    env,
    logFile: path.join(logsDir, 'apt-get-install.log'),
    live: false,
    hint: `see ${rel(root, path.join(logsDir, 'apt-get-install.log'))}`,
  });
  const still = missing.filter((n) => !PACKAGES[n]());
  if (still.length) {
    throw new StepError('system packages', `apt-get finished but ${still.join(', ')} is still not usable`);
  }
  ok(`installed ${missing.join(', ')}`);
}
