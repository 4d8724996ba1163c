import { expect, test, type Browser, type BrowserContextOptions } from '@playwright/test';
import { DEMO, PAD_STUDY, signIn } from './support/accounts';

/**
 * What the browser downloads to show a page: the dashboard stays light (no 3D engine, no charting
 * library, no unit parser, and a budget on its JavaScript), while the pages that need those libraries
 * do load them, which shows the markers below would find them if they crept into the dashboard.
 */

/** Signatures the minified libraries keep: three.js's renderer class, ECharts' canvas layer, math.js's dispatcher. */
const MARKERS = {
  three: /WebGLRenderer/,
  echarts: /zrender|echarts/,
  mathjs: /typed-function|mathjs/,
} as const;
type Library = keyof typeof MARKERS;
/**
 * The dashboard's JavaScript, uncompressed [kB]: 533 kB measured after the form and unit parser were
 * split off (React, Next.js and the page's own code); room for growth, far under the 910 kB of before.
 */
const DASHBOARD_BUDGET_KB = 640;
const REVIEW_PLAN = 'Probe tilt at 10 cm';

interface PageScripts {
  kilobytes: number;
  libraries: Set<Library>;
}

/** Loads `path` in a fresh context (nothing cached) with the given session and reads every script it fetched. */
async function scriptsOf(browser: Browser, storageState: BrowserContextOptions['storageState'], path: string, ready: RegExp): Promise<PageScripts> {
  const context = await browser.newContext({ storageState });
  const page = await context.newPage();
  const bodies: Promise<Buffer>[] = [];
  page.on('response', (response) => {
    if (response.request().resourceType() === 'script') bodies.push(response.body());
  });
  await page.goto(path);
  await expect(page.getByRole('heading', { level: 1, name: ready })).toBeVisible();
  await page.waitForLoadState('networkidle');
  const scripts = await Promise.all(bodies);
  await context.close();
  const libraries = new Set<Library>();
  for (const script of scripts) {
    const text = script.toString('utf8');
    for (const [name, marker] of Object.entries(MARKERS) as [Library, RegExp][]) if (marker.test(text)) libraries.add(name);
  }
  return { kilobytes: scripts.reduce((n, s) => n + s.length, 0) / 1024, libraries };
}

test('the dashboard loads no 3D engine, charts or unit parser and stays within its script budget; the pages that need them load them', async ({ browser }) => {
  test.setTimeout(120_000);
  const context = await browser.newContext();
  const signInPage = await context.newPage();
  await signIn(signInPage, DEMO.researcher);
  const { studies } = await (await signInPage.request.get('/api/studies')).json();
  const studyId: number = studies.find((s: { name: string }) => s.name === PAD_STUDY).id;
  const { plans } = await (await signInPage.request.get(`/api/studies/${studyId}/plans`)).json();
  const reviewPlanId: number = plans.find((p: { name: string }) => p.name === REVIEW_PLAN).id;
  const session = await context.storageState();
  await context.close();

  const dashboard = await scriptsOf(browser, session, '/dashboard', /My studies/);
  console.log(`[script weight] /dashboard: ${dashboard.kilobytes.toFixed(1)} kB of JavaScript`);
  expect([...dashboard.libraries]).toEqual([]);
  expect(dashboard.kilobytes).toBeLessThan(DASHBOARD_BUDGET_KB);

  const bench = await scriptsOf(browser, session, `/studies/${studyId}/bench`, /Placement bench/);
  expect(bench.libraries).toContain('three');
  const review = await scriptsOf(browser, session, `/studies/${studyId}/plans/${reviewPlanId}/review`, /./);
  expect(review.libraries).toContain('echarts');
  const newCoil = await scriptsOf(browser, session, `/studies/${studyId}/coils`, /./);
  expect(newCoil.libraries).toContain('mathjs');
});
