import { expect, test } from '@playwright/test';
import { DEMO, PAD_STUDY, RAIL_STUDY, signIn } from './support/accounts';

/** The study's history page against the built app: who did what, filters, and who may see it. */

/** The plan database/seeds/01_demo_lab.ts creates (as the researcher) on the pad study. */
const SEEDED_PLAN = 'Probe tilt x depth';

test('the supervisor reads who created the seeded plan in the study history, and an outsider gets not-found', async ({ page, browser }) => {
  await signIn(page, DEMO.supervisor);
  await page.getByRole('link', { name: PAD_STUDY }).click();
  await page.getByRole('navigation', { name: 'Study' }).getByRole('link', { name: 'History' }).click();
  await expect(page).toHaveURL(/\/studies\/\d+\/history$/);
  await expect(page.getByRole('heading', { name: 'History', level: 1 })).toBeVisible();
  const historyUrl = page.url();

  const history = page.getByRole('list', { name: 'History of this study' });
  await expect(history.getByRole('listitem').first()).toBeVisible();

  // Other specs add events; narrowing to the seeded plan's plan work leaves its creation in view.
  const filters = page.getByRole('search', { name: 'Filter the history' });
  await filters.getByLabel('Plan', { exact: true }).selectOption({ label: SEEDED_PLAN });
  await filters.getByLabel('Kind', { exact: true }).selectOption({ label: 'Plans' });
  await expect(page).toHaveURL(/[?&]planId=\d+/);
  const created = history.getByRole('listitem').filter({ hasText: `created the plan \u201c${SEEDED_PLAN}\u201d` });
  await expect(created).toHaveCount(1);
  await expect(created).toContainText(DEMO.researcher.name);
  await expect(created.getByRole('link', { name: SEEDED_PLAN })).toHaveAttribute('href', /\/plans\/\d+$/);
  // The exact instant is on the time element for anyone who needs it.
  await expect(created.locator('time')).toHaveAttribute('title', /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/);

  // The person filter lists who has acted on the study; every action the app records has its own kind.
  await filters.getByLabel('Person', { exact: true }).selectOption({ label: DEMO.researcher.name });
  await expect(created).toHaveCount(1);
  await filters.getByLabel('Kind', { exact: true }).selectOption({ label: 'Other' });
  await expect(page.getByText('Nothing recorded matches these filters.')).toBeVisible();
  await filters.getByRole('button', { name: 'Clear filters' }).click();
  await expect(page).toHaveURL(/\/history$/);
  await expect(history.getByRole('listitem').first()).toBeVisible();

  const outsider = await browser.newContext();
  try {
    const outsiderPage = await outsider.newPage();
    await signIn(outsiderPage, DEMO.otherResearcher);
    const response = await outsiderPage.goto(historyUrl);
    expect(response?.status()).toBe(404);
    await expect(outsiderPage.getByRole('heading', { name: 'Not found' })).toBeVisible();
    await expect(outsiderPage.getByText(SEEDED_PLAN)).toHaveCount(0);
  } finally {
    await outsider.close();
  }
});

test('a long history comes in pages: "Show older" brings the next one, down to the study\u2019s start', async ({ page }) => {
  await signIn(page, DEMO.otherResearcher);
  await page.getByRole('link', { name: RAIL_STUDY }).click();
  await page.waitForURL(/\/studies\/\d+$/);
  const studyId = Number(/\/studies\/(\d+)$/.exec(page.url())![1]);
  // One more event than the page holds (50), besides the study's creation.
  for (let n = 0; n < 51; n++) {
    const response = await page.request.post(`/api/studies/${studyId}/coils`, {
      data: { name: `Docking loop ${n}`, spec: { kind: 'loop', radius: 0.02, wireDiameter: 0.001 } },
    });
    expect(response.status()).toBe(201);
  }

  const refused = await page.request.get(`/api/studies/${studyId}/history?limit=500`);
  expect(refused.status()).toBe(422);
  expect((await refused.json()).issues).toEqual([{ path: 'limit', message: 'The limit must be at most 200.' }]);

  await page.goto(`/studies/${studyId}/history`);
  const history = page.getByRole('list', { name: 'History of this study' });
  await expect(history.getByRole('listitem')).toHaveCount(50);
  await expect(history.getByRole('listitem').first()).toContainText(`${DEMO.otherResearcher.name} added the coil \u201cDocking loop 50\u201d`);
  await page.getByRole('button', { name: 'Show older' }).click();
  await expect(history.getByRole('listitem')).toHaveCount(52);
  await expect(history.getByRole('listitem').last()).toContainText(`created the study \u201c${RAIL_STUDY}\u201d`);
  await expect(page.getByRole('button', { name: 'Show older' })).toHaveCount(0);
});
