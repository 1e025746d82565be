/** The app shell without an account: the 404 page, the theme toggle and its memory, the system preference. */
import fs from 'node:fs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';

let browser: Browser;
let context: BrowserContext;
let page: Page;

beforeAll(async () => {
  browser = await launchBrowser();
  context = await newContext(browser);
  page = await context.newPage();
});

afterAll(async () => {
  await browser?.close();
});

const isDark = (p: Page) => p.evaluate(() => document.documentElement.classList.contains('dark'));

describe('app shell', () => {
  it('shows a 404 page for an unknown address, with a way back', async () => {
    await page.goto('/no-such-place/at-all');
    await expectVisible(page.getByRole('heading', { name: 'Page not found' }));
    await expectVisible(page.getByRole('link', { name: 'Go to your workspaces' }));
    expect(await page.title()).toBe('Page not found · Lariat');
    await checkA11y(page, '404 page');
  });

  it('sends a signed-out visitor from / and from a workspace URL to the sign-in page', async () => {
    await page.goto('/');
    await page.waitForURL(/\/sign-in$/);
    await page.goto('/w/00000000-0000-0000-0000-000000000000/members');
    await page.waitForURL(/\/sign-in\?redirectTo=/);
    expect(decodeURIComponent(new URL(page.url()).searchParams.get('redirectTo') ?? '')).toBe('/w/00000000-0000-0000-0000-000000000000/members');
  });

  it('toggles light and dark, and remembers the choice across a reload', async () => {
    await page.emulateMedia({ colorScheme: 'light' });
    await page.goto('/sign-in');
    expect(await isDark(page)).toBe(false);
    await page.getByRole('button', { name: 'Use the dark theme' }).click();
    expect(await isDark(page)).toBe(true);
    expect(await page.evaluate(() => localStorage.getItem('lariat-theme'))).toBe('dark');
    await page.reload();
    expect(await isDark(page)).toBe(true);
    await checkA11y(page, 'sign-in page, dark');
    fs.mkdirSync('tests/e2e/screenshots', { recursive: true });
    await page.screenshot({ path: 'tests/e2e/screenshots/sign-in-dark.png' });
    await page.getByRole('button', { name: 'Use the light theme' }).click();
    expect(await isDark(page)).toBe(false);
    await page.reload();
    expect(await isDark(page)).toBe(false);
  });

  it('starts from the system preference when nothing is remembered', async () => {
    const darkContext = await newContext(browser, { colorScheme: 'dark' });
    const darkPage = await darkContext.newPage();
    await darkPage.goto('/sign-in');
    expect(await isDark(darkPage)).toBe(true);
    await darkContext.close();
  });

  it('shows the error page, not a blank screen, when the server fails', async () => {
    const failing = await newContext(browser);
    await failing.route('**/api/auth/me', (route) =>
      route.fulfill({ status: 500, contentType: 'application/json', body: JSON.stringify({ error: { message: 'Simulated outage for the test.' } }) }),
    );
    const failingPage = await failing.newPage();
    await failingPage.goto('/w/00000000-0000-0000-0000-000000000000/models');
    await expectVisible(failingPage.getByRole('heading', { name: 'Something went wrong' }), 20_000);
    await expectVisible(failingPage.getByText('Simulated outage for the test.'));
    await expectVisible(failingPage.getByRole('button', { name: 'Reload the page' }));
    await checkA11y(failingPage, 'error page');
    await failing.close();
  });
});
