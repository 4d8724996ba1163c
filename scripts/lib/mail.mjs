// Starts scripts/mail-server.mjs (the SMTP stand-in with its inbox) as a background service of an
// instance and waits until both its ports answer.
import fs from 'node:fs';
import path from 'node:path';
import { StepError, ok, step, info, rel } from './log.mjs';
import { hasExited, httpGet, onCleanup, portInUse, removeFile, startService, stopTree, waitFor } from './processes.mjs';

export async function startMail(inst, env) {
  for (const port of [inst.smtpPort, inst.inboxPort]) {
    if (await portInUse(port)) {
      throw new StepError('start mail stand-in', `port ${port} on 127.0.0.1 is already in use by another program`, {
        hint: `find it with: ss -ltnp 'sport = :${port}'; or set SMTP_HOST to use a real SMTP server`,
      });
    }
  }
  step(`starting the mail stand-in (SMTP 127.0.0.1:${inst.smtpPort}, inbox ${inst.inboxUrl})…`);
  const logFile = path.join(inst.logsDir, 'mail.log');
  const pidFile = path.join(inst.runDir, 'mail.pid');
  let from = 0; // mail.log is appended to across runs: on failure show this run's lines only
  try {
    from = fs.statSync(logFile).size;
  } catch {}
  const child = startService({
    title: 'mail stand-in',
    cmd: process.execPath,
    args: [
      path.join(inst.root, 'scripts', 'mail-server.mjs'),
      '--smtp-port', String(inst.smtpPort),
      '--http-port', String(inst.inboxPort),
      '--dir', inst.mailDir,
      '--host', '127.0.0.1',
    ],
    env,
    cwd: inst.root,
    logFile,
    pidFile,
  });
  onCleanup('mail stand-in', async () => {
    if (!hasExited(child)) info('stopping the mail stand-in…');
    await stopTree(child.pid, { timeoutMs: 10000 });
    removeFile(pidFile);
  });
  const up = await waitFor(
    async () => (await httpGet(`${inst.inboxUrl}/api/health`, 2000)).status === 200 && (await portInUse(inst.smtpPort)),
    {
      what: 'start mail stand-in',
      timeoutMs: 30000,
      check: () => {
        if (hasExited(child)) {
          throw new StepError('start mail stand-in', `mail-server.mjs exited (code ${child.exitCode ?? child.signalCode})`, {
            logs: [{ file: logFile, from }],
          });
        }
      },
    },
  );
  if (!up) throw new StepError('start mail stand-in', 'no answer within 30 s', { logs: [{ file: logFile, from }] });
  ok(`mail stand-in is up (pid ${child.pid}, messages in ${rel(inst.root, inst.mailDir)})`);
  return child;
}

/** Remove stored messages (tests start with an empty inbox). */
export function clearMailDir(inst) {
  try {
    for (const f of fs.readdirSync(inst.mailDir)) if (f.endsWith('.json') || f.endsWith('.tmp')) fs.unlinkSync(path.join(inst.mailDir, f));
  } catch {}
}
