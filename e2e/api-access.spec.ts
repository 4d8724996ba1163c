import { expect, test } from '@playwright/test';
import { DEMO, RAIL_STUDY, apiSignIn } from './support/accounts';

test.describe('API access rules', () => {
  test('without a session every study API answers 401', async ({ request }) => {
    for (const url of ['/api/studies', '/api/studies/1', '/api/studies/1/members', '/api/admin/accounts']) {
      const response = await request.get(url);
      expect(response.status(), url).toBe(401);
      expect(await response.json()).toMatchObject({ error: expect.any(String) });
    }
    expect((await request.post('/api/studies', { data: { name: 'x' } })).status()).toBe(401);
  });

  test("another group's study is a 404 for a student, not a 403", async ({ playwright }) => {
    const rail = await playwright.request.newContext({ baseURL: process.env.BASE_URL ?? 'http://127.0.0.1:3100' });
    await apiSignIn(rail, DEMO.otherResearcher);
    const { studies } = await (await rail.get('/api/studies')).json();
    const railId = studies.find((s: { name: string }) => s.name === RAIL_STUDY).id;

    const student = await playwright.request.newContext({ baseURL: process.env.BASE_URL ?? 'http://127.0.0.1:3100' });
    await apiSignIn(student, DEMO.student);
    expect((await student.get(`/api/studies/${railId}`)).status()).toBe(404);
    expect((await student.get(`/api/studies/${railId}/members`)).status()).toBe(404);
    expect((await student.get('/api/studies/not-a-number')).status()).toBe(404);
    // A student may not start a study (403) nor manage accounts (403).
    expect((await student.post('/api/studies', { data: { name: 'Student study' } })).status()).toBe(403);
    expect((await student.get('/api/admin/accounts')).status()).toBe(403);
    await rail.dispose();
    await student.dispose();
  });

  test('bad input gets 422 with field paths; malformed JSON too', async ({ playwright }) => {
    const researcher = await playwright.request.newContext({ baseURL: process.env.BASE_URL ?? 'http://127.0.0.1:3100' });
    await apiSignIn(researcher, DEMO.researcher);
    const bad = await researcher.post('/api/studies', { data: { name: 'ab', frequencyHz: -5 } });
    expect(bad.status()).toBe(422);
    const body = await bad.json();
    expect(body.issues.map((i: { path: string }) => i.path).sort()).toEqual(['frequencyHz', 'name']);

    const malformed = await researcher.post('/api/studies', { data: '{"name": ', headers: { 'Content-Type': 'application/json' } });
    expect(malformed.status()).toBe(422);
    await researcher.dispose();
  });

  test('responses carry the security headers', async ({ request }) => {
    const response = await request.get('/signin');
    const headers = response.headers();
    expect(headers['content-security-policy']).toContain("frame-ancestors 'none'");
    expect(headers['x-frame-options']).toBe('DENY');
    expect(headers['x-content-type-options']).toBe('nosniff');
  });
});
