import { expect, test, type Page } from '@playwright/test';
import { signIn } from './support/accounts';
import { signedInPage, throwawayAccount } from './support/throwaway-accounts';

/**
 * The account page: a signed-in person sees who they are and changes their own password there. The
 * change ends their other sessions and keeps the one that made it. Each test uses a throwaway account
 * made through the admin API, so no demo password, session or sign-in count changes.
 */

const FIRST_PASSWORD = 'account-first-pass-2026';
const SECOND_PASSWORD = 'account-second-pass-2026';
/** Failed sign-ins an account is allowed before it is paused (ACCOUNT_FAILURES_ALLOWED in src/lib/auth/sign-in-limiter.ts). */
const FAILURES_ALLOWED = 5;

type PasswordFormValues = { current: string; next: string; repeat: string };

async function fillPasswordForm(page: Page, values: PasswordFormValues): Promise<void> {
  await page.getByLabel('Current password', { exact: true }).fill(values.current);
  await page.getByLabel('New password', { exact: true }).fill(values.next);
  await page.getByLabel('Repeat new password', { exact: true }).fill(values.repeat);
  await page.getByRole('button', { name: 'Change password' }).click();
}

/** Fills and submits the form and returns the status the API answered with. */
async function submitPasswordForm(page: Page, values: PasswordFormValues): Promise<number> {
  const [response] = await Promise.all([
    page.waitForResponse((r) => new URL(r.url()).pathname === '/api/account/password' && r.request().method() === 'POST'),
    fillPasswordForm(page, values),
  ]);
  return response.status();
}

test('a password changed on the account page ends the other sessions and keeps this one', async ({ browser, playwright }) => {
  const account = await throwawayAccount(playwright, 'account', 'change', FIRST_PASSWORD);
  const here = await signedInPage(browser, account);
  const elsewhere = await signedInPage(browser, account);
  const { page } = here;

  // the header's name leads to the account page, which shows who is signed in
  await page.getByRole('link', { name: /Your account/ }).click();
  await expect(page).toHaveURL(/\/account$/);
  await expect(page.getByRole('heading', { name: 'Your account', level: 1 })).toBeVisible();
  const profile = page.getByRole('region', { name: 'Profile' });
  await expect(profile).toContainText(account.name);
  await expect(profile).toContainText(account.email);
  await expect(profile.getByText('member', { exact: true })).toBeVisible();

  const passwordRequests: string[] = [];
  page.on('request', (request) => {
    if (new URL(request.url()).pathname === '/api/account/password') passwordRequests.push(request.method());
  });

  // a repeat that differs is caught in the browser, on the repeat field, before anything is sent
  await fillPasswordForm(page, { current: FIRST_PASSWORD, next: SECOND_PASSWORD, repeat: `${SECOND_PASSWORD}x` });
  await expect(page.getByLabel('Repeat new password', { exact: true })).toHaveAccessibleDescription('The new passwords do not match.');
  await expect(page.getByLabel('Repeat new password', { exact: true })).toHaveAttribute('aria-invalid', 'true');
  expect(passwordRequests, 'no request for a mismatched repeat').toEqual([]);

  // a wrong current password is refused by the server and named on its field
  expect(await submitPasswordForm(page, { current: 'not-my-password-1', next: SECOND_PASSWORD, repeat: SECOND_PASSWORD })).toBe(422);
  await expect(page.getByLabel('Current password', { exact: true })).toHaveAccessibleDescription('This is not your current password.');
  expect(passwordRequests).toEqual(['POST']);
  await expect(page.getByLabel('Repeat new password', { exact: true })).not.toHaveAttribute('aria-invalid', 'true');

  // the right one changes it; the form says the other session was signed out
  expect(await submitPasswordForm(page, { current: FIRST_PASSWORD, next: SECOND_PASSWORD, repeat: SECOND_PASSWORD })).toBe(200);
  await expect(page.getByRole('status')).toHaveText('Password changed. 1 other signed-in session was signed out; this one stays signed in.');
  await expect(page.getByLabel('Current password', { exact: true })).toHaveValue('');
  expect(passwordRequests).toEqual(['POST', 'POST']);

  // this session goes on
  await page.reload();
  await expect(page).toHaveURL(/\/account$/);
  await expect(page.getByRole('heading', { name: 'Your account', level: 1 })).toBeVisible();
  await page.goto('/dashboard');
  await expect(page.getByRole('heading', { name: 'My studies' })).toBeVisible();

  // the other is sent to sign in on its next navigation
  await elsewhere.page.goto('/account');
  await expect(elsewhere.page).toHaveURL(/\/signin/);
  await expect(elsewhere.page.getByLabel('E-mail', { exact: true })).toBeVisible();

  // the old password no longer signs in; the new one does
  await elsewhere.page.getByLabel('E-mail', { exact: true }).fill(account.email);
  await elsewhere.page.getByLabel('Password', { exact: true }).fill(FIRST_PASSWORD);
  await elsewhere.page.getByRole('button', { name: 'Sign in' }).click();
  await expect(elsewhere.page.locator('main').getByRole('alert')).toContainText('do not match');
  await signIn(elsewhere.page, { email: account.email, password: SECOND_PASSWORD });

  await here.context.close();
  await elsewhere.context.close();
});

test('repeated wrong current passwords pause changes, and the form says so', async ({ browser, playwright }) => {
  const account = await throwawayAccount(playwright, 'account', 'paused', FIRST_PASSWORD);
  const { context, page } = await signedInPage(browser, account);
  await page.goto('/account');

  const current = page.getByLabel('Current password', { exact: true });
  for (let attempt = 1; attempt <= FAILURES_ALLOWED; attempt += 1) {
    expect(await submitPasswordForm(page, { current: `wrong-guess-${attempt}`, next: SECOND_PASSWORD, repeat: SECOND_PASSWORD }), `wrong guess ${attempt}`).toBe(422);
    await expect(current).toHaveAccessibleDescription('This is not your current password.');
  }
  // one more crosses the limit; after that even the right password waits
  expect(await submitPasswordForm(page, { current: 'wrong-guess-last', next: SECOND_PASSWORD, repeat: SECOND_PASSWORD })).toBe(429);
  expect(await submitPasswordForm(page, { current: FIRST_PASSWORD, next: SECOND_PASSWORD, repeat: SECOND_PASSWORD })).toBe(429);
  const paused = page.locator('main').getByRole('alert');
  await expect(paused).toHaveCount(1);
  await expect(paused).toContainText('Wrong current passwords count as failed sign-ins');
  await expect(paused).toContainText('Too many failed sign-ins.');
  await expect(paused).toContainText(/paused for \d+ minutes?/);
  await expect(current).not.toHaveAttribute('aria-invalid', 'true');

  // the pause holds for sign-in too: it is the same password being guessed
  const other = await browser.newContext();
  const signInPage = await other.newPage();
  await signInPage.goto('/signin');
  await signInPage.getByLabel('E-mail', { exact: true }).fill(account.email);
  await signInPage.getByLabel('Password', { exact: true }).fill(FIRST_PASSWORD);
  await signInPage.getByRole('button', { name: 'Sign in' }).click();
  await expect(signInPage.locator('main').getByRole('alert')).toContainText('Too many failed sign-ins');
  await other.close();

  await context.close();
});

test('signed out, the account page sends to sign-in', async ({ page }) => {
  await page.goto('/account');
  await expect(page).toHaveURL(/\/signin/);
  await expect(page.getByLabel('E-mail', { exact: true })).toBeVisible();
});
