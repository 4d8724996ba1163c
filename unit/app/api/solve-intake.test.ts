/**
 * POST /api/solve takes its requests through an intake lane one at a time (src/lib/http/intake-lane.ts).
 * A client that sends its body slowly must not hold the lane: the others are answered meanwhile.
 */
import type { SessionUser } from '@/lib/auth/session-user';
import { createSourceWorker } from '@/lib/solver-pool/source-worker';
import { SolverPool } from '@/lib/solver-pool/solver-pool';
import * as solveRoute from '@/app/api/solve/route';
import { actAs } from '../../support/acting-user';

jest.mock('@/lib/auth/session', () => jest.requireActual('../../support/acting-user').sessionStandIn);

// The server's pool starts its worker from a bundled chunk jest cannot load; solve on a worker from the sources.
let mockSolvePool: SolverPool | null = null;
jest.mock('@/lib/solver-pool/server-pool', () => ({
  serverSolverPool: () => mockSolvePool,
  solveOnServer: (job: unknown, options: unknown) => mockSolvePool!.solve(job as never, options as never),
}));

const student: SessionUser = { id: 7, email: 'bench.student@couplet.test', name: 'Bench Student', siteRole: 'member' };

/** Two small loops 10 cm apart: a solve of a few milliseconds. */
const LIGHT_SOLVE = JSON.stringify({
  transmitter: { kind: 'loop', radius: 0.05, wireDiameter: 0.001 },
  receiver: { kind: 'loop', radius: 0.05, wireDiameter: 0.001 },
  placement: { distance: 0.1 },
  circuit: { frequency: 6.78e6, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 },
});

const post = (body: BodyInit) =>
  new Request('http://127.0.0.1/api/solve', { method: 'POST', body, headers: { 'content-type': 'application/json' }, duplex: 'half' } as RequestInit);

describe('POST /api/solve under a slow client', () => {
  beforeAll(() => {
    mockSolvePool = new SolverPool({ size: 1, queueLimit: 8, perOwnerLimit: 8, timeoutMs: 30_000, createWorker: () => createSourceWorker() });
    actAs(student);
  });
  afterAll(async () => {
    await mockSolvePool!.close();
    actAs(null);
  });

  test('a body that trickles in does not keep other requests from being answered', async () => {
    const encoder = new TextEncoder();
    let finishSlowBody!: () => void;
    const slowBody = new ReadableStream<Uint8Array>({
      start(controller) {
        // the first few bytes now, the rest only when the test says so
        controller.enqueue(encoder.encode(LIGHT_SOLVE.slice(0, 10)));
        finishSlowBody = () => {
          controller.enqueue(encoder.encode(LIGHT_SOLVE.slice(10)));
          controller.close();
        };
      },
    });
    const slow = solveRoute.POST(post(slowBody), {});
    let slowSettled = false;
    void slow.finally(() => {
      slowSettled = true;
    });

    const others = await Promise.all([1, 2, 3].map(() => solveRoute.POST(post(LIGHT_SOLVE), {})));
    expect(others.map((r) => r.status)).toEqual([200, 200, 200]);
    expect((await others[0].json()).coupling).toBeGreaterThan(0);
    expect(slowSettled).toBe(false);

    finishSlowBody();
    const late = await slow;
    expect(late.status).toBe(200);
  });

  test('a malformed body is still a 422 naming the field, after its turn in the lane', async () => {
    const solve = JSON.parse(LIGHT_SOLVE);
    const response = await solveRoute.POST(post(JSON.stringify({ ...solve, circuit: { ...solve.circuit, frequency: 'fast' } })), {});
    expect(response.status).toBe(422);
    const body = await response.json();
    expect(body.issues.map((i: { path: string }) => i.path)).toContain('circuit.frequency');
  });
});
