import { expect, test, type Page } from '@playwright/test';
import { DEMO, PAD_STUDY, signIn } from './support/accounts';
import { projectBox } from './support/bench-view';

/**
 * The 3D placement bench against the built app, in Debian's Chromium with software WebGL.
 */

/** The bench's fast pass; /api/solve at its default 1e-6 must agree with the bench to this (relative). */
const FAST_TOLERANCE = 1e-4;
/** Two circular loops, receiver tilted 90 degrees with no offset: M = 0 by symmetry (no source needed). */
const SYMMETRY_FRACTION = 1e-3;

/** The setup database/seeds/01_demo_lab.ts saves for the pad study: the spiral pad and the probe helix. */
const DEMO_SETUP = 'Probe 10 cm deep, upright';

const circuit = { frequency: 6.78e6, topology: 'SS', sourceVoltage: 5, sourceResistance: 0.5, loadResistance: 50 };

async function openBench(page: Page): Promise<number> {
  await page.getByRole('link', { name: PAD_STUDY }).click();
  await page.getByRole('navigation', { name: 'Study' }).getByRole('link', { name: 'Bench' }).click();
  await expect(page.getByRole('heading', { name: 'Placement bench', level: 1 })).toBeVisible();
  return Number(/\/studies\/(\d+)\/bench/.exec(page.url())![1]);
}

/** Two single-turn loops made through the API, named uniquely so reruns and other specs do not clash. */
async function createLoops(page: Page, studyId: number) {
  const tag = `${Date.now()}`;
  const make = async (name: string, radius: number) => {
    const response = await page.request.post(`/api/studies/${studyId}/coils`, {
      data: { name, spec: { kind: 'loop', radius, wireDiameter: 0.001 }, wireLabel: null },
    });
    expect(response.status()).toBe(201);
    return (await response.json()).coil as { id: number; name: string; spec: Record<string, unknown> };
  };
  return { tx: await make(`Bench loop A ${tag}`, 0.05), rx: await make(`Bench loop B ${tag}`, 0.02) };
}

const status = (page: Page) => page.getByTestId('readout-status');

async function refinedK(page: Page): Promise<number> {
  await expect(status(page)).toHaveAttribute('data-state', 'refined', { timeout: 20_000 });
  return Number(await page.getByTestId('readout-k').getAttribute('data-value'));
}

async function place(page: Page, distanceCm: string, offsetCm: string, tiltDeg: string) {
  await page.getByLabel('Distance (cm)', { exact: true }).fill(distanceCm);
  await page.getByLabel('Lateral offset (cm)', { exact: true }).fill(offsetCm);
  await page.getByLabel('Tilt (degrees)', { exact: true }).fill(tiltDeg);
}

test.describe('the placement bench', () => {
  test('a researcher places the receiver with the inputs and k follows, matching /api/solve; at 90 degrees it vanishes', async ({ page }) => {
    await signIn(page, DEMO.researcher);
    const studyId = await openBench(page);
    const { tx, rx } = await createLoops(page, studyId);
    await page.reload();
    await page.getByLabel('Transmitter coil', { exact: true }).selectOption({ label: `${tx.name} (loop)` });
    await page.getByLabel('Receiver coil', { exact: true }).selectOption({ label: `${rx.name} (loop)` });

    await place(page, '6', '0', '0');
    const aligned = await refinedK(page);
    expect(aligned).toBeGreaterThan(0);

    await place(page, '9', '1.5', '20');
    const moved = await refinedK(page);
    expect(moved).not.toBe(aligned);
    const api = await page.request.post('/api/solve', {
      data: { transmitter: tx.spec, receiver: rx.spec, placement: { distance: 0.09, lateralOffset: 0.015, tiltDeg: 20 }, circuit },
    });
    expect(api.ok()).toBe(true);
    const apiK = (await api.json()).coupling as number;
    expect(Math.abs(moved - apiK)).toBeLessThan(FAST_TOLERANCE * Math.abs(apiK));

    await place(page, '6', '0', '90');
    const perpendicular = await refinedK(page);
    expect(Math.abs(perpendicular)).toBeLessThan(SYMMETRY_FRACTION * Math.abs(aligned));

    // the tilt chart (computed after let-go) marks the current tilt
    await expect(page.getByTestId('tilt-chart')).toBeVisible({ timeout: 20_000 });
    await expect(page.getByTestId('tilt-chart-marker')).toBeVisible();
    await expect(page.getByText(/now: 90°/)).toBeVisible();
  });

  test('a researcher saves the placement as a setup and gets it back after a reload', async ({ page }) => {
    await signIn(page, DEMO.researcher);
    await openBench(page);
    await expect(page.getByRole('list', { name: 'Saved setups' })).toContainText('Probe 10 cm deep, upright');

    await place(page, '7.5', '1.2', '25');
    await page.getByLabel('Load resistance').fill('20 ohm');
    await page.getByLabel('Load resistance').press('Enter');
    await page.getByLabel('Operator x (cm)').fill('35');
    await page.getByLabel('Operator x (cm)').press('Enter');
    const k = await refinedK(page);
    const canvas = page.getByTestId('bench-scene').locator('canvas');
    const view = await canvas.getAttribute('data-view');
    expect(view).toBeTruthy();

    const name = `Bench e2e ${Date.now()}`;
    const form = page.getByRole('form', { name: 'Save setup' });
    await form.getByLabel('Setup name').fill(name);
    await form.getByRole('button', { name: 'Save as new setup' }).click();
    await expect(form.getByRole('status')).toHaveText(`Saved as “${name}”.`);
    await expect(page).toHaveURL(/\?setup=\d+$/);
    await expect(page.getByRole('list', { name: 'Saved setups' })).toContainText(name);

    await page.reload();
    await expect(page.getByLabel('Distance (cm)', { exact: true })).toHaveValue('7.5');
    await expect(page.getByLabel('Lateral offset (cm)', { exact: true })).toHaveValue('1.2');
    await expect(page.getByLabel('Tilt (degrees)', { exact: true })).toHaveValue('25');
    await expect(page.getByLabel('Load resistance')).toHaveValue('20 Ω');
    await expect(page.getByLabel('Operator x (cm)')).toHaveValue('35');
    expect(await refinedK(page)).toBe(k);
    await expect(canvas).toHaveAttribute('data-view', view!);

    // changing the open setup saves over it (PATCH) and keeps the URL
    const url = page.url();
    await page.getByLabel('Tilt (degrees)', { exact: true }).fill('35');
    await expect(page.getByRole('list', { name: 'Saved setups' })).toContainText('open, changed');
    await form.getByRole('button', { name: 'Save changes' }).click();
    await expect(form.getByRole('status')).toHaveText(`Saved “${name}”.`);
    await expect(page.getByLabel('Tilt (degrees)', { exact: true })).toHaveValue('35');
    expect(page.url()).toBe(url);
    await page.reload();
    await expect(page.getByLabel('Tilt (degrees)', { exact: true })).toHaveValue('35');
    await expect(page.getByLabel('Distance (cm)', { exact: true })).toHaveValue('7.5');

    // saving a changed open setup as a new one opens the new one as it is on screen
    await page.getByLabel('Tilt (degrees)', { exact: true }).fill('50');
    await form.getByLabel('Setup name').fill(`${name} b`);
    await form.getByRole('button', { name: 'Save as new setup' }).click();
    await expect(form.getByRole('status')).toHaveText(`Saved as “${name} b”.`);
    await expect(page).not.toHaveURL(url);
    await expect(page).toHaveURL(/\?setup=\d+$/);
    await expect(page.getByRole('list', { name: 'Saved setups' }).getByRole('listitem').filter({ hasText: `${name} b` })).toContainText('open');
    await expect(page.getByLabel('Tilt (degrees)', { exact: true })).toHaveValue('50');
  });

  test('the canvas draws both coils of the demo setup (software WebGL)', async ({ page }, testInfo) => {
    await signIn(page, DEMO.researcher);
    const studyId = await openBench(page);
    const { setups } = await (await page.request.get(`/api/studies/${studyId}/setups`)).json();
    const demo = setups.find((s: { name: string }) => s.name === DEMO_SETUP);
    await page.getByRole('link', { name: `Open ${DEMO_SETUP}` }).click();
    await expect(page).toHaveURL(new RegExp(`\\?setup=${demo.id}$`));
    const canvas = page.getByTestId('bench-scene').locator('canvas');
    await expect(canvas).toHaveAttribute('data-frames', /^[1-9]/, { timeout: 30_000 });
    await refinedK(page);
    await page.getByTestId('bench-scene').screenshot({ path: testInfo.outputPath('bench-scene.png') });
    await page.screenshot({ path: testInfo.outputPath('bench-page.png'), fullPage: true });

    // The canvas keeps its drawing buffer (preserveDrawingBuffer): read its pixels. The receiver (probe
    // helix: radius 12 mm, length 30 mm, centred 10 cm above the pad) must show as copper inside its
    // projected box, and the pad (outer radius 14 cm) as copper outside it.
    const view = JSON.parse((await canvas.getAttribute('data-view'))!);
    const size = await canvas.evaluate((el) => ({ width: el.clientWidth, height: el.clientHeight }));
    const box = projectBox(view, [-0.012, -0.012, 0.085], [0.012, 0.012, 0.115], size.width, size.height);
    const counts = await canvas.evaluate((element, rect) => {
      const c = element as HTMLCanvasElement;
      const scale = c.width / c.clientWidth;
      const copy = document.createElement('canvas');
      copy.width = c.width;
      copy.height = c.height;
      const ctx = copy.getContext('2d')!;
      ctx.drawImage(c, 0, 0);
      const data = ctx.getImageData(0, 0, c.width, c.height).data;
      let inside = 0;
      let insideCopper = 0;
      let outsideCopper = 0;
      let background = 0;
      for (let y = 0; y < c.height; y++) {
        for (let x = 0; x < c.width; x++) {
          const i = (y * c.width + x) * 4;
          const [r, g, b] = [data[i], data[i + 1], data[i + 2]];
          const copper = r > 90 && r > g && g > b && r - b > 50;
          const inBox = x / scale >= rect.left && x / scale <= rect.right && y / scale >= rect.top && y / scale <= rect.bottom;
          if (inBox) {
            inside++;
            if (copper) insideCopper++;
          } else if (copper) outsideCopper++;
          if (Math.abs(r - 16) < 6 && Math.abs(g - 21) < 6 && Math.abs(b - 30) < 6) background++;
        }
      }
      return { inside, insideCopper, outsideCopper, background, total: data.length / 4 };
    }, box);
    testInfo.annotations.push({ type: 'pixels', description: JSON.stringify({ box, ...counts }) });
    expect(counts.inside).toBeGreaterThan(100);
    expect(counts.background).toBeGreaterThan(counts.total * 0.2);
    expect(counts.insideCopper).toBeGreaterThan(counts.inside * 0.25);
    expect(counts.outsideCopper).toBeGreaterThan(counts.total * 0.02);
  });

  test('a student can move the receiver and read the link but not save', async ({ page }) => {
    await signIn(page, DEMO.student);
    await openBench(page);
    await place(page, '12', '0', '30');
    await refinedK(page);
    await expect(page.getByText('your role on this study does not save setups')).toBeVisible();
    await expect(page.getByRole('button', { name: 'Save as new setup' })).toHaveCount(0);
  });

  test('without WebGL the bench is a numeric form with the readout and the tilt chart', async ({ page }) => {
    await page.addInitScript(() => {
      const original = HTMLCanvasElement.prototype.getContext;
      HTMLCanvasElement.prototype.getContext = function getContext(this: HTMLCanvasElement, type: string, ...rest: unknown[]) {
        if (type === 'webgl2' || type === 'webgl' || type === 'experimental-webgl') return null;
        return (original as (...a: unknown[]) => unknown).call(this, type, ...rest);
      } as typeof original;
    });
    await signIn(page, DEMO.researcher);
    await openBench(page);
    await expect(page.getByText('3D view unavailable')).toBeVisible();
    await expect(page.getByTestId('bench-scene')).toHaveCount(0);
    await place(page, '8', '0', '10');
    expect(await refinedK(page)).toBeGreaterThan(0);
    await expect(page.getByTestId('tilt-chart')).toBeVisible({ timeout: 20_000 });
  });

  test('someone not on the study gets not-found for its bench', async ({ page }) => {
    await signIn(page, DEMO.researcher);
    const studyId = await openBench(page);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await expect(page).toHaveURL(/\/signin/);
    await signIn(page, DEMO.otherResearcher);
    const response = await page.goto(`/studies/${studyId}/bench`);
    expect(response?.status()).toBe(404);
  });
});
