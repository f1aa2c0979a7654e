import type { Page } from 'playwright-core';
import { baseUrl, openBrowser, PHONE, screenshot, WIDE, type BrowserSession, type Viewport } from './browser';

const DEMO_PASSWORD = 'flakeline-demo';

async function signIn(page: Page, email: string) {
  await page.goto(`${baseUrl()}/`);
  await page.getByTestId('sign-in-screen').waitFor();
  await page.getByLabel('E-mail', { exact: true }).fill(email);
  await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD);
  await page.getByTestId('sign-in-submit').click();
  await page.getByRole('navigation').first().waitFor();
}

/** The destinations the navigation offers, by their testIDs (`nav-<key>`). */
async function navKeys(page: Page): Promise<string[]> {
  const ids = await page
    .locator('[data-testid^="nav-"][href]')
    .evaluateAll((links) => links.map((link) => link.getAttribute('data-testid') ?? ''));
  return [...new Set(ids)].map((id) => id.replace(/^nav-/, ''));
}

describe.each([
  ['phone', PHONE],
  ['wide', WIDE],
] as [string, Viewport][])('the app shell at %s size', (sizeName, viewport) => {
  let browser: BrowserSession;
  beforeEach(async () => {
    browser = await openBrowser(viewport);
  });
  afterEach(() => browser?.close());

  it('a signed-out visitor is sent to sign in; a wrong password is explained', async () => {
    const { page } = browser;
    await page.goto(`${baseUrl()}/account`);
    await page.getByTestId('sign-in-screen').waitFor();
    expect(page.url()).toContain('/sign-in?next=%2Faccount');
    await page.getByLabel('E-mail', { exact: true }).fill('manager@demo.flakeline.test');
    await page.getByLabel('Password', { exact: true }).fill('not the password');
    await page.getByTestId('sign-in-submit').click();
    await page.getByText('That e-mail and password do not match an account.').first().waitFor();
    await screenshot(page, `shell-${sizeName}-sign-in-error`);
  });

  it('the lab manager signs in, visits every destination, and signs out', async () => {
    const { page } = browser;
    await signIn(page, 'manager@demo.flakeline.test');
    const keys = await navKeys(page);
    expect(keys).toEqual(expect.arrayContaining(['account', 'people', 'outbox']));
    for (const key of keys) {
      await page.locator(`[data-testid="nav-${key}"][href]`).first().click();
      await page.getByTestId(`${key}-screen`).waitFor();
      await expect(page.getByTestId('error-state').count()).resolves.toBe(0);
      await screenshot(page, `shell-${sizeName}-manager-${key}`);
    }
    await page.locator('[data-testid="nav-people"][href]').first().click();
    await page.getByText('Noor Halvorsen').first().waitFor();

    await page.locator('[data-testid="nav-account"][href]').first().click();
    await page.getByTestId('sign-out').click();
    await page.getByTestId('sign-in-screen').waitFor();
    await page.goto(`${baseUrl()}/people`);
    await page.getByTestId('sign-in-screen').waitFor();
    expect(browser.offLoopbackRequests).toEqual([]);
  });

  it('a reviewer sees no manager destinations, and a manager page reached directly says why', async () => {
    const { page } = browser;
    await signIn(page, 'reviewer@demo.flakeline.test');
    const keys = await navKeys(page);
    expect(keys).toContain('account');
    expect(keys).not.toContain('people');
    expect(keys).not.toContain('outbox');
    await page.goto(`${baseUrl()}/people`);
    await page.getByTestId('manager-only').waitFor();
    await screenshot(page, `shell-${sizeName}-reviewer-people`);
  });
});
