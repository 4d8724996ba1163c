import { readFile } from 'node:fs/promises';
import { expect, test, type APIRequestContext, type Page } from '@playwright/test';
import { apiSignIn, DEMO, signIn } from './support/accounts';
import { BASE_URL, createBenchPlan } from './support/bench-plan';
import { waitForMessageTo, type InboxMessage } from './support/inbox';

/**
 * The review of a plan against the built app: the student's readings go to review, the supervisor
 * reads the agreement, comments on a point and returns the plan with a reason (mailed to the bench),
 * the student corrects and resubmits, the supervisor accepts, and the PDF report carries the plan's
 * name and the RMS error the page shows. Students may not decide.
 *
 * Readings use split resonance peaks, k = (fh^2 - fl^2) / (fh^2 + fl^2) (Keysight/Agilent Impedance
 * Measurement Handbook, mutual inductance section); solved for fh, a chosen k gives
 * fh = fl sqrt((1 + k) / (1 - k)), so a reading can be placed a known fraction off the prediction.
 */

const FL = 6.5e6;
const upperPeak = (k: number) => FL * Math.sqrt((1 + k) / (1 - k));

interface Point {
  id: number;
  seq: number;
  predicted: { coupling: number } | null;
}

async function studentApi(playwright: Parameters<Parameters<typeof test>[2]>[0]['playwright']): Promise<APIRequestContext> {
  const api = await playwright.request.newContext({ baseURL: BASE_URL });
  await apiSignIn(api, DEMO.student);
  return api;
}

async function logSplitPeaks(api: APIRequestContext, base: string, pointId: number, k: number): Promise<number> {
  const response = await api.post(`${base}/readings`, { data: { pointId, method: 'split_peaks', raw: { lowPeak: FL, highPeak: upperPeak(k) } } });
  expect(response.status(), await response.text()).toBe(201);
  return (await response.json()).reading.id;
}

async function transition(api: APIRequestContext, base: string, data: Record<string, string>) {
  return api.post(`${base}/transition`, { data });
}

/** The newest message to `address` whose subject names `planName` (other tests mail the same people). */
const mailAbout = (address: string, planName: string): Promise<InboxMessage> => waitForMessageTo(address, { about: planName, timeoutMs: 20_000 });

async function openReview(page: Page, studyId: number, planId: number): Promise<void> {
  await page.goto(`/studies/${studyId}/plans/${planId}/review`);
  await expect(page.getByRole('heading', { level: 1, name: /^Review: / })).toBeVisible();
}

/** The text of every page of a PDF, read with pdf.js (the legacy build runs in Node). */
async function pdfText(bytes: Uint8Array): Promise<string> {
  const pdfjs = await import('pdfjs-dist/legacy/build/pdf.mjs');
  const document = await pdfjs.getDocument({ data: bytes, useSystemFonts: false, isEvalSupported: false }).promise;
  const pages: string[] = [];
  for (let n = 1; n <= document.numPages; n++) {
    const content = await (await document.getPage(n)).getTextContent();
    pages.push(content.items.map((item) => ('str' in item ? item.str : '')).join(' '));
  }
  await document.destroy();
  return pages.join('\n').replace(/\s+/g, ' ');
}

test('a supervisor returns a plan with a reason, the student corrects it, and the accepted review goes into the PDF', async ({ page, playwright, browser }) => {
  test.setTimeout(180_000);
  const planName = `Review flow ${Date.now()}`;
  const { studyId, planId } = await createBenchPlan(playwright, planName, [0.06, 0.1]);
  const base = `/api/studies/${studyId}/plans/${planId}`;
  const student = await studentApi(playwright);

  // the student logs one reading per point: 2 % above the prediction, and a slip 30 % above
  const { version } = (await (await student.get(`${base}/cautions`)).json()).acknowledgement;
  expect((await student.post(`${base}/cautions`, { data: { version, acknowledged: true } })).ok()).toBe(true);
  const { points } = (await (await student.get(`${base}/points`)).json()) as { points: Point[] };
  const [near, far] = [...points].sort((a, b) => a.seq - b.seq);
  await logSplitPeaks(student, base, near.id, near.predicted!.coupling * 1.02);
  const slipped = await logSplitPeaks(student, base, far.id, far.predicted!.coupling * 1.3);
  expect((await transition(student, base, { to: 'in_review' })).ok()).toBe(true);

  // the supervisor reads the agreement
  await signIn(page, DEMO.supervisor);
  await openReview(page, studyId, planId);
  await expect(page.getByText('in review', { exact: true })).toBeVisible();
  const parity = page.getByRole('region', { name: 'Parity plot of k' });
  await expect(parity.getByRole('img', { name: /^Parity plot of Coupling coefficient/ })).toBeVisible();
  await expect(parity.locator('canvas').first()).toBeVisible();
  await expect(parity).toContainText('2 readings with a prediction.');
  await expect(page.getByRole('region', { name: 'Agreement' })).toContainText('Compared poses');

  // a comment on the slipped point, chosen from its row
  await page.getByRole('row', { name: `Points #${far.seq}` }).getByRole('button', { name: 'Comment' }).click();
  const commentForm = page.getByRole('form', { name: 'Write a comment' });
  await expect(commentForm.getByLabel('About')).toHaveValue(String(far.id));
  await commentForm.getByLabel('Comment', { exact: true }).fill('fh looks like it was read off the wrong peak.');
  await commentForm.getByRole('button', { name: 'Post comment' }).click();
  const comments = page.getByRole('list', { name: 'Comments, oldest first' });
  await expect(comments).toContainText('fh looks like it was read off the wrong peak.');
  await expect(comments).toContainText(`on point ${far.seq}`);
  await expect(comments).toContainText(DEMO.supervisor.name);

  // returned with a reason
  const reason = `Point ${far.seq} is 30 % off: check the upper peak and log it again.`;
  await page.getByRole('button', { name: 'Return to the bench' }).click();
  const returnForm = page.getByRole('form', { name: 'Return to the bench' });
  await returnForm.getByRole('button', { name: 'Return to the bench' }).click();
  await expect(returnForm.getByText('Say what the student should change before the plan comes back.')).toBeVisible();
  await returnForm.getByLabel('What needs another look').fill(reason);
  await returnForm.getByRole('button', { name: 'Return to the bench' }).click();
  const history = page.getByRole('list', { name: 'Decisions, newest first' });
  await expect(history.locator('[data-decision="returned"]')).toContainText(DEMO.supervisor.name);
  await expect(history).toContainText(reason);
  await expect(page.getByText('on the bench', { exact: true })).toBeVisible();

  // the student hears of it, with a link to the review
  const mail = await mailAbout(DEMO.student.email, planName);
  expect(mail.subject).toContain('returned');
  expect(mail.text).toContain(`/studies/${studyId}/plans/${planId}/review`);
  expect(mail.text).toContain(reason);

  // the student sees why, corrects the reading and sends the plan again
  const studentContext = await browser.newContext();
  const studentPage = await studentContext.newPage();
  await signIn(studentPage, DEMO.student);
  await openReview(studentPage, studyId, planId);
  const note = studentPage.getByRole('note', { name: 'Why the plan came back' });
  await expect(note).toContainText(`Returned to the bench by ${DEMO.supervisor.name}`);
  await expect(note).toContainText(reason);
  // at the bench, the supervisor's comment sits with the point it is about
  await note.getByRole('link', { name: 'Open the logbook' }).click();
  await studentPage.getByRole('list', { name: 'Points in measurement order' }).getByRole('button', { name: new RegExp(`^#${far.seq}\\b`) }).click();
  await expect(studentPage.getByRole('region', { name: 'Comments on this point' })).toContainText('fh looks like it was read off the wrong peak.');
  const corrected = await student.post(`${base}/readings/${slipped}/corrections`, {
    data: { method: 'split_peaks', raw: { lowPeak: FL, highPeak: upperPeak(far.predicted!.coupling * 1.01) }, reason: 'Read the upper peak again' },
  });
  expect(corrected.status(), await corrected.text()).toBe(201);
  expect((await transition(student, base, { to: 'in_review' })).ok()).toBe(true);

  // a student may not decide: no button, and the API says 403
  await openReview(studentPage, studyId, planId);
  await expect(studentPage.getByText('in review', { exact: true })).toBeVisible();
  await expect(studentPage.getByRole('button', { name: 'Accept' })).toHaveCount(0);
  expect((await transition(student, base, { to: 'accepted' })).status()).toBe(403);
  await studentContext.close();
  await student.dispose();

  // the supervisor accepts
  await openReview(page, studyId, planId);
  await page.getByRole('button', { name: 'Accept', exact: true }).click();
  await page.getByRole('button', { name: 'Yes, accept' }).click();
  await expect(history.locator('[data-decision="accepted"]')).toContainText(DEMO.supervisor.name);
  await expect(page.getByText('accepted', { exact: true })).toBeVisible();
  await expect(page.getByRole('button', { name: 'Accept', exact: true })).toHaveCount(0);

  // the PDF names the plan and the RMS error as the page shows it
  const rms = (await page.getByTestId('figure-rms').locator('dd').first().textContent())?.trim() ?? '';
  expect(rms).toMatch(/^\d+\.\d\d %$/);
  const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'PDF report' }).click()]);
  const bytes = new Uint8Array(await readFile((await download.path())!));
  expect(Buffer.from(bytes.subarray(0, 5)).toString('latin1')).toBe('%PDF-');
  const text = await pdfText(bytes);
  expect(text).toContain(planName);
  expect(text).toContain(rms);
});
