import { expect, test, type Page } from '@playwright/test';
import Papa from 'papaparse';
import { DEMO, PAD_STUDY, signIn } from './support/accounts';

/**
 * Sweep plans against the built app: design, predictions with progress, heatmap, run sheet,
 * CSV, and what a student may not do.
 */

/** The setup database/seeds/01_demo_lab.ts saves for the pad study. */
const DEMO_SETUP = 'Probe 10 cm deep, upright';

async function openPlans(page: Page): Promise<number> {
  await page.getByRole('link', { name: PAD_STUDY }).click();
  await page.getByRole('navigation', { name: 'Study' }).getByRole('link', { name: 'Plans' }).click();
  await expect(page.getByRole('heading', { name: 'Sweep plans', level: 1 })).toBeVisible();
  return Number(/\/studies\/(\d+)\/plans$/.exec(page.url())![1]);
}

type ApiPoint = { seq: number; repeatIndex: number; isReference: boolean; pose: Record<string, number>; predicted: Record<string, number> | null };

test('a researcher builds a two-axis plan, watches it predicted, and gets the heatmap, run sheet and CSV', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  const studyId = await openPlans(page);
  const name = `Tilt x distance ${Date.now()}`;

  await page.getByRole('link', { name: 'New plan' }).click();
  const form = page.getByRole('form', { name: 'New plan' });
  await form.getByLabel('Name', { exact: true }).fill(name);
  await form.getByLabel('Setup', { exact: true }).selectOption({ label: DEMO_SETUP });

  const first = form.getByRole('group', { name: 'Axis 1' });
  await first.getByLabel('Quantity').selectOption('tiltDeg');
  await first.getByLabel('Start').fill('0 deg');
  await first.getByLabel('Stop').fill('90 deg');
  await first.getByLabel('Step').fill('30 deg');
  await form.getByRole('button', { name: 'Add axis' }).click();
  const second = form.getByRole('group', { name: 'Axis 2' });
  await second.getByLabel('Quantity').selectOption('distance');
  await second.getByLabel('Start').fill('5 cm');
  await second.getByLabel('Stop').fill('15 cm');
  await second.getByLabel('Step').fill('5 cm');
  await form.getByLabel('Minutes per point').fill('3');

  // 4 tilts x 3 distances, before anything is saved.
  await expect(form.getByTestId('live-count')).toContainText('12 points');
  await expect(form.getByTestId('live-count')).toContainText('about 36 min on the bench');

  // Too many points is refused in the form before submitting.
  await second.getByLabel('Step').fill('0.01 mm');
  await expect(form.getByText(/at most 5,000 are allowed/)).toBeVisible();
  await expect(form.getByRole('button', { name: 'Save plan' })).toBeDisabled();
  await second.getByLabel('Step').fill('5 cm');

  await form.getByRole('button', { name: 'Save plan' }).click();
  await expect(page).toHaveURL(/\/plans\/\d+$/);
  const planId = Number(/\/plans\/(\d+)$/.exec(page.url())![1]);
  await expect(page.getByRole('heading', { name, level: 1 })).toBeVisible();

  // Predictions run on the server; the page polls until every point is predicted.
  await expect(page.getByText(/Every point predicted by solver/)).toBeVisible({ timeout: 30_000 });

  await expect(page.getByRole('region', { name: 'Charts' }).getByRole('img', { name: /Heatmap of/ }).locator('canvas').first()).toBeVisible();
  // Both exports work: a PNG from the canvas, a vector SVG from an SVG-renderer instance.
  const heatmap = page.getByRole('region', { name: 'Heatmap' });
  const [svg] = await Promise.all([page.waitForEvent('download'), heatmap.getByRole('button', { name: 'Export SVG' }).click()]);
  expect(svg.suggestedFilename()).toMatch(/heatmap\.svg$/);
  const { readFile } = await import('node:fs/promises');
  expect(await readFile((await svg.path())!, 'utf8')).toMatch(/^<svg[\s\S]*<\/svg>$/);
  const [png] = await Promise.all([page.waitForEvent('download'), heatmap.getByRole('button', { name: 'Export PNG' }).click()]);
  expect(png.suggestedFilename()).toMatch(/heatmap\.png$/);

  const sheet = page.getByRole('table', { name: 'Run sheet' });
  await expect(sheet.locator('tbody tr')).toHaveCount(12);
  await expect(sheet.locator('thead')).toContainText('Tilt [deg]');
  await expect(sheet.locator('thead')).toContainText('Distance [cm]');

  // The CSV's values are the API's points, in the same order.
  const { points } = (await (await page.request.get(`/api/studies/${studyId}/plans/${planId}/points`)).json()) as { points: ApiPoint[] };
  const csvResponse = await page.request.get(`/api/studies/${studyId}/plans/${planId}/points.csv`);
  expect(csvResponse.status()).toBe(200);
  const csv = Papa.parse<Record<string, string>>(await csvResponse.text(), { header: true, skipEmptyLines: true });
  expect(csv.data).toHaveLength(points.length);
  csv.data.forEach((row, i) => {
    const point = points[i];
    expect(Number(row.seq)).toBe(point.seq);
    expect(Number(row.tilt_deg)).toBe(point.pose.tiltDeg);
    expect(Number(row.distance_m)).toBe(point.pose.distance);
    expect(Number(row.coupling)).toBe(point.predicted!.coupling);
    expect(Number(row.mutual_inductance_H)).toBe(point.predicted!.mutualInductance);
  });
  await expect(page.getByRole('link', { name: 'Download CSV' })).toHaveAttribute('href', `/api/studies/${studyId}/plans/${planId}/points.csv`);

  // The run sheet filters by an axis value.
  await page.getByLabel('Filter Tilt [deg]').selectOption('30');
  await expect(sheet.locator('tbody tr')).toHaveCount(3);

  // A student opens the same plan: no edit, recompute or freeze controls.
  await page.context().clearCookies();
  await signIn(page, DEMO.student);
  await page.goto(`/studies/${studyId}/plans/${planId}`);
  await expect(page.getByRole('heading', { name, level: 1 })).toBeVisible();
  await expect(page.getByText('draft', { exact: true }).first()).toBeVisible();
  await expect(page.getByRole('table', { name: 'Run sheet' }).locator('tbody tr')).toHaveCount(12);
  for (const control of ['Edit plan', 'Recompute', 'Put on the bench']) await expect(page.getByRole('button', { name: control })).toHaveCount(0);
  await page.goto(`/studies/${studyId}/plans`);
  await expect(page.getByRole('link', { name: 'New plan' })).toHaveCount(0);
});

test('a plan that is not on the study is the real not-found page', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  await page.getByRole('link', { name: PAD_STUDY }).click();
  await expect(page).toHaveURL(/\/studies\/\d+$/);
  const studyPath = new URL(page.url()).pathname;
  const response = await page.goto(`${studyPath}/plans/987654`);
  expect(response?.status()).toBe(404);
});

test('the plan and review pages arrive with the plan drawn, not a placeholder', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  const studyId = await openPlans(page);
  const plans: { id: number; name: string; state: string }[] = (await (await page.request.get(`/api/studies/${studyId}/plans`)).json()).plans;
  const plan = plans.find((p) => p.state === 'in_review')!;
  // the server's HTML, before any script runs: the page shows what the server already read
  for (const path of ['', '/review']) {
    const html = await (await page.request.get(`/studies/${studyId}/plans/${plan.id}${path}`)).text();
    // the page's own heading, drawn by the server (the name also travels in the page's data, so look for the heading)
    const name = plan.name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
    expect(html, path || '/').toMatch(new RegExp(`<h1[^>]*>(Review: (<!-- -->)?)?${name}</h1>`));
  }
});

test('a plan changed while it is being computed ends with the new points, every one predicted by the new run', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  const studyId = await openPlans(page);
  const api = page.request;
  const { setups } = await (await api.get(`/api/studies/${studyId}/setups`)).json();
  const setupId = setups.find((s: { name: string }) => s.name === DEMO_SETUP).id;
  const tiltAxis = (step: number) => ({ quantity: 'tiltDeg', displayUnit: 'deg', mode: 'range', start: 0, stop: 90, step });
  const distanceAxis = { quantity: 'distance', displayUnit: 'cm', mode: 'range', start: 0.05, stop: 0.25, step: 0.01 };

  // A plan big enough to still be computing when it is changed: 91 tilts x 21 distances.
  const created = await api.post(`/api/studies/${studyId}/plans`, {
    data: { name: `Changed mid-run ${Date.now()}`, setupId, axes: [tiltAxis(1), distanceAxis], repeats: 1, minutesPerPoint: 1, notes: '' },
  });
  expect(created.status()).toBe(201);
  const { plan } = await created.json();
  const base = `/api/studies/${studyId}/plans/${plan.id}`;

  const changed = await api.patch(base, { data: { axes: [tiltAxis(45), distanceAxis] } });
  expect(changed.status()).toBe(200);
  expect((await changed.json()).plan.pointCount).toBe(3 * 21);

  await expect
    .poll(async () => (await (await api.get(`${base}/progress`)).json()).status, { timeout: 60_000, intervals: [250] })
    .toBe('done');
  const { points } = await (await api.get(`${base}/points`)).json();
  expect(points).toHaveLength(3 * 21);
  expect(new Set(points.map((p: { pose: { tiltDeg: number } }) => p.pose.tiltDeg))).toEqual(new Set([0, 45, 90]));
  expect(points.every((p: { predicted: unknown }) => p.predicted !== null)).toBe(true);

  // Spot-check two points against /api/solve for the same setup (independent path through the API).
  const { setup } = await (await api.get(`/api/studies/${studyId}/setups/${setupId}`)).json();
  const { coils } = await (await api.get(`/api/studies/${studyId}/coils`)).json();
  const specOf = (id: number) => coils.find((c: { id: number }) => c.id === id).spec;
  for (const point of [points[0], points[points.length - 1]]) {
    const solved = await api.post('/api/solve', {
      data: {
        transmitter: specOf(setup.transmitterCoilId),
        receiver: specOf(setup.receiverCoilId),
        placement: { distance: point.pose.distance, lateralOffset: point.pose.lateralOffset, tiltDeg: point.pose.tiltDeg },
        circuit: setup.circuit,
        tolerance: 1e-6,
      },
    });
    const { coupling } = await solved.json();
    // Both sides solve to a requested tolerance of 1e-6; 1e-5 leaves room for the two estimates.
    expect(Math.abs(point.predicted.coupling - coupling)).toBeLessThanOrEqual(1e-5 * Math.abs(coupling) + 1e-12);
  }
  await api.delete(base).catch(() => undefined);
});
