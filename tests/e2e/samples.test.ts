import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, PHONE, screenshot, WIDE, type BrowserSession } from './browser';

const RESEARCHER = 'researcher@demo.flakeline.test';
const DEMO_PASSWORD = 'flakeline-demo';
/** The phone journey logs three records and two steps; each page answers in well under a second. */
const JOURNEY_TIMEOUT_MS = 120_000;

async function signInTo(page: Page, path: string) {
  await page.goto(`${baseUrl()}${path}`);
  await page.getByTestId('sign-in-screen').waitFor();
  await page.getByLabel('E-mail', { exact: true }).fill(RESEARCHER);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('samples-screen').waitFor();
}

async function textOf(page: Page, testId: string): Promise<string> {
  return ((await page.getByTestId(testId).first().textContent()) ?? '').trim();
}

/** Registers a source crystal through the form and returns its code, read off the detail view. */
async function registerCrystal(page: Page, material: string, name: string): Promise<string> {
  await page.getByTestId('new-sample').click();
  await page.getByTestId('new-sample-screen').waitFor();
  await page.getByTestId('sample-kind-crystal').click();
  await page.getByTestId(`sample-material-quick-${material}`).click();
  await page.getByTestId('sample-name').fill(name);
  await page.getByTestId('sample-property-supplier').fill('Example Crystals');
  await page.getByTestId('sample-save').click();
  await page.getByTestId('sample-detail').waitFor();
  const code = await textOf(page, 'sample-code');
  expect(code).toMatch(/^CR-/);
  return code;
}

/** From a sample's detail: log a step of `type` from it that makes `count` samples of `kind`; returns their codes. */
async function logStepFromDetail(
  page: Page,
  options: { type: string; choices: string[]; fills: Record<string, string>; kind: string; count: number; caution: boolean },
): Promise<string[]> {
  const inputCode = await textOf(page, 'sample-code');
  await page.getByTestId('sample-log-step').click();
  await page.getByTestId('log-step-screen').waitFor();
  await page.getByTestId(`step-input-${inputCode}`).waitFor();
  await page.getByTestId(`step-type-${options.type}`).click();
  await page.getByTestId(`step-parameters-${options.type}`).waitFor();
  await expect(page.getByTestId('step-caution').count()).resolves.toBe(options.caution ? 1 : 0);
  for (const choice of options.choices) await page.getByTestId(choice).click();
  for (const [testId, value] of Object.entries(options.fills)) await page.getByTestId(testId).fill(value);
  await page.getByTestId(`step-output-0-kind-${options.kind}`).click();
  await page.getByTestId('step-output-0-count').fill(String(options.count));
  await page.getByTestId('step-submit').click();
  await page.getByTestId('step-logged').waitFor();
  const chips = page.locator('[data-testid="step-outputs"] [data-testid^="sample-chip-"]');
  await expect(chips.count()).resolves.toBe(options.count);
  const ids = await chips.evaluateAll((links) => links.map((link) => link.getAttribute('data-testid') ?? ''));
  return ids.map((id) => id.replace(/^sample-chip-/, ''));
}

describe('samples, steps and lineage', () => {
  let browser: BrowserSession;
  afterEach(() => browser.close());

  it(
    'at phone size a researcher registers a crystal, exfoliates it onto chips, transfers a flake and reads its ancestry',
    async () => {
      browser = await openBrowser(PHONE);
      const { page } = browser;
      page.setDefaultTimeout(15_000);
      await signInTo(page, '/samples');

      const crystal = await registerCrystal(page, 'MoS2', 'E2E MoS2 boule');
      await screenshot(page, 'samples-phone-crystal');

      const chips = await logStepFromDetail(page, {
        type: 'exfoliation',
        choices: ['step-param-method-adhesive_tape', 'step-param-substrate-si_sio2'],
        fills: { 'step-param-peelCycles': '6', 'step-param-oxideThicknessNm': '285' },
        kind: 'chip',
        count: 3,
        caution: false,
      });
      expect(chips.every((code) => code.startsWith('CH-'))).toBe(true);
      await screenshot(page, 'samples-phone-step-result');

      await page.getByTestId(`sample-chip-${chips[0]}`).click();
      await page.getByTestId('sample-detail').waitFor();
      await expect(textOf(page, 'sample-code')).resolves.toBe(chips[0]);

      const [flake] = await logStepFromDetail(page, {
        type: 'transfer',
        choices: ['step-param-method-dry'],
        fills: { 'step-param-stampPolymer': 'PC on PDMS' },
        kind: 'flake',
        count: 1,
        caution: true,
      });
      expect(flake).toMatch(/^FK-/);

      await page.getByTestId(`sample-chip-${flake}`).click();
      await page.getByTestId('sample-detail').waitFor();
      await expect(textOf(page, 'sample-code')).resolves.toBe(flake);
      await expect(textOf(page, 'sample-made-by')).resolves.toContain('Transfer');
      await page.getByTestId('ancestry-generation-2').waitFor();
      await expect(textOf(page, 'ancestry-generation-1')).resolves.toContain(chips[0]);
      await expect(textOf(page, 'ancestry-generation-2')).resolves.toContain(crystal);
      // The history loads on its own, after the record.
      await page.locator('[data-testid^="history-event-"]').first().waitFor();
      await expect(textOf(page, 'history')).resolves.toContain('Made by transfer');
      await screenshot(page, 'samples-phone-flake');
      // The phone screen scrolls inside the app, so full-page shots show one screenful: scroll to each part.
      await page.getByTestId('ancestry').scrollIntoViewIfNeeded();
      await screenshot(page, 'samples-phone-flake-ancestry');
      await page.getByTestId('history').scrollIntoViewIfNeeded();
      await screenshot(page, 'samples-phone-flake-history');

      await page.getByTestId('nav-samples').first().click();
      await page.getByTestId(`sample-row-${flake}`).waitFor();
      await screenshot(page, 'samples-phone-list');

      expect(browser.offLoopbackRequests).toEqual([]);
    },
    JOURNEY_TIMEOUT_MS,
  );

  it(
    'at wide size the list and the selected sample sit side by side, and the table sorts by its headers',
    async () => {
      browser = await openBrowser(WIDE);
      const { page } = browser;
      page.setDefaultTimeout(15_000);
      await signInTo(page, '/samples');

      const code = await registerCrystal(page, 'WSe2', 'E2E WSe2 boule');
      const row = page.getByTestId(`sample-row-${code}`);
      await row.waitFor();
      const list = await page.getByTestId('sample-list-pane').boundingBox();
      const detail = await page.getByTestId('sample-detail').boundingBox();
      expect(list).not.toBeNull();
      expect(detail).not.toBeNull();
      if (list && detail) {
        expect(detail.x).toBeGreaterThanOrEqual(list.x + list.width);
        expect(detail.y).toBeLessThan(WIDE.height);
        expect(detail.x + detail.width).toBeLessThanOrEqual(WIDE.width);
      }
      await expect(row.isVisible()).resolves.toBe(true);
      await expect(page.getByTestId('sample-detail').isVisible()).resolves.toBe(true);

      await page.getByTestId('sample-sort-code').click();
      await page.waitForURL(/sort=code/);
      await page.getByTestId('filter-kind-crystal').click();
      await page.waitForURL(/kind=crystal/);
      // However many samples earlier runs left, the search finds this one.
      await page.getByTestId('sample-search').fill(code);
      await page.waitForURL(/q=CR-/);
      await page.getByTestId(`sample-row-${code}`).click();
      await page.waitForURL((url) => url.searchParams.get('code') === code);
      await expect(textOf(page, 'sample-code')).resolves.toBe(code);
      await screenshot(page, 'samples-wide-list-detail');

      expect(browser.offLoopbackRequests).toEqual([]);
    },
    JOURNEY_TIMEOUT_MS,
  );
});
