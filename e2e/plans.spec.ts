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
