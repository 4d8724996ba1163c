import { expect, test, type APIRequest, type APIRequestContext, type APIResponse } from '@playwright/test';
import { DEMO } from './support/accounts';

/**
 * POST /api/solve against the built app (PRODUCT.md, "POST /api/solve"): signed-in users only, the
 * solver's numbers, 422 with field paths for bad input, and a bounded pool of worker threads that
 * answers one person's flood with 429 + Retry-After past their share while the rest of the server keeps
 * answering. (The queue-wide 503 needs more distinct people than the queue has places; the pool's unit
 * tests cover it.)
 */

const BASE_URL = process.env.BASE_URL ?? 'http://127.0.0.1:3100';
const circuit = { frequency: 100000, topology: 'SS', sourceVoltage: 10, sourceResistance: 0.5, loadResistance: 10 };
const loop = { kind: 'loop', radius: 0.1, wireDiameter: 0.001 };
/** Coaxial equal loops a = b = 0.1 m, d = 0.1 m, 1 mm wire. */
const coaxialLoops = { transmitter: loop, receiver: loop, placement: { distance: 0.1 }, circuit, tolerance: 1e-9 };
/** M of those filaments: Maxwell's formula (Treatise, 1873, art. 701), REFERENCES.md row a=b=d=0.1, COMP. */
const MAXWELL_M_NH = 49.40784630798268;
/** The solver runs at 1e-9; the API must carry its answer to at least this relative accuracy. */
const M_REL_TOLERANCE = 1e-6;

async function apiSignIn(request: APIRequestContext, account: { email: string; password: string }) {
  const csrf = await (await request.get('/api/auth/csrf')).json();
  const response = await request.post('/api/auth/callback/credentials', {
    form: { csrfToken: csrf.csrfToken, email: account.email, password: account.password, json: 'true' },
  });
  expect(response.ok()).toBe(true);
}

async function researcher(playwright: { request: APIRequest }) {
  const context = await playwright.request.newContext({ baseURL: BASE_URL });
  await apiSignIn(context, DEMO.researcher);
  return context;
}

const pathsOf = async (response: APIResponse) => ((await response.json()).issues as { path: string }[]).map((i) => i.path).sort();

test.describe('POST /api/solve', () => {
  test('without a session answers 401', async ({ request }) => {
    const response = await request.post('/api/solve', { data: coaxialLoops });
    expect(response.status()).toBe(401);
    expect(await response.json()).toMatchObject({ error: expect.any(String) });
  });

  test("coaxial loops: M is Maxwell's value, with the whole PRODUCT.md response", async ({ playwright }) => {
    const api = await researcher(playwright);
    const response = await api.post('/api/solve', { data: coaxialLoops });
    expect(response.status()).toBe(200);
    const body = await response.json();
    expect(Math.abs(body.mutualInductance / (MAXWELL_M_NH * 1e-9) - 1)).toBeLessThan(M_REL_TOLERANCE);
    expect(body).toMatchObject({
      coupling: expect.any(Number),
      transmitter: { selfInductance: expect.any(Number), acResistance: expect.any(Number), capacitance: expect.any(Number) },
      receiver: { qualityFactor: expect.any(Number) },
      transfer: { efficiency: expect.any(Number), loadPower: expect.any(Number), maxEfficiency: expect.any(Number) },
      accuracy: { estimatedRelativeError: expect.any(Number), integrandEvaluations: expect.any(Number) },
      solverVersion: expect.stringMatching(/^\d+\.\d+\.\d+$/),
    });
    expect(body).not.toHaveProperty('field');
    await api.dispose();
  });

  test('field points and a band add the field and the frequency response', async ({ playwright }) => {
    const api = await researcher(playwright);
    const response = await api.post('/api/solve', {
      data: { ...coaxialLoops, tolerance: 1e-6, fieldPoints: [[0.3, 0, 0.05], [0, 0, 0.5]], band: { startHz: 90e3, stopHz: 110e3, points: 21 } },
    });
    expect(response.status()).toBe(200);
    const body = await response.json();
    expect(body.field).toHaveLength(2);
    // 100 kHz is inside ICNIRP 2010's 3 kHz-10 MHz band, so a reference level applies (exposure-limits.ts)
    expect(body.field[0]).toMatchObject({ point: [0.3, 0, 0.05], fluxDensityRms: expect.any(Number), limiting: { source: expect.stringMatching(/ICNIRP/) } });
    expect(body.frequencyResponse.frequencyHz).toHaveLength(21);
    expect(body.frequencyResponse.efficiency).toHaveLength(21);
    await api.dispose();
  });

  test('bad input is a 422 naming each field; a receiver inside the transmitter names the placement', async ({ playwright }) => {
    const api = await researcher(playwright);
    const negative = await api.post('/api/solve', { data: { ...coaxialLoops, transmitter: { ...loop, radius: -0.1 }, tolerance: 1e-12 } });
    expect(negative.status()).toBe(422);
    expect(await pathsOf(negative)).toEqual(['tolerance', 'transmitter.radius']);

    const nan = await api.post('/api/solve', { data: { ...coaxialLoops, receiver: { ...loop, radius: 'NaN' } } });
    expect(nan.status()).toBe(422);
    expect(await pathsOf(nan)).toEqual(['receiver.radius']);

    // the same loop in the same place: the wires coincide (src/physics/clearance.ts)
    const inside = await api.post('/api/solve', { data: { ...coaxialLoops, placement: { distance: 0 } } });
    expect(inside.status()).toBe(422);
    const body = await inside.json();
    expect(body.issues).toEqual([{ path: 'placement', message: expect.stringMatching(/intersects the transmitter/) }]);

    const malformed = await api.post('/api/solve', { data: '{"transmitter": ', headers: { 'Content-Type': 'application/json' } });
    expect(malformed.status()).toBe(422);

    const huge = await api.post('/api/solve', { data: { ...coaxialLoops, padding: 'x'.repeat(70 * 1024) } });
    expect(huge.status()).toBe(413);
    await api.dispose();
  });

  test('one person\'s flood of heavy solves gets 429 + Retry-After past their share while /api/health still answers', async ({ playwright }) => {
    test.setTimeout(180_000);
    const api = await researcher(playwright);
    // two 200-turn helices at tolerance 1e-9: about 0.4 s each on the 2-core dev machine (measured)
    const helix = { kind: 'helix', radius: 0.05, turns: 200, length: 0.22, wireDiameter: 0.001 };
    const heavy = { transmitter: helix, receiver: helix, placement: { distance: 0.3, tiltDeg: 30 }, circuit, tolerance: 1e-9 };
    const FLOOD = 24;
    /** SOLVER_PER_OWNER_LIMIT's default (src/lib/solver-pool/config.ts): solves one person may have at once. */
    const SHARE = 4;
    let settled = 0;
    const flood = Array.from({ length: FLOOD }, () => api.post('/api/solve', { data: heavy, timeout: 170_000 }).then((r) => {
      settled++;
      return r;
    }));

    await new Promise((resolve) => setTimeout(resolve, 1000));
    const started = Date.now();
    const health = await api.get('/api/health');
    expect(health.status()).toBe(200);
    expect(Date.now() - started).toBeLessThan(5000);

    const responses = await Promise.all(flood);
    const refused = responses.filter((r) => r.status() === 429);
    const solved = responses.filter((r) => r.status() === 200);
    expect(solved.length).toBeGreaterThanOrEqual(SHARE);
    expect(refused.length).toBeGreaterThan(0);
    expect(refused.length + solved.length).toBe(FLOOD);
    for (const r of refused) {
      expect(Number(r.headers()['retry-after'])).toBeGreaterThanOrEqual(1);
      expect((await r.json()).error).toMatch(new RegExp(`${SHARE} solves running or waiting`));
    }
    const values = new Set(await Promise.all(solved.map(async (r) => (await r.json()).mutualInductance)));
    expect(values.size).toBe(1); // every accepted copy of the request got the same answer
    expect(settled).toBe(FLOOD);

    // the share is given back: once the flood has drained, the same person solves again
    const again = await api.post('/api/solve', { data: coaxialLoops });
    expect(again.status()).toBe(200);
    await api.dispose();
  });
});
