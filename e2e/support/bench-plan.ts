import { expect, type PlaywrightWorkerArgs } from '@playwright/test';
import { apiSignIn, DEMO, PAD_STUDY } from './accounts';

export const BASE_URL = process.env.BASE_URL ?? 'http://127.0.0.1:3100';

/**
 * A fresh plan of the pad study, put on the bench by the researcher through the API, so a test starts
 * from a plan nobody has logged on or acknowledged yet. Distances in metres.
 */
export async function createBenchPlan(playwright: PlaywrightWorkerArgs['playwright'], name: string, distances: number[]): Promise<{ studyId: number; planId: number }> {
  const researcher = await playwright.request.newContext({ baseURL: BASE_URL });
  try {
    await apiSignIn(researcher, DEMO.researcher);
    const { studies } = await (await researcher.get('/api/studies')).json();
    const studyId: number = studies.find((s: { name: string }) => s.name === PAD_STUDY).id;
    const { setups } = await (await researcher.get(`/api/studies/${studyId}/setups`)).json();
    const created = await researcher.post(`/api/studies/${studyId}/plans`, {
      data: { name, setupId: setups[0].id, minutesPerPoint: 3, axes: [{ quantity: 'distance', displayUnit: 'cm', mode: 'list', values: distances }] },
    });
    expect(created.status(), await created.text()).toBe(201);
    const planId: number = (await created.json()).plan.id;
    // wait for the predictions, so the logbook shows measured next to predicted
    await expect
      .poll(async () => (await (await researcher.get(`/api/studies/${studyId}/plans/${planId}/progress`)).json()).status, { timeout: 30_000 })
      .toBe('done');
    const moved = await researcher.post(`/api/studies/${studyId}/plans/${planId}/transition`, { data: { to: 'on_bench' } });
    expect(moved.ok(), await moved.text()).toBe(true);
    return { studyId, planId };
  } finally {
    await researcher.dispose();
  }
}
