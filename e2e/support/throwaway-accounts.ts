import { expect, type Browser, type BrowserContext, type Page, type PlaywrightWorkerArgs } from '@playwright/test';
import { DEMO, apiSignIn, signIn } from './accounts';

const BASE_URL = process.env.BASE_URL ?? 'http://127.0.0.1:3100';

export interface ThrowawayAccount {
  email: string;
  password: string;
  name: string;
}

/**
 * A new member account made through the admin API, for tests that change passwords, end sessions or
 * count failed sign-ins: the demo accounts other specs sign in with stay as they are. `prefix` keeps
 * each spec's accounts apart; the time makes every run's address new.
 */
export async function throwawayAccount(playwright: PlaywrightWorkerArgs['playwright'], prefix: string, label: string, password: string): Promise<ThrowawayAccount> {
  const admin = await playwright.request.newContext({ baseURL: BASE_URL });
  await apiSignIn(admin, DEMO.admin);
  const email = `${prefix}-${label}-${Date.now().toString(36)}@couplet.test`;
  const name = `${prefix[0].toUpperCase()}${prefix.slice(1)} ${label}`;
  const created = await admin.post('/api/admin/accounts', { data: { email, name, siteRole: 'member', password } });
  expect(created.status()).toBe(201);
  await admin.dispose();
  return { email, password, name };
}

/** A browser context of its own (its own cookies), signed in as `account` through the sign-in page. */
export async function signedInPage(browser: Browser, account: { email: string; password: string }): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, account);
  return { context, page };
}
