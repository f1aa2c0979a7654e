import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { PNG } from 'pngjs';
import { rgbContrast } from '@/shared/optics/contrast';
import { baseUrl, openBrowser, PHONE, screenshot, scrollIntoViewAfterResize, WIDE, type BrowserSession } from './browser';

const RESEARCHER = 'researcher@demo.flakeline.test';
const DEMO_PASSWORD = 'flakeline-demo';
/** The demo lab's exfoliated MoS2 flake, found on a chip with 285 nm of oxide. */
const DEMO_FLAKE_NAME = 'MoS2 1L candidate A';
const DEMO_OXIDE_NM = 285;
/** Upload, marking and analysis each answer in a second or two; the export is served from loopback. */
const JOURNEY_TIMEOUT_MS = 180_000;
/** About 3 s for the synthetic micrograph (≈ 480 kB). */
const UPLOAD_BYTES_PER_SECOND = 160_000;

interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

/** The synthetic micrograph: bare oxide, with one rectangular monolayer flake. */
const IMAGE = { width: 800, height: 600 } as const;
const FLAKE_BOX: Box = { x: 300, y: 200, width: 220, height: 170 };
const SUBSTRATE_BOX: Box = { x: 80, y: 80, width: 160, height: 140 };
/** A violet-grey oxide colour as a camera might record it (invented, any mid-range colour works). */
const OXIDE_RGB = { red: 168, green: 132, blue: 196 } as const;

/** Small deterministic noise so the regions are not perfectly flat (a linear congruential generator, Numerical Recipes' constants). */
function noiseSource(seed: number) {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

/**
 * A PNG whose flake patch has exactly the colour the thin-film model predicts for monolayer MoS2
 * on 285 nm SiO2/Si: I_flake = I_substrate · (1 − C) per channel, C from `rgbContrast`. Its
 * layer call must therefore come out as 1.
 */
function syntheticMicrograph(file: string) {
  const contrast = rgbContrast({
    material: 'MoS2',
    layers: 1,
    substrate: { kind: 'oxide-on-silicon', oxideThicknessNm: DEMO_OXIDE_NM },
  });
  const flake = {
    red: OXIDE_RGB.red * (1 - contrast.red),
    green: OXIDE_RGB.green * (1 - contrast.green),
    blue: OXIDE_RGB.blue * (1 - contrast.blue),
  };
  const png = new PNG({ width: IMAGE.width, height: IMAGE.height });
  const noise = noiseSource(7);
  for (let y = 0; y < IMAGE.height; y += 1) {
    for (let x = 0; x < IMAGE.width; x += 1) {
      const inFlake =
        x >= FLAKE_BOX.x && x < FLAKE_BOX.x + FLAKE_BOX.width && y >= FLAKE_BOX.y && y < FLAKE_BOX.y + FLAKE_BOX.height;
      const colour = inFlake ? flake : OXIDE_RGB;
      const offset = (y * IMAGE.width + x) * 4;
      png.data[offset] = Math.round(colour.red + 2 * noise());
      png.data[offset + 1] = Math.round(colour.green + 2 * noise());
      png.data[offset + 2] = Math.round(colour.blue + 2 * noise());
      png.data[offset + 3] = 255;
    }
  }
  writeFileSync(file, PNG.sync.write(png));
}

/**
 * A Raman spectrum of monolayer MoS2: E¹2g at 385.0 and A1g at 404.0 cm⁻¹, 19.0 cm⁻¹ apart, which
 * Lee et al., ACS Nano 4, 2695 (2010) report for one layer (≈18–19 cm⁻¹; 21–22 for two). Lorentzian
 * lines on a sloping background with noise, plus the silicon line at 520.7 cm⁻¹.
 */
function syntheticRaman(file: string) {
  const lines = [
    { centre: 385.0, fwhm: 3.2, height: 650 },
    { centre: 404.0, fwhm: 4.8, height: 1000 },
    { centre: 520.7, fwhm: 3.6, height: 2400 },
  ];
  const noise = noiseSource(11);
  const rows = ['# synthetic spectrum for the end-to-end test', 'shift_cm-1,counts'];
  for (let x = 200; x <= 600; x += 0.5) {
    let y = 120 + 0.08 * (x - 200);
    for (const peak of lines) y += peak.height / (1 + ((2 * (x - peak.centre)) / peak.fwhm) ** 2);
    y += 16 * noise();
    rows.push(`${x.toFixed(1)},${y.toFixed(2)}`);
  }
  writeFileSync(file, `${rows.join('\n')}\n`);
}

/** A request from inside the page, with its session cookie, as the app makes it. */
async function pageGet(page: Page, route: string): Promise<unknown> {
  return page.evaluate(async (url) => (await fetch(url, { credentials: 'same-origin' })).json(), route);
}

async function signIn(page: Page) {
  await page.goto(`${baseUrl()}/`);
  await page.getByTestId('sign-in-screen').waitFor();
  await page.getByLabel('E-mail', { exact: true }).fill(RESEARCHER);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('bench-screen').waitFor();
}

async function demoFlakeCode(page: Page): Promise<string> {
  const answer = (await pageGet(page, `/api/samples?kind=flake&q=${encodeURIComponent(DEMO_FLAKE_NAME)}`)) as {
    samples: { code: string; name: string | null }[];
  };
  const flake = answer.samples.find((sample) => sample.name === DEMO_FLAKE_NAME);
  if (!flake) throw new Error(`The demo lab has no flake named ${DEMO_FLAKE_NAME}`);
  return flake.code;
}

/** Opens the add-evidence form from the flake's own page, as a researcher would. */
async function openAddEvidence(page: Page, code: string) {
  await page.goto(`${baseUrl()}/samples/${encodeURIComponent(code)}`);
  await page.getByTestId('evidence-card').waitFor();
  await page.getByTestId('evidence-add').click();
  await page.getByTestId('add-evidence-screen').waitFor();
}

async function chooseFile(page: Page, buttonTestId: string, file: string) {
  const [chooser] = await Promise.all([page.waitForEvent('filechooser'), page.getByTestId(buttonTestId).click()]);
  await chooser.setFiles(file);
  await page.getByTestId('evidence-picked').waitFor();
}

/** A finger dragged across the page: real touch events, as a phone's browser sends them. */
async function touchDrag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }) {
  const cdp = await page.context().newCDPSession(page);
  const at = (t: number) => [{ x: from.x + (to.x - from.x) * t, y: from.y + (to.y - from.y) * t }];
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: at(0) });
  for (let step = 1; step <= 10; step += 1)
    await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: at(step / 10) });
  await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
  await cdp.detach();
}

/** Drags a box a little inside `box` (image pixels) on the shown micrograph. */
async function markBox(page: Page, box: Box) {
  const marker = page.getByTestId('micrograph-marker');
  await marker.scrollIntoViewIfNeeded();
  const shown = await marker.boundingBox();
  if (!shown) throw new Error('The micrograph is not on screen');
  const scale = shown.width / IMAGE.width;
  const inset = 0.15;
  const from = { x: shown.x + (box.x + box.width * inset) * scale, y: shown.y + (box.y + box.height * inset) * scale };
  const to = { x: shown.x + (box.x + box.width * (1 - inset)) * scale, y: shown.y + (box.y + box.height * (1 - inset)) * scale };
  await touchDrag(page, from, to);
}

describe('thickness evidence at phone size', () => {
  let browser: BrowserSession;
  let files: string;
  beforeAll(() => {
    files = mkdtempSync(path.join(os.tmpdir(), 'flakeline-evidence-'));
  });
  afterEach(() => browser.close());

  it(
    'uploads a micrograph to a flake, marks the flake and the substrate with a finger, and calls one layer',
    async () => {
      const image = path.join(files, 'mos2-flake.png');
      syntheticMicrograph(image);
      browser = await openBrowser(PHONE);
      const { page } = browser;
      page.setDefaultTimeout(20_000);
      await signIn(page);
      const code = await demoFlakeCode(page);

      await openAddEvidence(page, code);
      await page.getByTestId('evidence-kind-micrograph').click();
      await chooseFile(page, 'evidence-pick-image', image);
      await page.getByTestId('evidence-material-MoS2').click();
      await page.getByTestId('evidence-substrate-oxide-on-silicon').click();
      await page.getByTestId(`evidence-oxide-${DEMO_OXIDE_NM}`).click();
      await screenshot(page, 'evidence-phone-add-micrograph');

      // A slow lab network, so the progress bar has time to show how far the upload has got.
      const network = await page.context().newCDPSession(page);
      await network.send('Network.enable');
      await network.send('Network.emulateNetworkConditions', {
        offline: false,
        latency: 0,
        downloadThroughput: -1,
        uploadThroughput: UPLOAD_BYTES_PER_SECOND,
      });
      await page.getByTestId('evidence-submit').click();
      await page.getByTestId('upload-progress').waitFor();
      await expect(page.getByTestId('upload-progress-label').textContent()).resolves.toMatch(/% sent|Sent/);
      await page.getByTestId('upload-progress').scrollIntoViewIfNeeded();
      await screenshot(page, 'evidence-phone-uploading');
      await page.getByTestId('evidence-added').waitFor();
      await network.send('Network.emulateNetworkConditions', {
        offline: false,
        latency: 0,
        downloadThroughput: -1,
        uploadThroughput: -1,
      });
      await network.detach();
      await page.getByTestId('micrograph-marker').waitFor();

      await markBox(page, FLAKE_BOX);
      await expect(page.getByTestId('region-flake').textContent()).resolves.toMatch(/px box/);
      await markBox(page, SUBSTRATE_BOX);
      await expect(page.getByTestId('region-substrate').textContent()).resolves.toMatch(/px box/);
      await page.getByTestId('compute-contrast').click();
      await page.getByTestId('contrast-result').waitFor();
      await expect(page.getByTestId('contrast-best-layers').textContent()).resolves.toBe('1');
      await expect(page.getByTestId('contrast-datasets').textContent()).resolves.toMatch(/Hsu/);
      await page.getByTestId('contrast-result').scrollIntoViewIfNeeded();
      await screenshot(page, 'evidence-phone-micrograph');

      await page.setViewportSize(WIDE);
      await scrollIntoViewAfterResize(page, 'micrograph-marker');
      await screenshot(page, 'evidence-wide-micrograph');
      await page.setViewportSize(PHONE);

      // The flake now carries the call.
      await page.goto(`${baseUrl()}/samples/${encodeURIComponent(code)}`);
      await page.getByTestId('evidence-list').waitFor();
      await expect(page.getByTestId('layer-call-layers').textContent()).resolves.toBe('1');
      await page.getByTestId('evidence-card').scrollIntoViewIfNeeded();
      await screenshot(page, 'evidence-phone-sample-card');
      expect(browser.offLoopbackRequests).toEqual([]);
    },
    JOURNEY_TIMEOUT_MS,
  );

  it(
    'uploads a Raman spectrum of monolayer MoS2 and shows the fitted peaks and a one-layer call',
    async () => {
      const spectrum = path.join(files, 'mos2-raman.csv');
      syntheticRaman(spectrum);
      browser = await openBrowser(PHONE);
      const { page } = browser;
      page.setDefaultTimeout(20_000);
      await signIn(page);
      const code = await demoFlakeCode(page);

      await openAddEvidence(page, code);
      await page.getByTestId('evidence-kind-raman').click();
      await page.getByTestId('laser-caution').waitFor();
      await chooseFile(page, 'evidence-pick-text', spectrum);
      await page.getByTestId('evidence-material-MoS2').click();
      await page.getByTestId('evidence-laser-532').click();
      await page.getByTestId('evidence-submit').click();
      await page.getByTestId('evidence-added').waitFor();

      await page.getByTestId('spectrum-plot').waitFor();
      const table = page.getByTestId('peaks-table');
      await expect(table.textContent()).resolves.toMatch(/E¹2g.*38[45]\.\d/);
      await expect(table.textContent()).resolves.toMatch(/A1g.*40[34]\.\d/);
      await expect(page.getByTestId('quantities-table').textContent()).resolves.toMatch(/1[89]\.\d/);
      await expect(page.getByTestId('estimate-layers').textContent()).resolves.toBe('Raman says 1 layer');
      await expect(page.getByTestId('estimate-references').textContent()).resolves.toMatch(/ACS Nano 4, 2695/);
      await page.getByTestId('spectrum-plot').scrollIntoViewIfNeeded();
      await screenshot(page, 'evidence-phone-raman');
      expect(browser.offLoopbackRequests).toEqual([]);
    },
    JOURNEY_TIMEOUT_MS,
  );

  it(
    'adds a calibration, finds the monolayer on a chip micrograph and makes it a flake',
    async () => {
      const image = path.join(files, 'mos2-chip.png');
      syntheticMicrograph(image);
      browser = await openBrowser(PHONE);
      const { page } = browser;
      page.setDefaultTimeout(20_000);
      await signIn(page);
      const flake = (await pageGet(page, `/api/samples/${encodeURIComponent(await demoFlakeCode(page))}`)) as {
        sample: { parents: { code: string; kind: string }[] };
      };
      const chip = flake.sample.parents.find((parent) => parent.kind === 'chip');
      if (!chip) throw new Error('The demo flake has no parent chip');

      // The scale first: 0.1 µm per pixel makes the 220 × 170 px flake 374 µm².
      const scope = `E2E scope ${Date.now().toString(36)}`;
      await page.goto(`${baseUrl()}/calibrations`);
      await page.getByTestId('calibration-microscope').fill(scope);
      await page.getByTestId('calibration-objective-50').click();
      await page.getByTestId('calibration-um-per-pixel').fill('0,1');
      await page.getByTestId('calibration-submit').click();
      await page.getByTestId('calibration-added').waitFor();
      await page.getByText(`${scope} · 50×`).waitFor();
      await screenshot(page, 'evidence-phone-calibrations');

      await openAddEvidence(page, chip.code);
      await chooseFile(page, 'evidence-pick-image', image);
      await page.getByRole('radio', { name: new RegExp(`^${scope}`) }).click();
      await page.getByTestId('evidence-material-MoS2').click();
      await page.getByTestId('evidence-substrate-oxide-on-silicon').click();
      await page.getByTestId(`evidence-oxide-${DEMO_OXIDE_NM}`).click();
      await page.getByTestId('evidence-submit').click();
      await page.getByTestId('evidence-added').waitFor();

      const candidate = page.getByTestId('candidate-0');
      await candidate.waitFor();
      await expect(candidate.textContent()).resolves.toMatch(/1 layer window · 3[67]\d µm²/);
      await page.getByTestId('candidate-0-show').click();
      await page.getByTestId('micrograph-marker').scrollIntoViewIfNeeded();
      await screenshot(page, 'evidence-phone-candidates');
      await candidate.scrollIntoViewIfNeeded();
      await page.getByTestId('candidate-0-make').click();
      await page.getByTestId('sample-detail').waitFor();
      await expect(page.getByTestId('sample-code').textContent()).resolves.toMatch(/^FK-/);
      await page.getByTestId('evidence-list').waitFor();
      await expect(page.getByTestId('evidence-list').textContent()).resolves.toMatch(/Micrograph/);
      expect(browser.offLoopbackRequests).toEqual([]);
    },
    JOURNEY_TIMEOUT_MS,
  );
});
