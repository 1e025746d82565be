/**
 * The API keys page through the real server: an admin makes a key (shown once), the key opens the
 * consumer API while the admin's own browser session does not, revoking it in the page shuts it at
 * once, and a webhook to a private address is refused with the reason beside the field. axe-core runs
 * on the page.
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { newAccount, signUp } from '../support/e2e-flows';

let browser: Browser;
let context: BrowserContext;
let page: Page;
let key = '';

beforeAll(async () => {
  browser = await launchBrowser();
  context = await newContext(browser);
  page = await context.newPage();
  await signUp(page, newAccount('keys'));
});
afterAll(async () => {
  await browser?.close();
});

const consumer = (path: string, bearer: string) => fetch(`${baseUrl()}/api/v1${path}`, { headers: { Authorization: `Bearer ${bearer}` } });

describe('API keys page', () => {
  it('makes a key that is shown once and opens the consumer API; the browser session does not', async () => {
    await page.getByRole('link', { name: 'API keys' }).click();
    await expectVisible(page.getByRole('heading', { name: 'API keys and webhooks' }));
    await checkA11y(page);
    await page.getByLabel('Name').fill('Plant dashboard');
    await page.getByRole('button', { name: 'Make key' }).click();
    const shown = page.getByTestId('shown-once');
    await expectVisible(shown);
    key = (await shown.textContent()) ?? '';
    expect(key).toMatch(/^lariat_/);
    await expectVisible(page.getByRole('cell', { name: 'Plant dashboard' }));
    await page.getByRole('button', { name: 'I have stored it' }).click();
    expect(await page.getByTestId('shown-once').count()).toBe(0);
    expect(await page.content()).not.toContain(key);

    const res = await consumer('/models', key);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ models: [] });
    // The page's own cookies do not open the consumer API.
    const fromPage = await page.evaluate(async () => (await fetch('/api/v1/models')).status);
    expect(fromPage).toBe(401);
  });

  it('revoking the key in the page shuts it at once', async () => {
    page.once('dialog', (d) => void d.accept());
    await page.getByRole('button', { name: 'Revoke' }).click();
    await expectVisible(page.getByRole('cell', { name: 'Revoked' }));
    const res = await consumer('/models', key);
    expect(res.status).toBe(401);
    expect(((await res.json()) as { error: { message: string } }).error.message).toMatch(/revoked/);
  });

  it('refuses a webhook to a private address, with the reason beside the address', async () => {
    await page.getByLabel('Address (https://…)').fill('http://10.0.0.7/hook');
    await page.getByRole('button', { name: 'Add webhook' }).click();
    await expectVisible(page.getByText(/10\.0\.0\.7, a private or loopback address/));
    await checkA11y(page);
  });
});
