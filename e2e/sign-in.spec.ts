import { expect, test } from '@playwright/test';
import { DEMO } from './support/accounts';

test('a wrong password is refused with a clear message', async ({ page }) => {
  await page.goto('/signin');
  await page.getByLabel('E-mail', { exact: true }).fill(DEMO.researcher.email);
  await page.getByLabel('Password', { exact: true }).fill('not-the-password');
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.locator('main').getByRole('alert')).toContainText('do not match');
  await expect(page).toHaveURL(/\/signin/);
});

test('repeated failures for one address are paused and the form says so', async ({ page }) => {
  const address = `guess.target.${Date.now()}@couplet.test`;
  await page.goto('/signin');
  await page.getByLabel('E-mail', { exact: true }).fill(address);
  for (let attempt = 1; attempt <= 6; attempt += 1) {
    await page.getByLabel('Password', { exact: true }).fill(`guess-${attempt}`);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await expect(page.locator('main').getByRole('alert')).toBeVisible();
  }
  await expect(page.locator('main').getByRole('alert')).toContainText('Too many failed sign-ins');
});

test('session cookie is httpOnly and SameSite', async ({ page, context }) => {
  await page.goto('/signin');
  await page.getByLabel('E-mail', { exact: true }).fill(DEMO.student.email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO.student.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/dashboard$/);
  const session = (await context.cookies()).find((c) => c.name.includes('next-auth.session-token'));
  expect(session).toBeDefined();
  expect(session?.httpOnly).toBe(true);
  expect(session?.sameSite).toBe('Lax');
});
