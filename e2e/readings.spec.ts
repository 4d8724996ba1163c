import { expect, test, type Locator, type Page } from '@playwright/test';
import { DEMO, signIn } from './support/accounts';
import { createBenchPlan } from './support/bench-plan';
import { waitForMessageTo } from './support/inbox';

/**
 * The student's logbook against the built app: the cautions gate, a reading by every method with the
 * server's derived values, a correction that keeps the history, and sending the plan for review.
 * Expected values come from the formulas of the Keysight (Agilent) Impedance Measurement Handbook,
 * section on mutual inductance, computed here independently of the app.
 */

const F = 6.78e6;
const OMEGA = 2 * Math.PI * F;

async function openLogbook(page: Page, studyId: number, planId: number): Promise<void> {
  await page.goto(`/studies/${studyId}/plans/${planId}/logbook`);
  await expect(page.getByRole('heading', { level: 1, name: /^Logbook: / })).toBeVisible();
}

/** Fills one method's fields in the reading form and saves it. */
async function logReading(form: Locator, method: string, values: Record<string, string>): Promise<void> {
  await form.getByLabel('Method', { exact: true }).selectOption(method);
  for (const [label, value] of Object.entries(values)) await form.getByLabel(label, { exact: true }).fill(value);
  await form.getByRole('button', { name: 'Save reading' }).click();
}

/** "112.7 nH" style, as the app writes M (4 significant digits, engineering prefix). */
function nano(henries: number): string {
  return `${(henries * 1e9).toPrecision(4)} nH`;
}

test('a student acknowledges the cautions, logs by every method and sees the derived values', async ({ page, playwright }) => {
  const { studyId, planId } = await createBenchPlan(playwright, `Six methods ${Date.now()}`, [0.06, 0.1]);
  await signIn(page, DEMO.student);
  await openLogbook(page, studyId, planId);

  // no reading form until the cautions are acknowledged
  await expect(page.getByRole('form', { name: 'Log a reading' })).toHaveCount(0);
  const cautions = page.getByRole('region', { name: 'Before the first reading on this plan' });
  await expect(cautions).toContainText('High voltage on resonant capacitors');
  await expect(cautions).toContainText('Implanted medical devices');
  await expect(cautions.getByRole('button', { name: 'Acknowledge and start logging' })).toBeDisabled();
  await cautions.getByRole('checkbox').check();
  await cautions.getByRole('button', { name: 'Acknowledge and start logging' }).click();
  const form = page.getByRole('form', { name: 'Log a reading' });
  await expect(form).toBeVisible();

  // open-circuit voltage: M = |V2| / (omega |I1|)
  await logReading(form, 'open_circuit', { 'Frequency f': '6.78 MHz', 'I1, transmitter current': '250 mA', 'V2, receiver open-circuit voltage': '1.2 V', 'Phase of V2 against I1': '89' });
  const openCircuit = page.getByRole('article', { name: 'Open-circuit voltage reading' });
  await expect(openCircuit).toContainText(nano(1.2 / (OMEGA * 0.25)));
  await expect(page.getByText('Saved the reading at point 1.')).toBeVisible();

  // series aiding / opposing: M = (La - Lo) / 4
  await logReading(form, 'aiding_opposing', { 'La, series aiding': '12 uH', 'Lo, series opposing': '10 uH' });
  await expect(page.getByRole('article', { name: 'Series aiding and opposing reading' })).toContainText(nano((12e-6 - 10e-6) / 4));

  // short / open: k = sqrt(1 - Lsc / Loc)
  await logReading(form, 'short_open', { 'Lsc, other coil shorted': '9 uH', 'Loc, other coil open': '10 uH' });
  await expect(page.getByRole('article', { name: 'Short and open reading' }).locator('[data-quantity="coupling"]')).toContainText(Math.sqrt(1 - 0.9).toPrecision(4));

  // two-port impedance: M = Im(Z21) / omega, k = Im Z21 / sqrt(Im Z11 Im Z22)
  await logReading(form, 'two_port', { 'Frequency f': '6.78 MHz', 'Re Z11': '0.5', 'Im Z11': '426', 'Re Z21': '0.01', 'Im Z21': '21.3', 'Re Z22': '0.5', 'Im Z22': '426' });
  const twoPort = page.getByRole('article', { name: 'Two-port impedance reading' });
  await expect(twoPort).toContainText(nano(21.3 / OMEGA));
  await expect(twoPort.locator('[data-quantity="coupling"]')).toContainText((21.3 / 426).toPrecision(4));

  // split peaks: k = (fh^2 - fl^2) / (fh^2 + fl^2)
  await logReading(form, 'split_peaks', { 'fl, lower peak': '6.6 MHz', 'fh, upper peak': '6.95 MHz' });
  const k = (6.95 ** 2 - 6.6 ** 2) / (6.95 ** 2 + 6.6 ** 2);
  await expect(page.getByRole('article', { name: 'Split resonance peaks reading' }).locator('[data-quantity="coupling"]')).toContainText(k.toPrecision(4));

  // direct power: efficiency = Pout / Pin
  await logReading(form, 'direct_power', { 'Pin, into the transmitter': '2 W', 'Pout, into the load': '1.5 W' });
  await expect(page.getByRole('article', { name: 'Direct power reading' }).locator('[data-quantity="efficiency"]')).toContainText('75.00 %');

  // a bad unit is refused in the form, naming the field
  await form.getByLabel('Method', { exact: true }).selectOption('open_circuit');
  await form.getByLabel('I1, transmitter current', { exact: true }).fill('250 kg');
  await form.getByRole('button', { name: 'Save reading' }).click();
  await expect(form.getByText(/I1, transmitter current: "250 kg" is not a current/)).toBeVisible();
});

test('a correction becomes version 2 with its reason, and version 1 stays in the history', async ({ page, playwright }) => {
  const { studyId, planId } = await createBenchPlan(playwright, `Correction ${Date.now()}`, [0.08]);
  await signIn(page, DEMO.student);
  await openLogbook(page, studyId, planId);
  const cautions = page.getByRole('region', { name: 'Before the first reading on this plan' });
  await cautions.getByRole('checkbox').check();
  await cautions.getByRole('button', { name: 'Acknowledge and start logging' }).click();

  const form = page.getByRole('form', { name: 'Log a reading' });
  await logReading(form, 'open_circuit', { 'Frequency f': '6.78 MHz', 'I1, transmitter current': '0.2 A', 'V2, receiver open-circuit voltage': '17 mV' });
  const article = page.getByRole('article', { name: 'Open-circuit voltage reading' });
  await expect(article).toContainText('version 1');

  await article.getByRole('button', { name: 'Correct' }).click();
  const correction = page.getByRole('form', { name: 'Correct the reading' });
  await correction.getByLabel('V2, receiver open-circuit voltage', { exact: true }).fill('17.5 mV');
  await correction.getByRole('button', { name: 'Save correction' }).click();
  await expect(correction.getByText('Say why the reading is corrected.')).toBeVisible();
  await correction.getByLabel('Reason for the correction', { exact: true }).fill('Scope probe was set to x1, not x10');
  await correction.getByRole('button', { name: 'Save correction' }).click();

  await expect(article).toContainText('version 2');
  await expect(article).toContainText('corrected because: “Scope probe was set to x1, not x10”');
  await expect(article).toContainText(nano(17.5e-3 / (OMEGA * 0.2)));
  await article.getByText('History: 1 earlier version').click();
  const first = article.locator('[data-version="1"]');
  await expect(first).toContainText(nano(17e-3 / (OMEGA * 0.2)));
  await expect(first).toContainText('17.00 mV');
});

test('sending the plan for review notifies the supervisor; supervisors see the logbook read-only', async ({ page, playwright, browser }) => {
  const planName = `Review mail ${Date.now()}`;
  const { studyId, planId } = await createBenchPlan(playwright, planName, [0.07]);
  await signIn(page, DEMO.student);
  await openLogbook(page, studyId, planId);

  // nothing logged yet: the server refuses to send an empty plan
  await page.getByRole('button', { name: 'Submit for review' }).click();
  await page.getByRole('button', { name: 'Yes, submit for review' }).click();
  await expect(page.getByText('Log at least one reading before sending the plan for review.')).toBeVisible();
  await page.getByRole('button', { name: 'Not now' }).click();

  const cautions = page.getByRole('region', { name: 'Before the first reading on this plan' });
  await cautions.getByRole('checkbox').check();
  await cautions.getByRole('button', { name: 'Acknowledge and start logging' }).click();
  await logReading(page.getByRole('form', { name: 'Log a reading' }), 'split_peaks', { 'fl, lower peak': '6.5 MHz', 'fh, upper peak': '7.1 MHz' });
  await expect(page.getByRole('article', { name: 'Split resonance peaks reading' })).toBeVisible();

  const before = Date.now();
  await page.getByRole('button', { name: 'Submit for review' }).click();
  await page.getByRole('button', { name: 'Yes, submit for review' }).click();
  await expect(page.getByText('in review', { exact: true })).toBeVisible();
  await expect(page.getByRole('form', { name: 'Log a reading' })).toHaveCount(0);

  const mail = await waitForMessageTo(DEMO.supervisor.email, { about: planName });
  expect(Date.parse(mail.date)).toBeGreaterThanOrEqual(before - 60_000);
  expect(mail.subject).toContain('is ready for review');
  expect(mail.text).toContain(`/studies/${studyId}/plans/${planId}`);
  expect(mail.text).toContain('1 of 1 points have readings.');

  const supervisorContext = await browser.newContext();
  const supervisor = await supervisorContext.newPage();
  await signIn(supervisor, DEMO.supervisor);
  await openLogbook(supervisor, studyId, planId);
  await expect(supervisor.getByRole('article', { name: 'Split resonance peaks reading' })).toBeVisible();
  await expect(supervisor.getByRole('button', { name: 'Correct' })).toHaveCount(0);
  await supervisorContext.close();
});
