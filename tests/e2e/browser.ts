import { mkdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const PHONE = { width: 390, height: 844 } as const;
export const WIDE = { width: 1440, height: 900 } as const;
export type Viewport = typeof PHONE | typeof WIDE;

/** The real server `npm test` started on the seeded end-to-end database. */
export function baseUrl(): string {
  const url = process.env.E2E_BASE_URL;
  if (!url) throw new Error('E2E_BASE_URL is not set: run the browser suite through `npm test`.');
  return url;
}

// Flags that let Debian's Chromium run headless as root with no network beyond loopback.
const CHROMIUM_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export interface BrowserSession {
  browser: Browser;
  context: BrowserContext;
  page: Page;
  /** Requests that left loopback: the product must make none. */
  offLoopbackRequests: string[];
  close: () => Promise<void>;
}

export interface BrowserOptions {
  /** More Chromium flags, e.g. a fake camera fed from a file. */
  extraArgs?: readonly string[];
  /** Permissions granted to the app's origin up front, e.g. `camera`. */
  permissions?: readonly string[];
}

export async function openBrowser(viewport: Viewport, options: BrowserOptions = {}): Promise<BrowserSession> {
  // Playwright gives every launch a fresh, throwaway profile of its own.
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [...CHROMIUM_ARGS, ...(options.extraArgs ?? [])],
  });
  const context = await browser.newContext({
    viewport,
    deviceScaleFactor: 1,
    isMobile: viewport === PHONE,
    hasTouch: viewport === PHONE,
  });
  if (options.permissions?.length) {
    await context.grantPermissions([...options.permissions], { origin: new URL(baseUrl()).origin });
  }
  const page = await context.newPage();
  const offLoopbackRequests: string[] = [];
  page.on('request', (request) => {
    const { hostname, protocol } = new URL(request.url());
    if ((protocol === 'http:' || protocol === 'https:') && hostname !== '127.0.0.1' && hostname !== 'localhost') {
      offLoopbackRequests.push(request.url());
    }
  });
  return {
    browser,
    context,
    page,
    offLoopbackRequests,
    close: () => browser.close(),
  };
}

/** Saves a full-page screenshot under .data/screenshots for a person to look at. */
export async function screenshot(page: Page, name: string): Promise<string> {
  const dir = process.env.E2E_SCREENSHOT_DIR ?? path.join(os.tmpdir(), 'flakeline-screenshots');
  mkdirSync(dir, { recursive: true });
  const file = path.join(dir, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/**
 * Scrolls an element into view after a change of viewport: the app re-lays itself out for the new
 * width, so the element first found may be replaced mid-scroll. Tries again with a fresh lookup.
 */
export async function scrollIntoViewAfterResize(page: Page, testId: string): Promise<void> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      await page.getByTestId(testId).scrollIntoViewIfNeeded({ timeout: 5_000 });
      return;
    } catch (error) {
      if (attempt >= 5) throw error;
      await page.waitForTimeout(200);
    }
  }
}
