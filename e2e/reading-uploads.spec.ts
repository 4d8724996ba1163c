import { expect, test, type Page } from '@playwright/test';
import zlib from 'node:zlib';
import { apiSignIn, DEMO, signIn } from './support/accounts';
import { BASE_URL, createBenchPlan } from './support/bench-plan';

/**
 * Uploads at the bench against the built app: a CSV of readings is imported all-or-nothing after a
 * row-level check, and a setup photo is stored in the S3 stand-in, visible to the study's supervisor
 * through a signed link and a 404 to anyone outside the study.
 */

async function acknowledgeAndOpen(page: Page, studyId: number, planId: number): Promise<void> {
  await page.goto(`/studies/${studyId}/plans/${planId}/logbook`);
  const cautions = page.getByRole('region', { name: 'Before the first reading on this plan' });
  await cautions.getByRole('checkbox').check();
  await cautions.getByRole('button', { name: 'Acknowledge and start logging' }).click();
  await expect(page.getByRole('form', { name: 'Log a reading' })).toBeVisible();
}

/** A filled-in run sheet: seq, repeat, drive current and open-circuit voltage per point. */
function runSheet(rows: [number, number, string, string][]): string {
  return ['seq,repeat,frequency_Hz,I1_mA,V2_V', ...rows.map(([seq, repeat, i1, v2]) => `${seq},${repeat},6780000,${i1},${v2}`)].join('\n');
}

test('a CSV with one bad row imports nothing and reports the row; fixed, every row imports', async ({ page, playwright }) => {
  const { studyId, planId } = await createBenchPlan(playwright, `CSV import ${Date.now()}`, [0.05, 0.08, 0.11]);
  await signIn(page, DEMO.student);
  await acknowledgeAndOpen(page, studyId, planId);
  const panel = page.getByRole('region', { name: 'Import readings from a CSV file' });

  // line 3 (seq 2) has a voltage in kilograms
  const bad = runSheet([[1, 1, '250', '1.10'], [2, 1, '250', '0.8 kg'], [3, 1, '250', '0.55']]);
  await panel.getByLabel('CSV file').setInputFiles({ name: 'bench-day-1.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
  await panel.getByLabel('Method', { exact: true }).selectOption('open_circuit');
  // the run sheet's frequency column holds the planned value, so the student maps it by hand
  await panel.getByLabel('Column of Frequency f').selectOption('frequency_Hz');
  await expect(panel.getByLabel('Column of I1, transmitter current')).toHaveValue('I1_mA');
  await expect(panel.getByLabel('Unit of I1, transmitter current')).toHaveValue('mA');
  await panel.getByRole('button', { name: 'Check the file' }).click();
  const problems = panel.getByRole('table', { name: 'Problems to fix before the import' });
  await expect(problems).toContainText('0.8 kg');
  await expect(problems.getByRole('row').nth(1)).toContainText('3');
  await expect(panel.getByRole('button', { name: /^Import/ })).toBeDisabled();

  // the server refuses the same file as a whole, even when asked directly
  const api = await playwright.request.newContext({ baseURL: BASE_URL });
  await apiSignIn(api, DEMO.student);
  const mapping = {
    seqColumn: 'seq', repeatColumn: 'repeat', method: 'open_circuit', methodColumn: null,
    fields: { frequency: { column: 'frequency_Hz', unit: 'Hz' }, txCurrent: { column: 'I1_mA', unit: 'mA' }, rxVoltage: { column: 'V2_V', unit: 'V' } },
    circumstances: { instrument: null, calibration: null, temperatureC: null, setupNotes: null, accuracy: { relative: 0.005, phaseDeg: 1 } },
  };
  const refused = await api.post(`/api/studies/${studyId}/plans/${planId}/readings/import`, { data: { csv: bad, fileName: 'bench-day-1.csv', mapping, commit: true } });
  expect(refused.status()).toBe(422);
  expect((await refused.json()).issues.map((i: { path: string }) => i.path)).toEqual([expect.stringMatching(/^rows\.3\./)]);
  expect((await (await api.get(`/api/studies/${studyId}/plans/${planId}/readings`)).json()).readings).toEqual([]);

  // fixed: all three rows import in one go
  const good = runSheet([[1, 1, '250', '1.10'], [2, 1, '250', '0.80'], [3, 1, '250', '0.55']]);
  await panel.getByLabel('CSV file').setInputFiles({ name: 'bench-day-1-fixed.csv', mimeType: 'text/csv', buffer: Buffer.from(good) });
  await panel.getByLabel('Method', { exact: true }).selectOption('open_circuit');
  await panel.getByLabel('Column of Frequency f').selectOption('frequency_Hz');
  await panel.getByRole('button', { name: 'Check the file' }).click();
  await expect(panel.getByRole('button', { name: 'Import 3 readings' })).toBeEnabled();
  await panel.getByRole('button', { name: 'Import 3 readings' }).click();
  await expect(panel.getByText('Imported 3 readings from bench-day-1-fixed.csv.')).toBeVisible();
  const { readings } = await (await api.get(`/api/studies/${studyId}/plans/${planId}/readings`)).json();
  expect(readings.map((r: { pointSeq: number; source: string }) => [r.pointSeq, r.source])).toEqual([[1, 'csv'], [2, 'csv'], [3, 'csv']]);
  // M = |V2| / (omega |I1|) (Keysight Impedance Measurement Handbook, mutual inductance)
  expect(readings[1].derived.mutualInductance.value).toBeCloseTo(0.8 / (2 * Math.PI * 6.78e6 * 0.25), 15);
  await api.dispose();
});

/** A valid 2 x 2 PNG (PNG specification, 2nd edition: signature, IHDR, IDAT, IEND), made here. */
function tinyPng(): Buffer {
  const crcTable = Array.from({ length: 256 }, (_, n) => {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    return c >>> 0;
  });
  const crc = (bytes: Buffer) => {
    let c = 0xffffffff;
    for (const b of bytes) c = crcTable[(c ^ b) & 0xff] ^ (c >>> 8);
    return (c ^ 0xffffffff) >>> 0;
  };
  const chunk = (type: string, data: Buffer) => {
    const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
    const out = Buffer.alloc(12 + data.length);
    out.writeUInt32BE(data.length, 0);
    body.copy(out, 4);
    out.writeUInt32BE(crc(body), 8 + data.length);
    return out;
  };
  const header = Buffer.alloc(13);
  header.writeUInt32BE(2, 0);
  header.writeUInt32BE(2, 4);
  header[8] = 8; // bit depth
  header[9] = 2; // truecolour
  const pixels = Buffer.from([0, 200, 120, 40, 200, 120, 40, 0, 40, 120, 200, 40, 120, 200]);
  return Buffer.concat([Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]), chunk('IHDR', header), chunk('IDAT', zlib.deflateSync(pixels)), chunk('IEND', Buffer.alloc(0))]);
}

test('a photo attached by the student opens for the supervisor and is a 404 outside the study', async ({ page, playwright, browser }) => {
  const { studyId, planId } = await createBenchPlan(playwright, `Photo ${Date.now()}`, [0.06]);
  await signIn(page, DEMO.student);
  await page.goto(`/studies/${studyId}/plans/${planId}/logbook`);
  const files = page.getByRole('region', { name: 'Photos and instrument files' });
  await files.getByLabel('Caption').fill('Probe clamp at 6 cm, ferrite tile removed');
  await files.getByLabel('File', { exact: true }).setInputFiles({ name: 'clamp.png', mimeType: 'image/png', buffer: tinyPng() });
  await files.getByRole('button', { name: 'Upload' }).click();
  const link = files.getByRole('link', { name: 'clamp.png' });
  await expect(link).toBeVisible();
  const href = await link.getAttribute('href');
  expect(href).toMatch(new RegExp(`^/api/studies/${studyId}/attachments/\\d+$`));

  // the supervisor is sent on to a short-lived signed link and gets the same bytes
  const supervisorContext = await browser.newContext();
  const supervisor = await supervisorContext.newPage();
  await signIn(supervisor, DEMO.supervisor);
  const opened = await supervisor.request.get(href!);
  expect(opened.status()).toBe(200);
  expect(opened.headers()['content-type']).toBe('image/png');
  expect(Buffer.compare(await opened.body(), tinyPng())).toBe(0);
  const redirect = await supervisor.request.get(href!, { maxRedirects: 0 });
  expect(redirect.status()).toBe(302);
  expect(redirect.headers().location).toMatch(/X-Amz-Expires=300/);
  // the thumbnail loads in the page (the content security policy lets the signed link through)
  await supervisor.goto(`/studies/${studyId}/plans/${planId}/logbook`);
  const thumbnail = supervisor.getByRole('img', { name: 'Probe clamp at 6 cm, ferrite tile removed' });
  await expect(thumbnail).toBeVisible();
  await expect.poll(() => thumbnail.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(2);
  await supervisorContext.close();

  // someone outside the study learns nothing, not even that the file exists
  const outsider = await playwright.request.newContext({ baseURL: BASE_URL });
  await apiSignIn(outsider, DEMO.otherResearcher);
  expect((await outsider.get(href!, { maxRedirects: 0 })).status()).toBe(404);
  await outsider.dispose();
});
