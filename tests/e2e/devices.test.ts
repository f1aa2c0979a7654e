import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, PHONE, screenshot, WIDE, type BrowserSession } from './browser';

const RESEARCHER = 'researcher@demo.flakeline.test';
const REVIEWER = 'reviewer@demo.flakeline.test';
const MANAGER = 'manager@demo.flakeline.test';
const DEMO_PASSWORD = 'flakeline-demo';
/** The demo lab's lens device (seeds/demo-samples.ts). */
const DEMO_DEVICE_NAME = 'Zone-plate lens ZP-1';
/** Three people, a design, two downloads and a share link; audits re-hash every file. */
const JOURNEY_TIMEOUT_MS = 240_000;

async function signIn(page: Page, email: string) {
  await page.goto(`${baseUrl()}/sign-in`);
  await page.getByTestId('sign-in-screen').waitFor();
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('bench-screen').waitFor();
}

/** The demo device's code, asked of the API from inside the signed-in page. */
async function demoDeviceCode(page: Page): Promise<string> {
  const found = await page.evaluate(async (name) => {
    const response = await fetch(`/api/samples?kind=device&q=${encodeURIComponent(name)}&page=1&pageSize=10`, {
      credentials: 'same-origin',
      headers: { Accept: 'application/json' },
    });
    return (await response.json()) as { samples: { code: string; name: string | null }[] };
  }, DEMO_DEVICE_NAME);
  const device = found.samples.find((sample) => sample.name === DEMO_DEVICE_NAME);
  expect(device).toBeDefined();
  return device?.code ?? '';
}

const recordPath = (code: string, rest: string) => `${baseUrl()}/samples/${encodeURIComponent(code)}/${rest}`;

/** Clicks a download button and returns the saved file's bytes. */
async function download(page: Page, testId: string): Promise<Buffer> {
  const [file] = await Promise.all([page.waitForEvent('download'), page.getByTestId(testId).click()]);
  const saved = await file.path();
  return readFileSync(saved);
}

describe('devices, the lineage picture and the audit', () => {
  const open: BrowserSession[] = [];
  afterAll(async () => {
    for (const session of open) await session.close();
  });

  it(
    'a researcher designs the lens, a reviewer audits it, a manager shares the audit with someone signed out',
    async () => {
      // The researcher designs the lens on a phone: 633 nm, f = 1 mm, 0.5 mm aperture.
      const researcher = await openBrowser(PHONE);
      open.push(researcher);
      const page = researcher.page;
      page.setDefaultTimeout(20_000);
      await signIn(page, RESEARCHER);
      const code = await demoDeviceCode(page);

      await page.goto(`${baseUrl()}/samples/${encodeURIComponent(code)}`);
      await page.getByTestId('device-lens-design').waitFor();
      await page.getByTestId('record-provenance').waitFor();
      await page.getByTestId('device-design-lens').click();
      await page.getByTestId('lens-designer-screen').waitFor();
      await page.getByTestId('lens-form').waitFor();
      await page.getByTestId('lens-wavelength').fill('633');
      await page.getByTestId('lens-focal-unit-mm').click();
      await page.getByTestId('lens-focal').fill('1');
      await page.getByTestId('lens-size-by-aperture').click();
      await page.getByTestId('lens-aperture-unit-mm').click();
      // An impossible design gets the field's message: 20 µm cannot hold the 50.3 µm central zone.
      await page.getByTestId('lens-aperture').fill('0.02');
      await page.getByText(/^Aperture too small for one zone/).waitFor();
      await expect(page.getByTestId('lens-save').isDisabled()).resolves.toBe(true);
      await page.getByTestId('lens-aperture').fill('0.5');
      // N = 2(√(f² + R²) − f)/λ with R = 250 µm: 97.2…, so 97 whole zones (Attwood, zone-plate radii).
      await page.getByTestId('lens-zone-count').filter({ hasText: '97' }).waitFor();
      await page.getByTestId('lens-ring-pattern').waitFor();
      await page.getByTestId('lens-chromatic').waitFor();
      await page.getByTestId('lens-pattern-card').scrollIntoViewIfNeeded();
      await screenshot(page, 'devices-phone-lens-designer');

      await page.getByTestId('lens-save').click();
      await page.getByTestId('lens-saved').waitFor();
      const csv = (await download(page, 'lens-export-csv')).toString('utf8');
      const [header, first] = csv.split('\n');
      expect(header).toBe('zone,inner_radius_um,outer_radius_um,width_nm');
      // Zone 1 is the etched central disc: r₁ = √(λf + λ²/4) = 25.16 µm for 633 nm and 1 mm.
      expect(first).toMatch(/^1,0\.000000,25\.1\d+,/);
      expect(csv.trimEnd().split('\n')).toHaveLength(1 + 49); // odd zones 1…97

      // A measurement of the focal length at two test wavelengths, plotted beside f ∝ 1/λ.
      await page.goto(`${baseUrl()}/samples/${encodeURIComponent(code)}`);
      await page.getByTestId('device-measurements').waitFor();
      const plots = page.locator('[data-testid^="measurement-plot-"]');
      await page.locator('[data-testid^="measurement-plot-"], [data-testid="measurements-none"]').first().waitFor();
      const before = await plots.count();
      await page.getByTestId('measurement-add').click();
      await page.getByTestId('measurement-kind-focal_length_vs_wavelength').click();
      await page.getByTestId('measurement-row-0-x').fill('532');
      await page.getByTestId('measurement-row-0-y').fill('1187');
      await page.getByTestId('measurement-add-row').click();
      await page.getByTestId('measurement-row-1-x').fill('633');
      await page.getByTestId('measurement-row-1-y').fill('1002');
      await page.getByTestId('measurement-instrument').fill('Knife-edge bench');
      await page.getByTestId('measurement-save').click();
      await page.getByTestId('measurement-form').waitFor({ state: 'detached' });
      await plots.nth(before).waitFor();
      await expect(plots.count()).resolves.toBe(before + 1);
      expect(researcher.offLoopbackRequests).toEqual([]);

      // The reviewer reads the audit on a phone and downloads the PDF.
      const reviewer = await openBrowser(PHONE);
      open.push(reviewer);
      const reading = reviewer.page;
      reading.setDefaultTimeout(30_000);
      await signIn(reading, REVIEWER);
      await reading.goto(recordPath(code, 'audit'));
      await reading.getByTestId('audit-report').waitFor();
      await reading.getByTestId('audit-verdict').waitFor();
      await reading.getByTestId(`audit-record-${code}`).waitFor();
      await expect(reading.getByTestId('share-links').count()).resolves.toBe(0);
      await screenshot(reading, 'devices-phone-audit');
      const pdf = await download(reading, 'audit-download-pdf');
      expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');

      // The lineage: a generation list on the phone, a layered picture on a wide screen.
      await reading.goto(recordPath(code, 'lineage'));
      await reading.getByTestId('lineage-list').waitFor();
      await screenshot(reading, 'devices-phone-lineage');
      await reading.setViewportSize(WIDE);
      const canvas = reading.getByTestId('lineage-canvas');
      await canvas.waitFor();
      const device = reading.getByTestId(`lineage-node-${code}`);
      await device.waitFor();
      await screenshot(reading, 'devices-wide-lineage');
      // The wheel zooms about the pointer without scrolling the page; a tap on a record opens it.
      const area = await canvas.boundingBox();
      const small = await device.boundingBox();
      await reading.mouse.move((area?.x ?? 0) + (area?.width ?? 0) / 2, (area?.y ?? 0) + (area?.height ?? 0) / 2);
      await reading.mouse.wheel(0, -300);
      await reading.waitForFunction(
        // Codes may end in a symbol special to selectors, so the node is found by comparing strings.
        ([id, width]) =>
          (Array.from(document.querySelectorAll('[data-testid]'))
            .find((element) => element.getAttribute('data-testid') === id)
            ?.getBoundingClientRect().width ?? 0) >
          width * 1.2,
        [`lineage-node-${code}`, small?.width ?? 0] as const,
      );
      await reading.getByTestId('lineage-fit').click();
      const source = reading.locator('[data-testid^="lineage-node-CR-"]').first();
      const sourceCode = ((await source.getAttribute('data-testid')) ?? '').replace('lineage-node-', '');
      await source.click();
      await reading.getByTestId('sample-code').filter({ hasText: sourceCode }).waitFor();
      expect(reviewer.offLoopbackRequests).toEqual([]);

      // The manager issues a share link; someone signed out opens it, then it is revoked.
      const manager = await openBrowser(WIDE);
      open.push(manager);
      const managing = manager.page;
      managing.setDefaultTimeout(30_000);
      await signIn(managing, MANAGER);
      await managing.goto(recordPath(code, 'audit'));
      await managing.getByTestId('share-links').waitFor();
      await managing.getByTestId('share-link-days').fill('7');
      await managing.getByTestId('share-link-create').click();
      const url = ((await managing.getByTestId('share-link-url').textContent()) ?? '').trim();
      const token = url.split('/shared/')[1] ?? '';
      expect(token).toMatch(/^[A-Za-z0-9_-]{43}$/);
      await managing.getByTestId('share-link-created').scrollIntoViewIfNeeded();
      await screenshot(managing, 'devices-wide-audit-share');

      const outsider = await manager.browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true });
      const visitor = await outsider.newPage();
      visitor.setDefaultTimeout(30_000);
      await visitor.goto(`${baseUrl()}/shared/${token}`);
      await visitor.getByTestId('shared-audit-screen').waitFor();
      await visitor.getByTestId('audit-report').waitFor();
      await visitor.getByTestId(`audit-record-${code}`).waitFor();
      await expect(visitor.getByTestId('sign-in-screen').count()).resolves.toBe(0);
      await screenshot(visitor, 'devices-phone-shared-audit');
      const sharedPdf = await download(visitor, 'audit-download-pdf');
      expect(sharedPdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');

      await managing.reload();
      const active = managing.locator('[data-testid$="-revoke"]').first();
      await active.click();
      await managing.locator('[data-testid$="-revoke-confirm"]').first().click();
      await managing.locator('[data-testid$="-revoked"]').first().waitFor();
      await visitor.reload();
      await visitor.getByTestId('shared-revoked').waitFor();
      await screenshot(visitor, 'devices-phone-shared-revoked');
      await outsider.close();
    },
    JOURNEY_TIMEOUT_MS,
  );
});
