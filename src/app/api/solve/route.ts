import { requireUser } from '@/lib/auth/session';
import { readBodyText } from '@/lib/http/body-limit';
import { createIntakeLane } from '@/lib/http/intake-lane';
import { parseJsonText, route } from '@/lib/http/respond';
import { serverSolverPool, solveOnServer } from '@/lib/solver-pool/server-pool';
import { MAX_SOLVE_BODY_BYTES, solveRequestSchema } from '@/lib/validations/solve';

export const dynamic = 'force-dynamic';
/** worker_threads: the Node.js runtime, never the edge one. */
export const runtime = 'nodejs';

/**
 * Solve requests take turns for their session check and their body's validation, so a flood of them
 * leaves the server's thread free between steps for the pages that arrive meanwhile
 * (src/lib/http/intake-lane.ts). The body itself is read outside the lane: it comes at the client's
 * pace, and a slow client must not hold everyone else's turn.
 */
const intakeLane = createIntakeLane();

/**
 * Coupling, link and (when asked) field and frequency response for two coils (PRODUCT.md, "POST
 * /api/solve"), computed on a worker thread so a heavy solve never blocks other requests. A full
 * queue answers 503 with Retry-After (SolverBusyError carries the header); a person who already has their
 * share of solves running or waiting gets 429 with Retry-After. A request abandoned while it waits for
 * its turn or its solve gives up its place.
 */
export const POST = route(async (request: Request) => {
  const owner = await intakeLane(request.signal, async () => {
    const user = await requireUser();
    const owner = `user:${user.id}`;
    // turned away before the body is read, so a flood costs as little as it can
    const refused = serverSolverPool().refusal(owner);
    if (refused) throw refused;
    return owner;
  });
  const body = await readBodyText(request, MAX_SOLVE_BODY_BYTES);
  const input = await intakeLane(request.signal, async () => parseJsonText(body, solveRequestSchema));
  return Response.json(await solveOnServer(input, { owner, signal: request.signal }));
});
