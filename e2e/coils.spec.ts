import { expect, test, type Page } from '@playwright/test';
import { formatInductance } from '../src/lib/units/format';
import { DEMO, PAD_STUDY, signIn } from './support/accounts';

/** Digits the coil table shows (src/components/coils/coil-format.ts). */
const TABLE_DIGITS = 4;

async function openCoils(page: Page): Promise<number> {
  await page.getByRole('link', { name: PAD_STUDY }).click();
  await page.getByRole('navigation', { name: 'Study' }).getByRole('link', { name: 'Coils' }).click();
  await expect(page.getByRole('heading', { name: 'Coils', level: 1 })).toBeVisible();
  return Number(/\/studies\/(\d+)\/coils$/.exec(page.url())![1]);
}

type ApiCoil = { name: string; spec: Record<string, unknown>; wireLabel: string | null; predicted: { selfInductance: number } | null };

async function coilNamed(page: Page, studyId: number, name: string): Promise<ApiCoil> {
  const { coils } = await (await page.request.get(`/api/studies/${studyId}/coils`)).json();
  return coils.find((c: ApiCoil) => c.name === name);
}

test('a researcher adds two coils typed with units and sees them normalised, with predicted L', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  const studyId = await openCoils(page);
  const table = page.getByRole('table', { name: 'Coils of this study' });

  await page.getByRole('button', { name: 'New coil' }).click();
  let form = page.getByRole('form', { name: 'New coil' });
  await form.getByLabel('Name', { exact: true }).fill('E2E spiral pad');
  await form.getByLabel('Kind', { exact: true }).selectOption('spiral');
  await form.getByLabel('Inner radius').fill('25 mm');
  await form.getByLabel('Outer radius').fill('0.12 m');
  await expect(form.getByText('Reads as 12 cm')).toBeVisible();
  await form.getByLabel('Turns', { exact: true }).fill('7');
  await form.getByLabel('Wire', { exact: true }).fill('AWG 16');
  await form.getByRole('button', { name: 'Add coil' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Added “E2E spiral pad”' })).toBeVisible();

  await page.getByRole('button', { name: 'New coil' }).click();
  form = page.getByRole('form', { name: 'New coil' });
  await form.getByLabel('Name', { exact: true }).fill('E2E probe helix');
  await form.getByLabel('Kind', { exact: true }).selectOption('helix');
  await form.getByLabel('Radius', { exact: true }).fill('0.5in');
  await form.getByLabel('Length', { exact: true }).fill('2 cm');
  await form.getByLabel('Turns', { exact: true }).fill('10');
  await form.getByLabel('Wire', { exact: true }).fill('0.8 mm');
  await form.getByLabel('Measured inductance').fill('1.9 uH');
  await form.getByLabel('Measured at').fill('6.78 MHz');
  await form.getByRole('button', { name: 'Add coil' }).click();
  await expect(page.getByRole('status').filter({ hasText: 'Added “E2E probe helix”' })).toBeVisible();

  // Stored in SI: metres, the gauge as its ASTM B258 diameter.
  const pad = await coilNamed(page, studyId, 'E2E spiral pad');
  expect(pad.spec).toMatchObject({ kind: 'spiral', innerRadius: 0.025, outerRadius: 0.12, turns: 7, wireDiameter: expect.closeTo(1.29085e-3, 7) });
  expect(pad.wireLabel).toBe('AWG 16');
  const probe = await coilNamed(page, studyId, 'E2E probe helix');
  expect(probe.spec).toMatchObject({ kind: 'helix', radius: 0.0127, length: 0.02, turns: 10, wireDiameter: 0.0008 });

  // Shown normalised, with the predicted L the API computed at the study frequency.
  const padRow = table.getByRole('row').filter({ hasText: 'E2E spiral pad' });
  await expect(padRow).toContainText('radius 2.5 cm to 12 cm');
  await expect(padRow).toContainText('AWG 16');
  await expect(padRow).toContainText('1.291 mm');
  await expect(padRow).toContainText(formatInductance(pad.predicted!.selfInductance, TABLE_DIGITS));
  const probeRow = table.getByRole('row').filter({ hasText: 'E2E probe helix' });
  await expect(probeRow).toContainText('radius 1.27 cm, length 2 cm');
  await expect(probeRow).toContainText('0.8 mm');
  await expect(probeRow).toContainText(formatInductance(probe.predicted!.selfInductance, TABLE_DIGITS));
  await expect(probeRow).toContainText('L 1.9 µH');
  await expect(probeRow).toContainText('at 6.78 MHz');

  // Sorting by predicted L puts the small probe above the pad.
  await table.getByRole('button', { name: /^L/ }).click();
  const names = await table.locator('tbody tr td:first-child').allInnerTexts();
  expect(names.findIndex((n) => n.startsWith('E2E probe helix'))).toBeLessThan(names.findIndex((n) => n.startsWith('E2E spiral pad')));
});

test('the form names the field that is wrong', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  await openCoils(page);
  await page.getByRole('button', { name: 'New coil' }).click();
  const form = page.getByRole('form', { name: 'New coil' });
  await form.getByLabel('Name', { exact: true }).fill('Broken spiral');
  await form.getByLabel('Inner radius').fill('14 cm');
  await form.getByLabel('Outer radius').fill('12 kg');
  await form.getByLabel('Turns', { exact: true }).fill('0');
  await form.getByLabel('Wire', { exact: true }).fill('AWG 18');
  await form.getByRole('button', { name: 'Add coil' }).click();
  await expect(form.getByText('Outer radius: "12 kg" is not a length.', { exact: false })).toBeVisible();

  await form.getByLabel('Outer radius').fill('12 cm');
  await form.getByRole('button', { name: 'Add coil' }).click();
  await expect(form.getByText('The number of turns must be greater than zero.')).toBeVisible();
  await form.getByLabel('Turns', { exact: true }).fill('6');
  await form.getByRole('button', { name: 'Add coil' }).click();
  await expect(form.getByText('The inner radius (140 mm) must be smaller than the outer radius (120 mm).')).toBeVisible();
});

test('deleting a coil a setup uses is refused with the setup named', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  await openCoils(page);
  const row = page.getByRole('row').filter({ hasText: 'Bench pad, flat spiral' });
  await row.getByRole('button', { name: 'Delete Bench pad, flat spiral' }).click();
  await row.getByRole('button', { name: 'Confirm delete Bench pad, flat spiral' }).click();
  await expect(page.getByRole('alert').filter({ hasText: 'is used by setup “Probe 10 cm deep, upright”' })).toBeVisible();
  await expect(row).toBeVisible();
});

test('a student sees the coil table but no form, edit or delete', async ({ page }) => {
  await signIn(page, DEMO.student);
  await openCoils(page);
  const table = page.getByRole('table', { name: 'Coils of this study' });
  await expect(table.getByRole('row').filter({ hasText: 'Probe helix, 12 turns' })).toContainText('AWG 22');
  await expect(table.getByRole('row').filter({ hasText: 'Bench pad, flat spiral' })).toContainText('µH');
  await expect(page.getByRole('button', { name: 'New coil' })).toHaveCount(0);
  await expect(page.getByRole('form')).toHaveCount(0);
  await expect(table.getByRole('button', { name: /^(Edit|Delete)/ })).toHaveCount(0);
});

test('someone not on the study gets not-found for its coil page and API', async ({ page, browser }) => {
  const researcherContext = await browser.newContext();
  const researcherPage = await researcherContext.newPage();
  await signIn(researcherPage, DEMO.researcher);
  const studyId = await openCoils(researcherPage);
  await researcherContext.close();

  await signIn(page, DEMO.otherResearcher);
  expect((await page.goto(`/studies/${studyId}/coils`))?.status()).toBe(404);
  expect((await page.request.get(`/api/studies/${studyId}/coils`)).status()).toBe(404);
  expect((await page.request.get(`/api/studies/${studyId}/setups`)).status()).toBe(404);
});
