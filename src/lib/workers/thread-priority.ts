import { setPriority } from 'node:os';

/**
 * Niceness of the server's background threads (solves, report drawing): they take the CPU time the
 * pages leave, so pages stay quick while long work runs.
 */
export const BACKGROUND_NICENESS = 10;

/**
 * Lowers the calling thread's priority. On Linux a priority set for "process 0" applies to the calling
 * thread only, so the web server's own thread keeps its priority. Other systems would lower the whole
 * process, so there the thread keeps the normal priority, as it does where the system refuses.
 */
export function lowerThisThreadsPriority(niceness = BACKGROUND_NICENESS): void {
  if (process.platform !== 'linux') return;
  try {
    setPriority(niceness);
  } catch {
    // not permitted here: run at the inherited priority
  }
}
