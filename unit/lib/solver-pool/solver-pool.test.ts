/**
 * SolverPool (src/lib/solver-pool/solver-pool.ts) with real worker threads running solve-worker.ts from
 * source: answers equal a direct solve() in this thread, a full queue refuses at once, a job past the time
 * limit and a failing or crashing worker surface as clear errors, and the pool keeps working afterwards.
 */
import fs from 'node:fs';
import os from 'node:os';
import { Worker } from 'node:worker_threads';
import { fieldAtPoints, frequencyResponse, solve } from '../../../src/physics';
import type { SolveRequest } from '../../../src/physics/types';
import { HttpError } from '../../../src/lib/http/errors';
import { SolverBusyError, SolverFailedError, SolverQuotaError, SolverTimeoutError } from '../../../src/lib/solver-pool/errors';
import { createSourceWorker } from '../../../src/lib/solver-pool/source-worker';
import { SolverPool, type SolverPoolOptions } from '../../../src/lib/solver-pool/solver-pool';

const circuit = { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 } as const;

/** The PRODUCT.md request example. */
const example = (): SolveRequest => ({
  transmitter: { kind: 'helix', radius: 0.05, turns: 20, length: 0.04, wireDiameter: 0.001 },
  receiver: { kind: 'loop', radius: 0.04, wireDiameter: 0.001 },
  placement: { distance: 0.1, lateralOffset: 0.02, tiltDeg: 30 },
  circuit: { ...circuit },
  tolerance: 1e-6,
});

/** Two 2,000-turn helices at tolerance 1e-9: about 10 s of work on the 2-core dev machine (measured). */
const heavy = (): SolveRequest => {
  const h = { kind: 'helix' as const, radius: 0.05, turns: 2000, length: 2.2, wireDiameter: 0.001 };
  return { transmitter: h, receiver: h, placement: { distance: 2.5, tiltDeg: 30 }, circuit: { ...circuit }, tolerance: 1e-9 };
};

const pools: SolverPool[] = [];
function pool(options: Partial<SolverPoolOptions> = {}): SolverPool {
  const p = new SolverPool({ size: 2, queueLimit: 8, timeoutMs: 20_000, createWorker: () => createSourceWorker(), ...options });
  pools.push(p);
  return p;
}
afterAll(() => Promise.all(pools.map((p) => p.close())));

/** The settled error of a promise that must reject. */
async function rejection(promise: Promise<unknown>): Promise<Error> {
  try {
    await promise;
  } catch (error) {
    return error as Error;
  }
  throw new Error('expected the promise to reject');
}

describe('answers', () => {
  test('equal a direct solve() in this thread, number for number', async () => {
    const p = pool();
    const requests = [example(), { ...example(), placement: { center: [0.01, 0.02, 0.12], normal: [0.3, 0, 1] } } as SolveRequest];
    const answers = await Promise.all(requests.map((r) => p.solve(r)));
    answers.forEach((answer, i) => expect(answer).toEqual(solve(requests[i])));
  });

  test('field and frequency response equal fieldAtPoints and frequencyResponse of src/physics', async () => {
    const points: [number, number, number][] = [[0.3, 0, 0], [0, 0.2, 0.05]];
    const band = { startHz: 80e3, stopHz: 120e3, points: 41 };
    const answer = await pool().solve({ ...example(), fieldPoints: points, band });
    const field = fieldAtPoints(example(), points);
    expect(answer.field!.map((f) => f.fluxDensityRms)).toEqual(field.map((f) => f.fluxDensityRms));
    expect(answer.field!.map((f) => f.limiting?.id)).toEqual(field.map((f) => f.exposure.limiting?.row.id));
    expect(answer.field!.map((f) => f.limiting?.ratio)).toEqual(field.map((f) => f.exposure.limiting?.ratio));
    const direct = frequencyResponse(example(), band);
    expect(answer.frequencyResponse!.efficiency).toEqual(Array.from(direct.efficiency));
    expect(answer.frequencyResponse!.loadPower).toEqual(Array.from(direct.loadPower));
    expect(answer.frequencyResponse!.frequencyHz).toEqual(Array.from(direct.frequencyHz));
  });

  test('a receiver intersecting the transmitter is a 422 naming the placement (src/physics clearance)', async () => {
    const loop = { kind: 'loop' as const, radius: 0.1, wireDiameter: 0.001 };
    const error = await rejection(pool().solve({ ...example(), transmitter: loop, receiver: loop, placement: { distance: 0 } }));
    expect(error).toBeInstanceOf(HttpError);
    expect((error as HttpError).status).toBe(422);
    expect((error as HttpError).issues).toEqual([{ path: 'placement', message: expect.stringMatching(/touches or intersects/) }]);
  });

  test('a field point inside a wire is a 422 at its own path, not a long meaningless integral', async () => {
    // (0.05, 0, -0.02) is where the PRODUCT.md example's helix starts (PRODUCT.md, geometry conventions)
    const error = await rejection(pool().solve({ ...example(), fieldPoints: [[0.3, 0, 0], [0.05, 0, -0.02], [0.0502, 0, -0.02]] }));
    expect((error as HttpError).status).toBe(422);
    expect((error as HttpError).issues).toEqual([
      { path: 'fieldPoints.1', message: expect.stringMatching(/inside the transmitter's wire/) },
      { path: 'fieldPoints.2', message: expect.stringMatching(/inside the transmitter's wire/) },
    ]);
  });
});

describe('limits', () => {
  test('a full queue refuses at once with SolverBusyError (503, Retry-After of at least 1 s)', async () => {
    const p = pool({ size: 1, queueLimit: 1 });
    const running = p.solve(example());
    const waiting = p.solve(example());
    const refused = await rejection(p.solve(example()));
    expect(refused).toBeInstanceOf(SolverBusyError);
    expect((refused as SolverBusyError).status).toBe(503);
    expect((refused as SolverBusyError).retryAfterSeconds).toBeGreaterThanOrEqual(1);
    // the two accepted jobs still finish
    expect((await running).mutualInductance).toBe((await waiting).mutualInductance);
    expect(p.stats()).toEqual({ workers: 1, running: 0, queued: 0 });
  });

  test('a job past the time limit is stopped with SolverTimeoutError; the queue behind it still runs', async () => {
    const p = pool({ size: 1, queueLimit: 4, timeoutMs: 300 });
    const started = Date.now();
    const slow = p.solve(heavy());
    const behind = p.solve(example());
    const error = await rejection(slow);
    expect(error).toBeInstanceOf(SolverTimeoutError);
    expect(error.message).toMatch(/longer than 0.3 s/);
    expect(Date.now() - started).toBeLessThan(3000); // stopped, not left to finish its ~10 s
    expect((await behind).mutualInductance).toBe(solve(example()).mutualInductance);
  });
});

describe('sharing between owners', () => {
  /** Resolves with `label` once the job answers, recording the order answers arrive in. */
  const track = (order: string[], label: string, promise: Promise<unknown>) => promise.then(() => order.push(label));

  test('an owner past its share gets SolverQuotaError (429, Retry-After) while others still queue', async () => {
    const p = pool({ size: 1, queueLimit: 8, perOwnerLimit: 2 });
    const mine = [p.solve(example(), { owner: 'user:1' }), p.solve(example(), { owner: 'user:1' })];
    const refused = await rejection(p.solve(example(), { owner: 'user:1' }));
    expect(refused).toBeInstanceOf(SolverQuotaError);
    expect((refused as SolverQuotaError).status).toBe(429);
    expect((refused as SolverQuotaError).headers['Retry-After']).toMatch(/^[1-9]\d*$/);
    expect(refused.message).toMatch(/2 solves running or waiting/);
    // another person, and work without an owner, still find room in the queue
    const theirs = p.solve(example(), { owner: 'user:2' });
    const unowned = [p.solve(example()), p.solve(example()), p.solve(example())];
    await Promise.all([...mine, theirs, ...unowned]);
    // the share is given back as jobs answer: the same owner may solve again
    expect((await p.solve(example(), { owner: 'user:1' })).mutualInductance).toBe(solve(example()).mutualInductance);
    expect(p.stats()).toEqual({ workers: 1, running: 0, queued: 0 });
  });

  test('refusal() tells in advance what solve() would refuse, and nothing else', async () => {
    const p = pool({ size: 1, queueLimit: 1, perOwnerLimit: 1 });
    expect(p.refusal('user:1')).toBeNull();
    const running = p.solve(example(), { owner: 'user:1' });
    expect(p.refusal('user:1')).toBeInstanceOf(SolverQuotaError);
    expect(p.refusal('user:2')).toBeNull(); // the one worker is busy, but a place in the queue is free
    const waiting = p.solve(example(), { owner: 'user:2' });
    expect(p.refusal('user:3')).toBeInstanceOf(SolverBusyError);
    expect(await rejection(p.solve(example(), { owner: 'user:3' }))).toBeInstanceOf(SolverBusyError);
    await Promise.all([running, waiting]);
    expect(p.refusal('user:1')).toBeNull();
  });

  test('Retry-After varies between refusals in the same moment, so refused clients do not return together', async () => {
    const p = pool({ size: 1, queueLimit: 0, perOwnerLimit: 8 });
    const running = p.solve(example());
    await running; // an average run time to estimate from
    const busy = rejection(p.solve(heavy())); // stopped by close() below
    const seconds = Array.from({ length: 60 }, () => (p.refusal() as SolverBusyError).retryAfterSeconds);
    expect(Math.min(...seconds)).toBeGreaterThanOrEqual(1);
    expect(new Set(seconds).size).toBeGreaterThan(1);
    await p.close();
    await busy;
  });

  test('a failed or timed-out job gives its share back too', async () => {
    const p = pool({ size: 1, queueLimit: 4, perOwnerLimit: 1, timeoutMs: 300 });
    expect(await rejection(p.solve(heavy(), { owner: 'user:1' }))).toBeInstanceOf(SolverTimeoutError);
    expect((await p.solve(example(), { owner: 'user:1' })).mutualInductance).toBe(solve(example()).mutualInductance);
  });

  test('owners take turns: a newcomer is served before the rest of a busy owner\'s queue', async () => {
    const p = pool({ size: 1, queueLimit: 8, perOwnerLimit: 8 });
    const order: string[] = [];
    const jobs = [
      track(order, 'a1', p.solve(example(), { owner: 'a' })),
      track(order, 'a2', p.solve(example(), { owner: 'a' })),
      track(order, 'a3', p.solve(example(), { owner: 'a' })),
      track(order, 'b1', p.solve(example(), { owner: 'b' })),
      track(order, 'b2', p.solve(example(), { owner: 'b' })),
    ];
    await Promise.all(jobs);
    // first come first served would give a1 a2 a3 b1 b2
    expect(order).toEqual(['a1', 'b1', 'a2', 'b2', 'a3']);
  });

  test('a waiting job whose request was abandoned leaves the queue at once', async () => {
    const p = pool({ size: 1, queueLimit: 4, perOwnerLimit: 1 });
    const running = p.solve(example(), { owner: 'user:1' });
    const abandon = new AbortController();
    const waiting = p.solve(example(), { owner: 'user:2', signal: abandon.signal });
    expect(p.stats().queued).toBe(1);
    abandon.abort();
    expect((await rejection(waiting)).message).toMatch(/abandoned/);
    expect(p.stats().queued).toBe(0);
    await running;
    // its share is free again
    expect((await p.solve(example(), { owner: 'user:2' })).mutualInductance).toBe(solve(example()).mutualInductance);
  });
});

describe('priority', () => {
  /** Niceness of each thread of this process: field 19 of /proc/<pid>/task/<tid>/stat (proc(5)). */
  const threadNiceness = () => fs.readdirSync('/proc/self/task').map((tid) => {
    const stat = fs.readFileSync(`/proc/self/task/${tid}/stat`, 'utf8');
    return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[16]);
  });

  (process.platform === 'linux' ? test : test.skip)('solver threads run niced; the thread that serves requests keeps its priority', async () => {
    const before = threadNiceness().filter((n) => n === 10).length;
    const p = pool({ size: 1 });
    await p.solve(example());
    expect(threadNiceness().filter((n) => n === 10).length).toBe(before + 1);
    expect(os.getPriority()).toBe(0); // this (main) thread, as setpriority(2) reads "process 0" on Linux
  });
});

describe('worker failures', () => {
  test('an exception inside the solve is a SolverFailedError (500) and the pool keeps working', async () => {
    const p = pool({ size: 1 });
    // no request at all: solve() throws a TypeError (a bug, not bad input), which must not read as a 422
    const consoleError = jest.spyOn(console, 'error').mockImplementation(() => {});
    const error = await rejection(p.solve(null as unknown as SolveRequest));
    expect(consoleError).toHaveBeenCalledWith(expect.stringMatching(/failed/), expect.stringMatching(/null/));
    consoleError.mockRestore();
    expect(error).toBeInstanceOf(SolverFailedError);
    expect((error as SolverFailedError).status).toBe(500);
    expect(error.message).not.toMatch(/TypeError|undefined/); // internals stay in the detail
    expect((await p.solve(example())).mutualInductance).toBe(solve(example()).mutualInductance);
  });

  test('a crashed worker thread fails only its job; a fresh worker takes the next one', async () => {
    let started = 0;
    const p = pool({
      size: 1,
      createWorker: () => (started++ === 0
        ? new Worker("require('node:worker_threads').parentPort.on('message', () => { throw new Error('boom'); });", { eval: true })
        : createSourceWorker()),
    });
    const consoleError = jest.spyOn(console, 'error').mockImplementation(() => {});
    const error = await rejection(p.solve(example()));
    consoleError.mockRestore();
    expect(error).toBeInstanceOf(SolverFailedError);
    expect(error.message).toMatch(/solver failed on this request/);
    expect((await p.solve(example())).mutualInductance).toBe(solve(example()).mutualInductance);
    expect(started).toBe(2);
  });
});
