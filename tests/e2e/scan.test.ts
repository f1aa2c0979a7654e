import { randomInt } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { PNG } from 'pngjs';
import { request, type APIRequestContext, type Page } from 'playwright-core';
import QRCode from 'qrcode';
import { CODE_BODY_LENGTH, formatCode } from '../../shared/codes';
import { baseUrl, openBrowser, PHONE, screenshot, WIDE, type BrowserSession, type Viewport } from './browser';

const MANAGER = 'manager@demo.flakeline.test';
const RESEARCHER = 'researcher@demo.flakeline.test';
const DEMO_PASSWORD = 'flakeline-demo';
/** Each journey signs in, reads a code or two and moves a sample; every page answers in well under a second. */
const JOURNEY_TIMEOUT_MS = 120_000;

// ---------------------------------------------------------------------------------------------
// Fixtures made through the API, as a script would: the camera's video must show a real code,
// so the records exist before the browser starts.
// ---------------------------------------------------------------------------------------------

interface ApiSession {
  api: APIRequestContext;
  csrfToken: string;
}

async function apiSignIn(email: string): Promise<ApiSession> {
  const api = await request.newContext({ baseURL: baseUrl() });
  const { csrfToken } = (await (await api.get('/api/auth/csrf')).json()) as { csrfToken: string };
  const response = await api.post('/api/auth/sign-in', {
    headers: { 'x-csrf-token': csrfToken },
    data: { email, password: DEMO_PASSWORD },
  });
  if (!response.ok()) throw new Error(`API sign-in as ${email} failed: ${response.status()} ${await response.text()}`);
  return { api, csrfToken: ((await response.json()) as { csrfToken: string }).csrfToken };
}

async function apiPost<T>(session: ApiSession, route: string, data: unknown): Promise<T> {
  const response = await session.api.post(route, { headers: { 'x-csrf-token': session.csrfToken }, data });
  if (!response.ok()) throw new Error(`POST ${route} failed: ${response.status()} ${await response.text()}`);
  return (await response.json()) as T;
}

async function createSample(session: ApiSession, name: string): Promise<string> {
  const { sample } = await apiPost<{ sample: { code: string } }>(session, '/api/samples', {
    kind: 'chip',
    material: 'MoS2',
    name,
  });
  return sample.code;
}

interface Fixtures {
  samples: string[];
  box: { code: string; name: string; placePath: string };
}

async function createFixtures(): Promise<Fixtures> {
  const run = Date.now().toString(36).toUpperCase();
  const manager = await apiSignIn(MANAGER);
  try {
    const { place: room } = await apiPost<{ place: { id: number; name: string } }>(manager, '/api/places', {
      name: `E2E lab ${run}`,
      kind: 'room',
    });
    const { place: desiccator } = await apiPost<{ place: { id: number; name: string } }>(manager, '/api/places', {
      name: `Desiccator ${run}`,
      kind: 'desiccator',
      parentId: room.id,
    });
    const { box } = await apiPost<{ box: { code: string; name: string } }>(manager, '/api/boxes', {
      name: `E2E chips ${run}`,
      placeId: desiccator.id,
      rows: 4,
      columns: 6,
    });
    const samples: string[] = [];
    for (let index = 1; index <= 3; index += 1) samples.push(await createSample(manager, `E2E scan chip ${run}-${index}`));
    return { samples, box: { code: box.code, name: box.name, placePath: `${room.name} › ${desiccator.name}` } };
  } finally {
    await manager.api.dispose();
  }
}

// ---------------------------------------------------------------------------------------------
// A label's QR drawn as a camera would see it: a raw video file for Chromium's fake camera
// (YUV4MPEG2, 4:2:0), and a PNG photo for the photo fallback.
// ---------------------------------------------------------------------------------------------

const VIDEO_WIDTH = 640;
const VIDEO_HEIGHT = 480;
/** Pixels per QR module; a 29-module code then spans 232 px, well inside the frame. */
const MODULE_PX = 8;
/** Video levels of black and white (ITU-R BT.601 studio range: 16–235). */
const LUMA_DARK = 16;
const LUMA_LIGHT = 235;
const CHROMA_NEUTRAL = 128;
const FRAMES = 10;

let workDir: string;

/** Luma plane with the code's modules drawn dark on light in the middle (the light margin is its quiet zone). */
function drawQr(text: string, width: number, height: number): Uint8Array {
  const { modules } = QRCode.create(text, { errorCorrectionLevel: 'Q' });
  const luma = new Uint8Array(width * height).fill(LUMA_LIGHT);
  const side = modules.size * MODULE_PX;
  const left = Math.floor((width - side) / 2);
  const top = Math.floor((height - side) / 2);
  for (let row = 0; row < modules.size; row += 1) {
    for (let column = 0; column < modules.size; column += 1) {
      if (!modules.get(row, column)) continue;
      for (let y = 0; y < MODULE_PX; y += 1) {
        const start = (top + row * MODULE_PX + y) * width + left + column * MODULE_PX;
        luma.fill(LUMA_DARK, start, start + MODULE_PX);
      }
    }
  }
  return luma;
}

function writeQrVideo(name: string, text: string): string {
  const luma = drawQr(text, VIDEO_WIDTH, VIDEO_HEIGHT);
  const chroma = Buffer.alloc((VIDEO_WIDTH / 2) * (VIDEO_HEIGHT / 2), CHROMA_NEUTRAL);
  const frame = Buffer.concat([Buffer.from('FRAME\n'), Buffer.from(luma), chroma, chroma]);
  const header = Buffer.from(`YUV4MPEG2 W${VIDEO_WIDTH} H${VIDEO_HEIGHT} F10:1 Ip A1:1 C420jpeg\n`);
  const file = path.join(workDir, `${name}.y4m`);
  writeFileSync(file, Buffer.concat([header, ...Array.from({ length: FRAMES }, () => frame)]));
  return file;
}

function writeQrPhoto(name: string, text: string): string {
  const luma = drawQr(text, VIDEO_WIDTH, VIDEO_HEIGHT);
  const png = new PNG({ width: VIDEO_WIDTH, height: VIDEO_HEIGHT });
  luma.forEach((value, index) => {
    png.data[index * 4] = value;
    png.data[index * 4 + 1] = value;
    png.data[index * 4 + 2] = value;
    png.data[index * 4 + 3] = 255;
  });
  const file = path.join(workDir, `${name}.png`);
  writeFileSync(file, PNG.sync.write(png));
  return file;
}

/** Chromium with a camera that shows `video` and is allowed without asking. */
function withCamera(video: string) {
  return {
    extraArgs: [
      '--use-fake-ui-for-media-stream',
      '--use-fake-device-for-media-stream',
      `--use-file-for-fake-video-capture=${video}`,
    ],
    permissions: ['camera'],
  };
}

// ---------------------------------------------------------------------------------------------

async function signInAt(page: Page, route: string, email: string) {
  await page.goto(`${baseUrl()}${route}`);
  await page.getByTestId('sign-in-screen').waitFor();
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByTestId('sign-in-submit').click();
}

async function textOf(page: Page, testId: string): Promise<string> {
  return ((await page.getByTestId(testId).first().textContent()) ?? '').trim();
}

/** The slot's cell names the sample in its accessible label, whatever fits on screen. */
async function waitForSlotHolding(page: Page, prefix: string, slot: string, code: string) {
  await page.locator(`[data-testid="${prefix}-${slot}"][aria-label*="${code}"]`).waitFor();
}

/** Every request the page made for the QR decoder's WebAssembly. */
function watchDecoder(browser: BrowserSession): string[] {
  const seen: string[] = [];
  browser.page.on('request', (entry) => {
    if (entry.url().endsWith('.wasm')) seen.push(entry.url());
  });
  return seen;
}

describe('labels and scanning', () => {
  let fixtures: Fixtures;
  let browser: BrowserSession | undefined;

  beforeAll(async () => {
    workDir = mkdtempSync(path.join(os.tmpdir(), 'flakeline-scan-'));
    fixtures = await createFixtures();
  });
  afterAll(() => rmSync(workDir, { recursive: true, force: true }));
  afterEach(async () => {
    await browser?.close();
    browser = undefined;
  });

  it(
    'at phone size the camera reads a sample’s label and opens the sample, which shows its QR and prints its label',
    async () => {
      const code = fixtures.samples[0];
      const video = writeQrVideo('sample', `${baseUrl()}/s/${code}`);
      browser = await openBrowser(PHONE, withCamera(video));
      const { page, context } = browser;
      page.setDefaultTimeout(20_000);
      const decoder = watchDecoder(browser);

      await signInAt(page, '/scan', RESEARCHER);
      await page.waitForURL((url) => decodeURIComponent(url.pathname).endsWith(`/samples/${code}`));
      await page.getByTestId('sample-detail').waitFor();
      await expect(textOf(page, 'sample-code')).resolves.toBe(code);
      expect(decoder.length).toBeGreaterThan(0);
      expect(decoder.every((url) => url === `${new URL(baseUrl()).origin}/vendor/zxing_reader.wasm`)).toBe(true);

      const qr = page.getByTestId('sample-qr');
      await qr.scrollIntoViewIfNeeded();
      await expect(qr.getAttribute('aria-label')).resolves.toContain(`/s/${code}`);
      await expect(textOf(page, 'sample-location')).resolves.toContain('Not put away');
      await screenshot(page, 'scan-phone-sample-label');

      await page.getByTestId('sample-print-labels').click();
      await page.getByTestId('print-sheet').waitFor();
      await page.getByRole('radio', { name: /Cryo vial labels/ }).click();
      await screenshot(page, 'scan-phone-print-sheet');
      const pdfRequest = context.waitForEvent('request', (entry) => entry.url().includes('/api/labels.pdf'));
      await page.getByTestId('print-open').click();
      const pdfUrl = new URL((await pdfRequest).url());
      expect(pdfUrl.searchParams.get('samples')).toBe(code);
      expect(pdfUrl.searchParams.get('template')).toMatch(/^\d+$/);

      // In move mode the same label becomes step 1 of the chain, and the camera keeps running.
      await page.goto(`${baseUrl()}/scan?mode=move`);
      await page.locator('[data-testid="move-step-sample-title"]', { hasText: code }).waitFor();
      await expect(textOf(page, 'scan-prompt')).resolves.toContain('box');
      await screenshot(page, 'scan-phone-move');

      expect(browser.offLoopbackRequests).toEqual([]);
    },
    JOURNEY_TIMEOUT_MS,
  );

  it(
    'at wide size a box’s label opens its grid; a sample goes into a free slot there, another by scanning in move mode',
    async () => {
      const [first, second] = fixtures.samples.slice(1);
      const { box } = fixtures;
      const video = writeQrVideo('box', `${baseUrl()}/s/${box.code}`);
      browser = await openBrowser(WIDE, withCamera(video));
      const { page } = browser;
      page.setDefaultTimeout(20_000);

      await signInAt(page, '/scan', MANAGER);
      await page.waitForURL((url) => decodeURIComponent(url.pathname).endsWith(`/boxes/${box.code}`));
      await page.getByTestId('box-grid-card').waitFor();
      await expect(textOf(page, 'box-screen')).resolves.toContain(box.placePath);
      await screenshot(page, 'boxes-wide-grid');

      await page.getByTestId('slot-A2').click();
      await page.getByTestId('put-sample-input').fill(first.toLowerCase());
      await page.getByTestId('put-sample-submit').click();
      await waitForSlotHolding(page, 'slot', 'A2', first);
      await page.getByTestId(`sample-chip-${first}`).waitFor();
      await screenshot(page, 'boxes-wide-slot-filled');

      // Putting a sample that is already in the box elsewhere moves it.
      await page.getByTestId('slot-A3').click();
      await page.getByTestId('put-sample-input').fill(first);
      await page.getByTestId('put-sample-submit').click();
      await waitForSlotHolding(page, 'slot', 'A3', first);
      await expect(page.locator(`[data-testid="slot-A2"][aria-label*="free"]`).count()).resolves.toBe(1);

      await page.goto(`${baseUrl()}/scan?mode=move`);
      await page.getByTestId('move-chain').waitFor();
      // The camera keeps seeing the box: it becomes step 2 whichever order things happen in.
      await page.locator('[data-testid="move-step-box-title"]', { hasText: box.name }).waitFor();
      await page.getByTestId('code-entry-input').fill(second);
      await page.getByTestId('code-entry-submit').click();
      await page.locator('[data-testid="move-step-sample-title"]', { hasText: second }).waitFor();
      // A taken slot, typed rather than tapped, is refused in the server's words.
      await page.getByTestId('chain-slot-input').fill('a3');
      await page.getByTestId('chain-put').click();
      await expect(textOf(page, 'form-problem')).resolves.toContain(`already holds ${first}`);
      await page.getByTestId('chain-slot-B3').click();
      await screenshot(page, 'scan-wide-move');
      await page.getByTestId('chain-put').click();
      await page.getByTestId('move-done').waitFor();
      await expect(textOf(page, 'move-done')).resolves.toContain('slot B3');

      await page.goto(`${baseUrl()}/boxes/${box.code}`);
      await waitForSlotHolding(page, 'slot', 'B3', second);
      await page.goto(`${baseUrl()}/samples/${second}`);
      await expect(page.getByTestId('sample-location-link').textContent()).resolves.toContain(`${box.name}’, slot B3`);

      expect(browser.offLoopbackRequests).toEqual([]);
    },
    JOURNEY_TIMEOUT_MS,
  );

  it(
    'at phone size, with no camera, a label link survives sign-in and codes are typed or read from a photo',
    async () => {
      const [code] = fixtures.samples;
      browser = await openBrowser(PHONE);
      const { page } = browser;
      page.setDefaultTimeout(20_000);

      // A scanned label's address, opened signed out, comes back after sign-in.
      await signInAt(page, `/s/${code}`, RESEARCHER);
      await page.waitForURL((url) => decodeURIComponent(url.pathname).endsWith(`/samples/${code}`));
      await expect(textOf(page, 'sample-code')).resolves.toBe(code);

      await page.goto(`${baseUrl()}/scan`);
      await page.getByTestId('scan-camera-unavailable').waitFor();
      await screenshot(page, 'scan-phone-no-camera');

      // The check symbol catches a misread character; a well-formed stranger is "not found".
      const typo = `${code.slice(0, -2)}${code.at(-2) === '7' ? '8' : '7'}${code.at(-1)}`;
      await page.getByTestId('code-entry-input').fill(typo);
      await page.getByTestId('code-entry-submit').click();
      await page.getByTestId('scan-typo').waitFor();
      const stranger = formatCode('CH', randomInt(32 ** CODE_BODY_LENGTH));
      await page.getByTestId('code-entry-input').fill(stranger);
      await page.getByTestId('code-entry-submit').click();
      await page.getByTestId('scan-not-found').waitFor();
      await screenshot(page, 'scan-phone-not-found');

      await page.getByTestId('code-entry-input').fill(` ${code.toLowerCase().replace('-', ' ')} `);
      await page.getByTestId('code-entry-submit').click();
      await page.waitForURL((url) => decodeURIComponent(url.pathname).endsWith(`/samples/${code}`));

      await page.goto(`${baseUrl()}/scan`);
      const chooser = page.waitForEvent('filechooser');
      await page.getByTestId('photo-pick').click();
      await (await chooser).setFiles(writeQrPhoto('sample-photo', `${baseUrl()}/s/${code}`));
      await page.waitForURL((url) => decodeURIComponent(url.pathname).endsWith(`/samples/${code}`));

      // The box grid on a phone: finger-sized cells, scrolling sideways when the box is wide.
      await page.goto(`${baseUrl()}/boxes/${fixtures.box.code}`);
      const cell = await page.getByTestId('slot-A1').boundingBox();
      expect(cell?.width ?? 0).toBeGreaterThanOrEqual(48);
      expect(cell?.height ?? 0).toBeGreaterThanOrEqual(48);
      await screenshot(page, 'boxes-phone-grid');
      await page.getByTestId('slot-A2').click();
      await page.getByTestId('slot-panel').scrollIntoViewIfNeeded();
      await screenshot(page, 'boxes-phone-slot');

      expect(browser.offLoopbackRequests).toEqual([]);
    },
    JOURNEY_TIMEOUT_MS,
  );

  it.each([
    ['phone', PHONE],
    ['wide', WIDE],
  ] as [string, Viewport][])('the boxes list at %s size shows places as a tree and adds a box', async (sizeName, viewport) => {
    browser = await openBrowser(viewport);
    const { page } = browser;
    page.setDefaultTimeout(20_000);
    await signInAt(page, '/boxes', MANAGER);
    await page.getByTestId(`box-row-${fixtures.box.code}`).waitFor();
    await screenshot(page, `boxes-${sizeName}-list`);

    await page.getByTestId('boxes-add-box').click();
    await page.getByTestId('box-name').fill(`E2E added ${sizeName} ${Date.now().toString(36)}`);
    await page.getByRole('radio', { name: fixtures.box.placePath }).click();
    await page.getByTestId('box-rows').fill('3');
    await page.getByTestId('box-columns').fill('5');
    await expect(textOf(page, 'box-slot-preview')).resolves.toContain('A1 to C5');
    await page.getByTestId('box-save').click();
    await page.getByTestId('box-grid-card').waitFor();
    await page.getByTestId('slot-C5').waitFor();
    await expect(page.getByTestId('slot-D1').count()).resolves.toBe(0);
    expect(browser.offLoopbackRequests).toEqual([]);
  });
});
