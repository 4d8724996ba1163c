// Starts scripts/s3-server.mjs (the S3 stand-in, s3rver) as a background service of an instance
// and waits until its bucket answers.
import fs from 'node:fs';
import path from 'node:path';
import { StepError, ok, step, info, rel } from './log.mjs';
import { S3_STAND_IN } from './instance.mjs';
import { hasExited, httpGet, onCleanup, portInUse, removeFile, startService, stopTree, waitFor } from './processes.mjs';

export async function startS3(inst, env) {
  if (await portInUse(inst.s3Port)) {
    throw new StepError('start S3 stand-in', `port ${inst.s3Port} on 127.0.0.1 is already in use by another program`, {
      hint: `find it with: ss -ltnp 'sport = :${inst.s3Port}'; or set S3_ENDPOINT (and the other S3_* variables) to use a real S3 bucket`,
    });
  }
  step(`starting the S3 stand-in (${inst.s3Url}, bucket ${S3_STAND_IN.bucket})…`);
  const logFile = path.join(inst.logsDir, 's3.log');
  const pidFile = path.join(inst.runDir, 's3.pid');
  let from = 0; // s3.log is appended to across runs: on failure show this run's lines only
  try {
    from = fs.statSync(logFile).size;
  } catch {}
  const child = startService({
    title: 'S3 stand-in',
    cmd: process.execPath,
    args: [
      path.join(inst.root, 'scripts', 's3-server.mjs'),
      '--port', String(inst.s3Port),
      '--dir', inst.s3Dir,
      '--bucket', S3_STAND_IN.bucket,
      '--host', '127.0.0.1',
    ],
    env,
    cwd: inst.root,
    logFile,
    pidFile,
  });
  onCleanup('S3 stand-in', async () => {
    if (!hasExited(child)) info('stopping the S3 stand-in…');
    await stopTree(child.pid, { timeoutMs: 10000 });
    removeFile(pidFile);
  });
  // Listing the bucket (unsigned reads are allowed by the stand-in) proves the bucket exists too.
  const up = await waitFor(async () => (await httpGet(`${inst.s3Url}/${S3_STAND_IN.bucket}?max-keys=1`, 2000)).status === 200, {
    what: 'start S3 stand-in',
    timeoutMs: 30000,
    check: () => {
      if (hasExited(child)) {
        throw new StepError('start S3 stand-in', `s3-server.mjs exited (code ${child.exitCode ?? child.signalCode})`, {
          logs: [{ file: logFile, from }],
        });
      }
    },
  });
  if (!up) throw new StepError('start S3 stand-in', 'no answer within 30 s', { logs: [{ file: logFile, from }] });
  ok(`S3 stand-in is up (pid ${child.pid}, objects in ${rel(inst.root, inst.s3Dir)})`);
  return child;
}

/** Remove every stored object and bucket; the stand-in recreates its bucket when it starts. */
export function resetS3Dir(inst) {
  fs.rmSync(inst.s3Dir, { recursive: true, force: true });
}

/**
 * Remove the objects of the stand-in's bucket while it runs, keeping the bucket itself (its
 * directory and the bucket-level `._S3rver_*` files), so tests after this start with an empty bucket.
 */
export function clearS3Objects(inst) {
  const bucketDir = path.join(inst.s3Dir, S3_STAND_IN.bucket);
  let entries = [];
  try {
    entries = fs.readdirSync(bucketDir);
  } catch {}
  for (const entry of entries) {
    if (!entry.startsWith('._S3rver_')) fs.rmSync(path.join(bucketDir, entry), { recursive: true, force: true });
  }
}
