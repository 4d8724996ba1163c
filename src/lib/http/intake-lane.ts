import 'server-only';
import { setImmediate as afterPendingIo } from 'node:timers/promises';
import pLimit from 'p-limit';
import { abandoned } from './errors';

/**
 * A lane that requests of one busy route take turns through: at most `width` run a step of their
 * intake (session check and refusal; validation of the body) at once, and each starts only after
 * the I/O that was already waiting has had its turn. A step must not wait on the client, as reading
 * its body does: a slow client would hold every other request's turn.
 *
 * Why: every request's work runs on the server's one JavaScript thread. Sixty heavy-solve requests
 * arriving together each did their intake at once, interleaved step by step, and a page read that
 * arrived among them waited at each of its own steps behind all sixty: about 300 ms on the 2-core
 * machine before any of them finished. Through the lane the page waits behind one intake step at a
 * time; the solve requests, which would queue for the solver anyway, wait here instead.
 *
 * A request abandoned while it waits (its client went away) leaves without doing the work.
 */
export function createIntakeLane(width = 1) {
  const limit = pLimit(width);
  return function through<T>(signal: AbortSignal, intake: () => Promise<T>): Promise<T> {
    return limit(async () => {
      await afterPendingIo();
      if (signal.aborted) throw abandoned('The request was abandoned before it was read.');
      return intake();
    });
  };
}
