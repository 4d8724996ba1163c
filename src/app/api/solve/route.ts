import { requireUser } from '@/lib/auth/session';
import { parseJsonBody, route } from '@/lib/http/respond';
import { serverSolverPool, solveOnServer } from '@/lib/solver-pool/server-pool';
import { MAX_SOLVE_BODY_BYTES, solveRequestSchema } from '@/lib/validations/solve';

export const dynamic = 'force-dynamic';
/** worker_threads: the Node.js runtime, never the edge one. */
export const runtime = 'nodejs';

/**
 * Coupling, link and (when asked) field and frequency response for two coils (PRODUCT.md, "POST
 * /api/solve"), computed on a worker thread so a heavy solve never blocks other requests. A full
 * queue answers 503 with Retry-After (SolverBusyError carries the header); a person who already has their
 * share of solves running or waiting gets 429 with Retry-After. A request abandoned while its solve waits
 * gives up its place in the queue.
 */
export const POST = route(async (request: Request) => {
  const user = await requireUser();
  const owner = `user:${user.id}`;
  // turned away before the body is read, so a flood costs as little as it can
  const refused = serverSolverPool().refusal(owner);
  if (refused) throw refused;
  const input = await parseJsonBody(request, solveRequestSchema, MAX_SOLVE_BODY_BYTES);
  return Response.json(await solveOnServer(input, { owner, signal: request.signal }));
});
