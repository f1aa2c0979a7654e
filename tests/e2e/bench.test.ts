import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, PHONE, screenshot, WIDE, type BrowserSession } from './browser';

const RESEARCHER = 'researcher@demo.flakeline.test';
const DEMO_PASSWORD = 'flakeline-demo';
/** Sign in, three runs, an offline spell and a sync; each page answers in well under a second. */
const JOURNEY_TIMEOUT_MS = 180_000;
const OUTBOX_STORAGE_KEY = 'flakeline.step-outbox';

interface PageAnswer {
  status: number;
  replayed: string | null;
  body: unknown;
}

/** A request from inside the page, with its session cookie and CSRF token, as the app makes it. */
async function pageFetch(page: Page, method: string, route: string, body?: unknown, headers: Record<string, string> = {}) {
  return page.evaluate(
    async ({ method: verb, route: path, body: data, headers: extra }): Promise<PageAnswer> => {
      const csrf = (await (await fetch('/api/auth/csrf', { credentials: 'same-origin' })).json()) as { csrfToken: string };
      const response = await fetch(path, {
        method: verb,
        credentials: 'same-origin',
        headers: { Accept: 'application/json', 'Content-Type': 'application/json', 'x-csrf-token': csrf.csrfToken, ...extra },
        body: data === undefined ? undefined : JSON.stringify(data),
      });
      return { status: response.status, replayed: response.headers.get('Idempotent-Replayed'), body: await response.json() };
    },
    { method, route, body, headers },
  );
}

async function myExfoliationsFrom(page: Page, crystal: string): Promise<number[]> {
  const answer = await pageFetch(page, 'GET', '/api/steps?mine=true&type=exfoliation&limit=50');
  expect(answer.status).toBe(200);
  const { steps } = answer.body as { steps: { id: number; inputs: { code: string }[] }[] };
  return steps.filter((step) => step.inputs.some((input) => input.code === crystal)).map((step) => step.id);
}

async function pickCrystal(page: Page, code: string) {
  await page.getByTestId('exf-crystal-search').fill(code);
  await page.getByTestId(`exf-crystal-result-${code}`).click();
  await page.getByTestId('exf-crystal').filter({ hasText: code }).waitFor();
}

describe('the bench at phone size', () => {
  let browser: BrowserSession;
  afterEach(() => browser.close());

  it(
    'logs an exfoliation making four chips, keeps a run made offline and syncs it exactly once',
    async () => {
      browser = await openBrowser(PHONE);
      const { page, context } = browser;
      page.setDefaultTimeout(15_000);

      // Signing in lands on the bench.
      await page.goto(`${baseUrl()}/`);
      await page.getByTestId('sign-in-screen').waitFor();
      await page.getByLabel('E-mail', { exact: true }).fill(RESEARCHER);
      await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
      await page.getByTestId('sign-in-submit').click();
      await page.getByTestId('bench-screen').waitFor();
      expect(new URL(page.url()).pathname).toBe('/bench');

      const registered = await pageFetch(page, 'POST', '/api/samples', {
        kind: 'crystal',
        material: 'WSe2',
        name: `E2E bench boule ${Date.now().toString(36)}`,
      });
      expect(registered.status).toBe(201);
      const crystal = (registered.body as { sample: { code: string } }).sample.code;

      // First run: everything chosen by hand.
      await page.getByTestId('bench-log-exfoliation').click();
      await page.getByTestId('quick-exfoliation-screen').waitFor();
      await pickCrystal(page, crystal);
      await page.getByTestId('exf-method-adhesive_tape').click();
      await page.getByTestId('exf-tape').fill('Low-tack blue tape');
      await page.getByTestId('exf-peels-plus').click();
      await page.getByTestId('exf-substrate-si_sio2').click();
      await page.getByTestId('exf-oxide-285').click();
      await expect(page.getByTestId('exf-chips-value').inputValue()).resolves.toBe('4');
      await screenshot(page, 'bench-phone-exfoliation-form');
      await page.getByTestId('exf-submit').click();
      await page.getByTestId('run-logged').waitFor();
      await expect(page.locator('[data-testid^="run-output-"]').count()).resolves.toBe(4);
      await page.getByTestId('run-print-labels').waitFor();
      await screenshot(page, 'bench-phone-exfoliation-logged');
      expect(await myExfoliationsFrom(page, crystal)).toHaveLength(1);

      // Second run with the network gone: kept on the device, waiting to sync.
      await page.getByTestId('run-another').click();
      await pickCrystal(page, crystal);
      await context.setOffline(true);
      await page.getByTestId('exf-submit').click();
      await page.getByTestId('run-queued').waitFor();
      await page.getByTestId('nav-bench').first().click();
      await page.getByTestId('outbox-item-waiting').waitFor();
      await screenshot(page, 'bench-phone-waiting-to-sync');
      const stored = await page.evaluate((key) => window.localStorage.getItem(key), OUTBOX_STORAGE_KEY);
      const [queued] = JSON.parse(stored ?? '[]') as { key: string; body: unknown }[];
      expect(queued?.key).toMatch(/^[A-Za-z0-9_-]{8,100}$/);

      // Back online: the browser's "online" event sends it, once.
      await context.setOffline(false);
      await page.getByTestId('outbox-synced').waitFor();
      await expect(page.getByTestId('outbox-item-waiting').count()).resolves.toBe(0);
      const afterSync = await myExfoliationsFrom(page, crystal);
      expect(afterSync).toHaveLength(2);

      // The same submission sent again (a retry, a double tap) returns the first run, creates nothing.
      const replay = await pageFetch(page, 'POST', '/api/steps', queued?.body, { 'Idempotency-Key': queued?.key ?? '' });
      expect(replay.status).toBe(201);
      expect(replay.replayed).toBe('true');
      expect((replay.body as { step: { id: number } }).step.id).toBe(Math.max(...afterSync));
      expect(await myExfoliationsFrom(page, crystal)).toHaveLength(2);
      await screenshot(page, 'bench-phone-synced');

      // "Repeat my last run": taps and typed fields from the bench to a logged run.
      let taps = 0;
      await page.getByTestId('bench-log-exfoliation').click();
      taps += 1;
      await page.getByTestId('exf-repeat-last').click();
      taps += 1;
      await page.getByTestId('exf-crystal').filter({ hasText: crystal }).waitFor();
      await page.getByTestId('exf-submit').click();
      taps += 1;
      await page.getByTestId('run-logged').waitFor();
      await expect(page.locator('[data-testid^="run-output-"]').count()).resolves.toBe(4);
      expect({ taps, typedFields: 0 }).toEqual({ taps: 3, typedFields: 0 });
      expect(await myExfoliationsFrom(page, crystal)).toHaveLength(3);

      await page.getByTestId('nav-bench').first().click();
      await page.getByTestId('bench-recent').waitFor();
      await screenshot(page, 'bench-phone-home');
      await page.setViewportSize(WIDE);
      await screenshot(page, 'bench-wide-home');
      await page.getByTestId('bench-log-growth').click();
      await page.getByTestId('growth-caution').waitFor();
      await screenshot(page, 'bench-wide-growth');
      await page.setViewportSize(PHONE);
      await screenshot(page, 'bench-phone-growth');
    },
    JOURNEY_TIMEOUT_MS,
  );
});
