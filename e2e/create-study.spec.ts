import { expect, test } from '@playwright/test';
import { DEMO, signIn } from './support/accounts';

test('a researcher starts a study with a frequency typed with units', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  await page.getByRole('button', { name: 'New study' }).click();
  await page.getByLabel('Study name').fill('Cart dock lateral play, e2e');
  await page.getByLabel('Summary').fill('How far can the cart stop off-centre?');
  await page.getByLabel('Operating frequency').fill('85 kHz');
  await page.getByRole('button', { name: 'Create study' }).click();

  await expect(page.getByRole('heading', { name: 'Cart dock lateral play, e2e' })).toBeVisible();
  await expect(page.getByText('85 kHz')).toBeVisible();

  // The API answers the same: frequency stored in hertz (SI), creator is the researcher.
  const response = await page.request.get('/api/studies');
  const { studies } = await response.json();
  const created = studies.find((s: { name: string }) => s.name === 'Cart dock lateral play, e2e');
  expect(created).toMatchObject({ frequencyHz: 85000, myRole: 'researcher' });
});

test('the form names the field that is wrong', async ({ page }) => {
  await signIn(page, DEMO.researcher);
  await page.getByRole('button', { name: 'New study' }).click();
  await page.getByLabel('Study name').fill('ab');
  await page.getByLabel('Operating frequency').fill('fast');
  await page.getByRole('button', { name: 'Create study' }).click();
  await expect(page.getByText('Use at least 3 characters.')).toBeVisible();
  await expect(page.locator('main').getByRole('alert').filter({ hasText: /frequency/i }).first()).toBeVisible();
});
