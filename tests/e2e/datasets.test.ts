/**
 * Datasets through the real pages: upload with both progress bars shown, inferred types and
 * summaries, a type override (a new version), a second upload (another version), and a one-click
 * import of an open dataset. The upload is slowed with Chromium's network emulation so the transfer
 * bar can be seen.
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { newAccount, signUp } from '../support/e2e-flows';

let browser: Browser;
let context: BrowserContext;
let page: Page;
let workspaceId = '';

beforeAll(async () => {
  browser = await launchBrowser();
  context = await newContext(browser, { colorScheme: 'light' });
  page = await context.newPage();
  workspaceId = await signUp(page, newAccount('analyst'));
});
afterAll(async () => {
  await browser?.close();
});

/** 20,000 rows (~600 KB): a row number, a 1-to-5 grade, a number, and a yes/no column. */
function scoresCsv(shift: number): Buffer {
  const lines = ['id,grade,score,passed'];
  for (let i = 1; i <= 20_000; i++) lines.push(`${i},${1 + (i % 5)},${((i * 7919) % 1000) / 10 + shift},${i % 3 === 0 ? 'yes' : 'no'}`);
  return Buffer.from(`${lines.join('\n')}\n`);
}

async function chooseFile(name: string, content: Buffer): Promise<void> {
  await page.getByLabel('CSV or TSV file').setInputFiles({ name, mimeType: 'text/csv', buffer: content });
}

describe('datasets in the browser', () => {
  it('uploads a CSV with the transfer progress shown, then shows the inferred types and summaries', async () => {
    await page.goto(`/w/${workspaceId}/datasets`);
    await expectVisible(page.getByRole('heading', { name: 'Upload a dataset' }));
    await checkA11y(page, 'datasets page');
    await chooseFile('scores.csv', scoresCsv(0));
    await page.getByLabel('Dataset name').fill('Scores');
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: 200 * 1024 });
    await page.getByRole('button', { name: 'Upload' }).click();
    const transfer = page.getByRole('progressbar', { name: 'Transfer' });
    await expectVisible(transfer);
    await page.waitForFunction(() => Number(document.querySelector('progress[aria-label="Transfer"]')?.getAttribute('value') ?? 0) > 0, undefined, { timeout: 10_000 });
    await cdp.send('Network.emulateNetworkConditions', { offline: false, latency: 0, downloadThroughput: -1, uploadThroughput: -1 });
    await page.waitForURL(/\/datasets\/[^/]+\/versions\/1$/, { timeout: 60_000 });

    await expectVisible(page.getByRole('heading', { name: 'Scores, version 1' }));
    const id = page.locator('[data-column="id"]');
    expect(await id.getByLabel('Type of id').inputValue()).toBe('identifier');
    await expectVisible(id.getByText(/looks like a row number/));
    expect(await id.getByLabel('Use in models').isChecked()).toBe(false);
    const passed = page.locator('[data-column="passed"]');
    expect(await passed.getByLabel('Type of passed').inputValue()).toBe('binary');
    // 20,000 rows, every third one "yes": 6,666 yes and 13,334 no (by construction above).
    await expectVisible(passed.getByText('no (13,334)'));
    const grade = page.locator('[data-column="grade"]');
    expect(await grade.getByLabel('Type of grade').inputValue()).toBe('numeric');
    await expectVisible(grade.getByText(/Only 5 distinct values/));
    await expectVisible(page.getByRole('heading', { name: 'Parse report' }));
    await expectVisible(page.getByRole('heading', { name: 'Preview' }));
    await page.getByRole('button', { name: 'score' }).click();
    await expectVisible(page.locator('th[aria-sort="ascending"]'));
    // Row 1000 has score (1000 * 7919 mod 1000) / 10 = 0, the smallest of the first 1000 rows.
    expect(await page.locator('table[class*="font-mono"] tbody tr:not([aria-hidden]) td:nth-child(3)').first().textContent()).toBe('0');
    await checkA11y(page, 'version page');
    await page.screenshot({ path: 'tests/e2e/screenshots/dataset-version.png' });
  });

  it('overrides a column type, which makes version 2', async () => {
    await page.locator('[data-column="grade"]').getByLabel('Type of grade').selectOption('categorical');
    await page.getByRole('button', { name: 'Save as a new version' }).click();
    await page.waitForURL(/\/versions\/2$/);
    const grade = page.locator('[data-column="grade"]');
    await expectVisible(grade.getByText(/Changed by hand \(inferred: Number\)/));
    expect(await grade.getByLabel('Type of grade').inputValue()).toBe('categorical');
    await expectVisible(page.getByText(/changes the column settings of version 1/));
  });

  it('uploads a second file as the next version and lists every version', async () => {
    await page.getByRole('link', { name: 'All versions' }).click();
    await expectVisible(page.getByRole('heading', { name: 'Upload a new version' }));
    await chooseFile('scores-march.csv', scoresCsv(1));
    await page.getByRole('button', { name: 'Upload' }).click();
    await page.waitForURL(/\/versions\/3$/, { timeout: 60_000 });
    await page.getByRole('link', { name: 'All versions' }).click();
    for (const n of [1, 2, 3]) await expectVisible(page.getByRole('link', { name: `Version ${n}`, exact: true }));
    await expectVisible(page.getByRole('cell', { name: 'scores-march.csv', exact: false }));
    await checkA11y(page, 'dataset page');
  });

  it('imports an open dataset in one click, with its source shown', async () => {
    await page.goto(`/w/${workspaceId}/datasets`);
    await expectVisible(page.getByText(/Least Angle Regression/));
    await page.getByRole('button', { name: 'Import diabetes.csv' }).click();
    await expectVisible(page.getByRole('link', { name: 'Open the imported copy' }), 30_000);
    await expectVisible(page.getByRole('link', { name: 'Diabetes progression (442 patients)' }));
  });

  it('uploads a file of space-separated columns without a header row, and the parse report says so', async () => {
    await page.goto(`/w/${workspaceId}/datasets`);
    const rows = Array.from({ length: 30 }, (_, i) => `   ${(i * 0.5).toFixed(4)}   ${(30 - i).toFixed(4)}  ${i % 2}`);
    await chooseFile('measures.dat', Buffer.from(`${rows.join('\n')}\n`));
    await page.getByLabel('Dataset name').fill('Measures');
    await page.getByLabel('The first row is data, not column names').check();
    await page.getByRole('button', { name: 'Upload' }).click();
    await page.waitForURL(/\/datasets\/[^/]+\/versions\/1$/, { timeout: 60_000 });
    await expectVisible(page.getByRole('heading', { name: 'Measures, version 1' }));
    await expectVisible(page.locator('[data-column="column_1"]'));
    await expectVisible(page.locator('[data-column="column_3"]'));
    expect(await page.getByTestId('parse-report-first-row').textContent()).toBe('First row: data (columns named column_1, column_2, ...).');
    await expectVisible(page.getByText('Delimiter: runs of spaces or tabs (detected).'));
    await expectVisible(page.getByText(/30 rows, 3 columns/));
  });
});
