import { expect, test, type Page } from '@playwright/test';
import { signIn } from './support/accounts';
import { signedInPage, throwawayAccount } from './support/throwaway-accounts';

/**
 * Sessions end when they should: a copy of a session cookie stops working once its owner signs out,
 * and a password change ends the person's other sessions while the one that made it goes on. Each test
 * uses a throwaway account made through the admin API, so no demo password or demo session changes.
 */

const FIRST_PASSWORD = 'sessions-first-pass-2026';
const SECOND_PASSWORD = 'sessions-second-pass-2026';

/** Reaches the signed-in app: the dashboard renders and the studies API answers. */
async function expectSignedIn(page: Page, who: string): Promise<void> {
  expect((await page.request.get('/api/studies')).status(), `${who}: /api/studies`).toBe(200);
  await page.goto('/dashboard');
  await expect(page, `${who}: /dashboard`).toHaveURL(/\/dashboard$/);
  await expect(page.getByRole('heading', { name: 'My studies' })).toBeVisible();
}

/** Treated as signed out: 401 from the API, and the dashboard sends them to sign in. */
async function expectSignedOut(page: Page, who: string): Promise<void> {
  const response = await page.request.get('/api/studies');
  expect(response.status(), `${who}: /api/studies`).toBe(401);
  expect(await response.json()).toMatchObject({ error: expect.any(String) });
  await page.goto('/dashboard');
  await expect(page, `${who}: /dashboard`).toHaveURL(/\/signin/);
  await expect(page.getByLabel('E-mail', { exact: true })).toBeVisible();
}

test('a copied session cookie stops working when its owner signs out', async ({ browser, playwright }) => {
  const account = await throwawayAccount(playwright, 'sessions', 'signout', FIRST_PASSWORD);
  const owner = await signedInPage(browser, account);

  const copy = await browser.newContext();
  await copy.addCookies(await owner.context.cookies());
  const copyPage = await copy.newPage();
  expect((await copy.cookies()).some((c) => c.name.includes('next-auth.session-token')), 'the copy holds the session cookie').toBe(true);

  await expectSignedIn(owner.page, 'owner');
  await expectSignedIn(copyPage, 'copy');

  await owner.page.goto('/dashboard');
  await owner.page.getByRole('button', { name: 'Sign out' }).click();
  await expect(owner.page).toHaveURL(/\/signin/);

  await expectSignedOut(owner.page, 'owner');
  // the copy still presents a cookie with a valid signature and expiry; the server has ended its session
  expect((await copy.cookies()).some((c) => c.name.includes('next-auth.session-token')), 'the copy still holds the cookie').toBe(true);
  await expectSignedOut(copyPage, 'copy');

  // signing in again starts a new session that works
  await signIn(copyPage, account);
  await expectSignedIn(copyPage, 'a new sign-in');

  await owner.context.close();
  await copy.close();
});

test('a password change ends the person\u2019s other sessions; the one that changed it goes on', async ({ browser, playwright }) => {
  const account = await throwawayAccount(playwright, 'sessions', 'password', FIRST_PASSWORD);
  const here = await signedInPage(browser, account);
  const elsewhere = await signedInPage(browser, account);
  await expectSignedIn(here.page, 'this session');
  await expectSignedIn(elsewhere.page, 'the other session');

  // a wrong current password changes nothing and names the field
  const wrong = await here.page.request.post('/api/account/password', { data: { currentPassword: 'not-my-password-1', newPassword: SECOND_PASSWORD } });
  expect(wrong.status()).toBe(422);
  expect((await wrong.json()).issues.map((i: { path: string }) => i.path)).toEqual(['currentPassword']);
  await expectSignedIn(elsewhere.page, 'the other session after a refused change');

  const changed = await here.page.request.post('/api/account/password', { data: { currentPassword: FIRST_PASSWORD, newPassword: SECOND_PASSWORD } });
  expect(changed.status(), await changed.text()).toBe(200);
  expect(await changed.json()).toEqual({ otherSessionsEnded: 1 });

  await expectSignedOut(elsewhere.page, 'the other session');
  await expectSignedIn(here.page, 'this session');

  // the old password no longer signs in; the new one does
  const { page } = elsewhere;
  await page.getByLabel('E-mail', { exact: true }).fill(account.email);
  await page.getByLabel('Password', { exact: true }).fill(FIRST_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page.locator('main').getByRole('alert')).toContainText('do not match');
  await signIn(page, { email: account.email, password: SECOND_PASSWORD });
  await expectSignedIn(page, 'a sign-in with the new password');

  await here.context.close();
  await elsewhere.context.close();
});

test('changing the password needs a session', async ({ request }) => {
  const response = await request.post('/api/account/password', { data: { currentPassword: FIRST_PASSWORD, newPassword: SECOND_PASSWORD } });
  expect(response.status()).toBe(401);
});
