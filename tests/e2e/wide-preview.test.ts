/**
 * A wide table's version page stays usable: the preview draws only the columns in view (a
 * 2,000-column upload once put every row's 2,000 cells in the page, and 5,000 columns froze the tab
 * for tens of seconds), and scrolling sideways brings the far columns in.
 */
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { newAccount, signUp } from '../support/e2e-flows';

const COLUMNS = 2_000;
const ROWS = 40;

let browser: Browser;
let page: Page;
let workspaceId = '';

beforeAll(async () => {
  browser = await launchBrowser();
  page = await (await newContext(browser, { colorScheme: 'light' })).newPage();
  workspaceId = await signUp(page, newAccount('wide'));
});
afterAll(async () => {
  await browser?.close();
});

/** ROWS x COLUMNS numbers named c_1 ... c_2000 (invented). */
function wideCsv(): Buffer {
  const lines = [Array.from({ length: COLUMNS }, (_, j) => `c_${j + 1}`).join(',')];
  for (let i = 0; i < ROWS; i++) lines.push(Array.from({ length: COLUMNS }, (_, j) => ((i * 31 + j * 17) % 97) / 10).join(','));
  return Buffer.from(`${lines.join('\n')}\n`);
}

describe('a wide table in the browser', () => {
  it('previews a 2,000-column version with only the columns in view drawn', async () => {
    await page.goto(`/w/${workspaceId}/datasets`);
    await page.getByLabel('CSV or TSV file').setInputFiles({ name: 'wide.csv', mimeType: 'text/csv', buffer: wideCsv() });
    await page.getByLabel('Dataset name').fill('Wide');
    await page.getByRole('button', { name: 'Upload' }).click();
    await page.waitForURL(/\/datasets\/[^/]+\/versions\/1$/, { timeout: 60_000 });
    const preview = page.getByLabel('Preview rows');
    await expectVisible(preview.getByRole('button', { name: 'c_1', exact: true }), 30_000);
    const drawn = await preview.locator('tbody td').count();
    // Every row is in view here (40 rows), so without column virtualization this is 80,000.
    expect(drawn).toBeGreaterThan(0);
    expect(drawn).toBeLessThan(ROWS * 50);
    expect(await preview.getByRole('button', { name: `c_${COLUMNS}`, exact: true }).count()).toBe(0);
    await preview.evaluate((el) => {
      el.scrollLeft = el.scrollWidth;
    });
    await expectVisible(preview.getByRole('button', { name: `c_${COLUMNS}`, exact: true }));
    expect(await preview.locator('tbody td').count()).toBeLessThan(ROWS * 50);
    await checkA11y(page, 'dataset version page (2,000 columns)');
  });
});
