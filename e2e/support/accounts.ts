import { expect, type APIRequestContext, type Page } from '@playwright/test';

/** The demo lab's accounts (database/seeds/01_demo_lab.ts; listed in the README). */
export const DEMO = {
  admin: { email: 'admin@couplet.test', password: 'bench-admin-2026', name: 'Rafaela Duarte' },
  researcher: { email: 'ines.okafor@couplet.test', password: 'bench-ines-2026', name: 'Ines Okafor' },
  student: { email: 'tomasz.rehn@couplet.test', password: 'bench-tomasz-2026', name: 'Tomasz Rehn' },
  supervisor: { email: 'maren.solberg@couplet.test', password: 'bench-maren-2026', name: 'Maren Solberg' },
  otherResearcher: { email: 'kofi.mensah@couplet.test', password: 'bench-kofi-2026', name: 'Kofi Mensah' },
} as const;

export const PAD_STUDY = 'Seed-tray pad to buried soil probes';
export const RAIL_STUDY = 'Irrigation-rail cart docking coil';

export async function signIn(page: Page, account: { email: string; password: string }): Promise<void> {
  await page.goto('/signin');
  await page.getByLabel('E-mail', { exact: true }).fill(account.email);
  await page.getByLabel('Password', { exact: true }).fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await expect(page).toHaveURL(/\/dashboard$/);
  await expect(page.getByRole('heading', { name: 'My studies' })).toBeVisible();
}

/** Signs an API request context in through next-auth's credentials endpoint (for API-level checks). */
export async function apiSignIn(request: APIRequestContext, account: { email: string; password: string }): Promise<void> {
  const csrf = await (await request.get('/api/auth/csrf')).json();
  const response = await request.post('/api/auth/callback/credentials', {
    form: { csrfToken: csrf.csrfToken, email: account.email, password: account.password, json: 'true' },
  });
  expect(response.ok()).toBe(true);
}
