import { expect, test } from '@playwright/test';
import { DEMO, PAD_STUDY, RAIL_STUDY, signIn } from './support/accounts';

/** Each demo role sees its own studies and only the controls its role allows (PRODUCT.md roles table). */
test.describe('what each role sees', () => {
  test('researcher: own study with the researcher badge, can start studies and invite', async ({ page }) => {
    await signIn(page, DEMO.researcher);
    const study = page.getByRole('listitem').filter({ hasText: PAD_STUDY });
    await expect(study).toBeVisible();
    await expect(study.getByText('researcher', { exact: true })).toBeVisible();
    await expect(page.getByText(RAIL_STUDY)).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'New study' })).toBeVisible();
    await expect(page.getByRole('link', { name: 'Accounts' })).toHaveCount(0);

    await page.getByRole('link', { name: PAD_STUDY }).click();
    await expect(page.getByRole('heading', { name: PAD_STUDY })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Send invitation' })).toBeVisible();
  });

  test('student: sees the study as student, cannot start a study or invite', async ({ page }) => {
    await signIn(page, DEMO.student);
    const study = page.getByRole('listitem').filter({ hasText: PAD_STUDY });
    await expect(study.getByText('student', { exact: true })).toBeVisible();
    await expect(page.getByText(RAIL_STUDY)).toHaveCount(0);
    await expect(page.getByRole('button', { name: 'New study' })).toHaveCount(0);

    await page.getByRole('link', { name: PAD_STUDY }).click();
    await expect(page.getByRole('heading', { name: PAD_STUDY })).toBeVisible();
    await expect(page.getByText(DEMO.supervisor.name)).toBeVisible();
    await expect(page.getByRole('button', { name: 'Send invitation' })).toHaveCount(0);
  });

  test('supervisor: sees the study as supervisor and may invite, but not start a study', async ({ page }) => {
    await signIn(page, DEMO.supervisor);
    const study = page.getByRole('listitem').filter({ hasText: PAD_STUDY });
    await expect(study.getByText('supervisor', { exact: true })).toBeVisible();
    await expect(page.getByRole('button', { name: 'New study' })).toHaveCount(0);
    await page.getByRole('link', { name: PAD_STUDY }).click();
    await expect(page.getByRole('button', { name: 'Send invitation' })).toBeVisible();
  });

  test('admin: sees every study and the accounts page', async ({ page }) => {
    await signIn(page, DEMO.admin);
    await expect(page.getByRole('link', { name: PAD_STUDY })).toBeVisible();
    await expect(page.getByRole('link', { name: RAIL_STUDY })).toBeVisible();
    await page.getByRole('link', { name: 'Accounts' }).click();
    await expect(page.getByRole('cell', { name: DEMO.student.email })).toBeVisible();
  });

  test('a student who opens the accounts page or another study gets not-found', async ({ page }) => {
    await signIn(page, DEMO.student);
    const accounts = await page.goto('/admin/accounts');
    expect(accounts?.status()).toBe(404);
    const other = await page.goto('/studies/999999');
    expect(other?.status()).toBe(404);
  });

  test('sign out ends the session', async ({ page }) => {
    await signIn(page, DEMO.student);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expect(page).toHaveURL(/\/signin/);
    const response = await page.request.get('/api/studies');
    expect(response.status()).toBe(401);
  });
});
