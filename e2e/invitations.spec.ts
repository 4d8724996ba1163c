import { expect, test } from '@playwright/test';
import { DEMO, PAD_STUDY, signIn } from './support/accounts';
import { inviteLinkIn, waitForMessageTo } from './support/inbox';

test('an invitation e-mail reaches the local SMTP stand-in and its link works once', async ({ page, browser }) => {
  const invitee = `amara.e2e.${Date.now()}@couplet.test`;

  await signIn(page, DEMO.researcher);
  await page.getByRole('link', { name: PAD_STUDY }).click();
  const inviteForm = page.getByRole('region', { name: 'Invite someone' });
  await inviteForm.getByLabel('E-mail', { exact: true }).fill(invitee);
  await inviteForm.getByLabel('Role', { exact: true }).selectOption('student');
  await inviteForm.getByRole('button', { name: 'Send invitation' }).click();
  await expect(page.getByRole('status').filter({ hasText: invitee })).toBeVisible();

  const message = await waitForMessageTo(invitee);
  expect(message.subject).toContain(PAD_STUDY);
  const link = inviteLinkIn(message);

  // The invitee, in a fresh browser context (not signed in), sets a password and joins.
  const inviteeContext = await browser.newContext();
  const inviteePage = await inviteeContext.newPage();
  await inviteePage.goto(link);
  await expect(inviteePage.getByText(PAD_STUDY).first()).toBeVisible();
  await inviteePage.getByLabel('Name', { exact: true }).fill('Amara Osei');
  await inviteePage.getByLabel('Password', { exact: true }).fill('compost-probe-42');
  await inviteePage.getByLabel('Repeat password').fill('compost-probe-42');
  await inviteePage.getByRole('button', { name: 'Create account and join' }).click();
  await expect(inviteePage).toHaveURL(/\/signin/);

  await signIn(inviteePage, { email: invitee, password: 'compost-probe-42' });
  const study = inviteePage.getByRole('listitem').filter({ hasText: PAD_STUDY });
  await expect(study.getByText('student', { exact: true })).toBeVisible();

  // The same link a second time: refused, and says why.
  await inviteePage.goto(link);
  await expect(inviteePage.getByText(/already been used/i)).toBeVisible();
  await expect(inviteePage.getByRole('button', { name: 'Create account and join' })).toHaveCount(0);
  await inviteeContext.close();
});
