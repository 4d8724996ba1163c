// Content hashes that decide whether an expensive step (npm ci, next build) can be skipped.
// Contents, not mtimes: a fresh git clone has new mtimes but needs no rebuild if a hash says so.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

const SKIP_DIRS = new Set(['node_modules', '.git', '.next', '.next-test', '.data']);

function walk(dir, out) {
  let entries;
  try {
    entries = fs.readdirSync(dir, { withFileTypes: true });
  } catch {
    return;
  }
  for (const e of entries) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) {
      if (!SKIP_DIRS.has(e.name)) walk(p, out);
    } else if (e.isFile() || e.isSymbolicLink()) {
      out.push(p);
    }
  }
}

/**
 * sha256 over the relative paths and contents of `entries` (files or directories, relative to
 * root). Missing entries are hashed as missing, so adding one changes the hash too.
 */
export function hashTree(root, entries, extra = '') {
  const h = crypto.createHash('sha256');
  h.update(extra);
  for (const entry of entries) {
    const abs = path.join(root, entry);
    const files = [];
    let st = null;
    try {
      st = fs.statSync(abs);
    } catch {}
    if (!st) {
      h.update(`missing:${entry}\0`);
      continue;
    }
    if (st.isDirectory()) walk(abs, files);
    else files.push(abs);
    files.sort();
    for (const f of files) {
      h.update(`file:${path.relative(root, f)}\0`);
      try {
        h.update(fs.readFileSync(f));
      } catch {
        h.update('unreadable');
      }
      h.update('\0');
    }
  }
  return h.digest('hex');
}

export function readStamp(file) {
  try {
    return fs.readFileSync(file, 'utf8').trim();
  } catch {
    return null;
  }
}

export function writeStamp(file, value) {
  fs.mkdirSync(path.dirname(file), { recursive: true });
  fs.writeFileSync(file, `${value}\n`);
}
