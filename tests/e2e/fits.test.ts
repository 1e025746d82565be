/**
 * Fits through the real pages, with the real queue and worker: upload the invented demo data, create
 * a model, run a cross-validated elastic-net fit and watch its progress, read the charts and tables,
 * choose the one-standard-error lambda, apply the fit to a table and download the predictions, then
 * run a second version with a changed spec and see both versions side by side. axe-core runs on
 * every page this feature adds.
 */
import fs from 'node:fs';
import Papa from 'papaparse';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { newAccount, signUp } from '../support/e2e-flows';

const DEMO_CSV = 'datasets/demo/harbour-creamery-vats.csv';
const OUTCOME = 'yield_kg_per_100l';
const SHOTS = 'tests/e2e/screenshots';

let browser: Browser;
let context: BrowserContext;
let page: Page;
let workspaceId = '';
let firstFitUrl = '';

/** Columns and rows of the demo file, read here so the expectations follow the data. */
const demo = Papa.parse<string[]>(fs.readFileSync(DEMO_CSV, 'utf8'), { skipEmptyLines: true });
const demoHeader = demo.data[0];
const demoRows = demo.data.length - 1;
const sensorColumns = demoHeader.filter((c) => /^sensor_/.test(c));

beforeAll(async () => {
  browser = await launchBrowser();
  context = await newContext(browser, { colorScheme: 'light', acceptDownloads: true, viewport: { width: 1440, height: 900 } });
  page = await context.newPage();
  workspaceId = await signUp(page, newAccount('fitter'));
  fs.mkdirSync(SHOTS, { recursive: true });
});
afterAll(async () => {
  await browser?.close();
});

/** The number in the picker's "N chosen" line. */
async function chosenCount(): Promise<number> {
  const text = await page.getByText(/^\d[\d,]* chosen$/).textContent();
  return Number(text?.replace(/[^\d]/g, ''));
}

/** Waits for the fit page to show its results (the worker finished), failing with the page's own message otherwise. */
async function waitForResults(): Promise<void> {
  const results = page.getByRole('heading', { name: 'Chosen lambda' });
  const failed = page.getByText('This fit failed.');
  await results.or(failed).first().waitFor({ state: 'visible', timeout: 110_000 });
  if (await failed.isVisible()) throw new Error(`The fit failed: ${await page.getByRole('alert').first().textContent()}`);
}

describe('fits in the browser', () => {
  it('uploads the demo data and shows its columns in the compact, searchable table', async () => {
    await page.goto(`/w/${workspaceId}/datasets`);
    await page.getByLabel('CSV or TSV file').setInputFiles(DEMO_CSV);
    await page.getByLabel('Dataset name').fill('Creamery vats');
    await page.getByRole('button', { name: 'Upload' }).click();
    await page.waitForURL(/\/datasets\/[^/]+\/versions\/1$/, { timeout: 60_000 });
    await expectVisible(page.getByText(`Showing ${demoHeader.length} of ${demoHeader.length} columns`));
    // One compact row per column: the whole 51-column table fits in its scrolling box.
    const box = await page.getByRole('region', { name: /Columns of version 1/ }).boundingBox();
    expect(box?.height).toBeLessThan(600);
    await page.getByLabel('Find columns').fill('sensor_*');
    await expectVisible(page.getByText(`Showing ${sensorColumns.length} of ${demoHeader.length} columns`));
    await page.getByLabel('Find columns').fill('');
    await checkA11y(page, 'dataset version page (compact columns)');
  });

  it('creates a model on the demo data', async () => {
    await page.getByRole('navigation', { name: 'Workspace' }).getByRole('link', { name: 'Models' }).click();
    await expectVisible(page.getByText(/No models yet/));
    await checkA11y(page, 'models page (empty)');
    await page.getByRole('link', { name: 'New model' }).click();
    await expectVisible(page.getByRole('heading', { level: 1, name: 'New model' }));
    await page.getByLabel('Model name').fill('Yield per vat');
    await page.getByLabel('Dataset').selectOption({ label: 'Creamery vats (version 1)' });
    // The outcome list fills in once the dataset's columns are read.
    await page.getByLabel('Outcome').locator(`option[value="${OUTCOME}"]`).waitFor({ state: 'attached' });
    await page.getByLabel('Outcome').selectOption(OUTCOME);
    expect(await page.getByLabel('Family').inputValue()).toBe('gaussian');
    await checkA11y(page, 'new model page');
    await page.getByRole('button', { name: 'Create model and set up the first fit' }).click();
    await page.waitForURL(/\/models\/[^/]+\/run$/);
  });

  it('explains an invalid combination beside its field, then queues a cross-validated elastic-net fit', async () => {
    await expectVisible(page.getByRole('heading', { level: 1, name: 'Yield per vat: run version 1' }));
    await expectVisible(page.locator('[data-column="milk_fat_pct"]'));
    // The outcome cannot be its own predictor.
    expect(await page.getByLabel(`Use ${OUTCOME} as a predictor`).isDisabled()).toBe(true);
    // The mostly blank notes column is not ticked by default (its row is far down the virtualized
    // table), and the form says so beside the predictors and counts the rows kept.
    const rowsNote = page.getByTestId('predictor-rows-note');
    await expectVisible(rowsNote.getByText(/Not ticked by default .*notes, \d+ of \d+ cells blank/));
    await expectVisible(rowsNote.getByText(/Rows the fit will use: /));
    // Leave the sensor columns out: filter by a name pattern, then remove the shown ones.
    const before = await chosenCount();
    await page.getByLabel('Find columns').fill('sensor_*');
    await page.getByRole('button', { name: `Remove the ${sensorColumns.length} shown` }).click();
    expect(await chosenCount()).toBe(before - sensorColumns.length);
    await page.getByLabel('Find columns').fill('');

    await page.getByRole('radio', { name: /Elastic net/ }).check();
    // Elastic net without its L1 share: explained next to the field before anything is sent.
    await expectVisible(page.getByText('Elastic net needs an L1 share between 0 and 1.'));
    await page.getByLabel('L1 share').fill('0.5');
    await expect.poll(() => page.getByText('Elastic net needs an L1 share between 0 and 1.').count()).toBe(0);
    await page.getByLabel('Folds', { exact: true }).fill('5');
    // A penalty weight for a column that is not a chosen predictor: explained as it is typed.
    const weights = page.getByLabel(/Penalty weights/);
    await weights.fill('milk_fat_pct = 0\nsensor_01 = 2');
    await expectVisible(page.getByText('"sensor_01" has a penalty weight but is not a chosen predictor.'));
    await weights.fill('milk_fat_pct = 0');
    await expect.poll(() => page.getByText(/has a penalty weight/).count()).toBe(0);
    await checkA11y(page, 'fit form');
    await page.screenshot({ path: `${SHOTS}/fit-form.png`, fullPage: true });
    await page.getByRole('button', { name: 'Run the fit' }).click();
    await page.waitForURL(/\/fits\/[^/]+$/);
    firstFitUrl = page.url();
  });

  it('shows live progress while the fit waits and runs, then the results', async () => {
    await expectVisible(page.getByRole('heading', { level: 1, name: 'Yield per vat, version 1' }));
    // The fit was just queued, so the page opens on its progress (or, on a very fast worker, its results).
    const progress = page.getByRole('progressbar', { name: 'Fit progress' });
    const results = page.getByRole('heading', { name: 'Chosen lambda' });
    await progress.or(results).first().waitFor({ state: 'visible', timeout: 30_000 });
    if (await progress.isVisible()) {
      await expectVisible(page.getByText('Folds done'));
      await checkA11y(page, 'fit page (in progress)');
      await page.screenshot({ path: `${SHOTS}/fit-progress.png` });
    }
    await waitForResults();
    await expect.poll(() => progress.count()).toBe(0);
  });

  it('reads the charts and tables of the results workspace', async () => {
    await expectVisible(page.getByTestId('rows-used').getByText(/Rows fitted: [\d,]+ of [\d,]+/));
    await expectVisible(page.getByRole('heading', { name: 'Read results with care' }));
    const cv = page.locator('figure[data-chart="cv"]');
    await expectVisible(cv.getByRole('heading', { name: 'Cross-validation' }));
    expect(await cv.locator('svg path').count()).toBeGreaterThan(0);
    await expectVisible(cv.getByText(/^Nonzero terms$/));
    const paths = page.locator('figure[data-chart="paths"]');
    const drawn = await paths.getByRole('list', { name: 'Terms drawn' }).getByRole('listitem').count();
    expect(drawn).toBeGreaterThan(0);
    expect(drawn).toBeLessThanOrEqual(10);
    // Hovering a path names it.
    const plot = paths.locator('svg').first();
    await plot.scrollIntoViewIfNeeded();
    const box = await plot.boundingBox();
    if (!box) throw new Error('The path chart has no box');
    await page.mouse.move(box.x + box.width * 0.6, box.y + box.height * 0.5, { steps: 5 });
    await expectVisible(page.getByText(/\(position \d+\)/));

    const coefficients = page.getByRole('table', { name: 'Coefficients at the chosen lambda' });
    expect(await coefficients.locator('tbody tr:not([aria-hidden])').count()).toBeGreaterThan(0);
    // No sensor column was offered, so none can have a coefficient.
    expect(await coefficients.getByText(/^sensor_/).count()).toBe(0);
    await expectVisible(page.getByRole('columnheader', { name: /Kept in folds/ }));
    await expectVisible(page.getByRole('heading', { name: 'Solver certificates' }));
    expect(await page.getByRole('table', { name: 'Solver certificate per lambda' }).locator('tbody tr:not([aria-hidden])').count()).toBeGreaterThan(0);
    await expectVisible(page.getByRole('heading', { name: 'Diagnostics at the chosen lambda' }), 60_000);
    await expectVisible(page.locator('figure[data-chart="qq"]'));
    await expectVisible(page.getByRole('heading', { name: 'Unpenalized refit on the selected terms' }));
    await expectVisible(page.getByText('After selection.'));
    await checkA11y(page, 'fit page (results)');
  });

  it('picks the minimum, then the one-standard-error lambda, and keeps the choice', async () => {
    const chosen = page.getByTestId('chosen-lambda');
    await page.getByRole('button', { name: 'Use the CV minimum' }).click();
    await expect.poll(() => chosen.textContent()).toContain('chosen by the CV minimum');
    await page.getByRole('button', { name: 'Use the one-standard-error lambda' }).click();
    await expect.poll(() => chosen.textContent()).toContain('chosen by the one-standard-error rule');
    // The chosen lambda is the one the CV chart marks as the one-standard-error choice.
    const legend = (await page.getByText(/^One standard error: lambda /).textContent()) ?? '';
    const oneSe = legend.replace('One standard error: lambda ', '');
    expect(await chosen.locator('strong').textContent()).toBe(oneSe);
    // Stored with the version: a reload shows the same choice.
    await page.reload();
    await expect.poll(() => page.getByTestId('chosen-lambda').textContent(), { timeout: 20_000 }).toContain('chosen by the one-standard-error rule');
    await page.screenshot({ path: `${SHOTS}/fit-results.png`, fullPage: true });
  });

  it('applies the fit to the dataset version and downloads the predictions', async () => {
    await expectVisible(page.getByRole('heading', { name: 'Apply to a table' }));
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Download predictions' }).click()]);
    const parsed = Papa.parse<Record<string, string>>(fs.readFileSync(await download.path(), 'utf8'), { header: true, skipEmptyLines: true, comments: '#' });
    expect(parsed.meta.fields?.slice(0, 2)).toEqual(['row', 'linear_predictor']);
    // The cautions travel with the file, as comment lines after the rows.
    expect(fs.readFileSync(await download.path(), 'utf8')).toContain('# Selected is not causal.');
    // One prediction per row of the table it was applied to; a row is either scored or says why not.
    expect(parsed.data.length).toBe(demoRows);
    const scored = parsed.data.filter((r) => r.linear_predictor !== '' && Number.isFinite(Number(r.linear_predictor)));
    expect(scored.length).toBeGreaterThan(0);
    for (const r of parsed.data) if (r.linear_predictor === '') expect(r.error).not.toBe('');
    // The demo's `notes` column is blank in about half the rows and so is not a default predictor:
    // those rows are scored unless another column is blank too, and no error names notes.
    const notes = demoHeader.indexOf('notes');
    const notesMissing = demo.data.slice(1).map((r) => r[notes].trim() === '');
    expect(notesMissing.filter(Boolean).length).toBeGreaterThan(0);
    expect(parsed.data.filter((r, i) => notesMissing[i] && r.error === '' && r.linear_predictor !== '').length).toBeGreaterThan(0);
    expect(parsed.data.some((r) => /notes/.test(r.error))).toBe(false);
  });

  it('scores an uploaded CSV file, one prediction per uploaded row', async () => {
    // The first 25 rows of the demo file, with the fat value of the first complete row made unreadable.
    const fat = demoHeader.indexOf('milk_fat_pct');
    const first = demo.data.slice(1, 26);
    const target = first.findIndex((r) => r.every((v) => v.trim() !== ''));
    expect(target).toBeGreaterThanOrEqual(0);
    const rows = first.map((r, i) => (i === target ? r.map((v, j) => (j === fat ? 'lots' : v)) : r));
    const csv = Papa.unparse([demoHeader, ...rows]);
    await page.getByLabel('Or a CSV file').setInputFiles({ name: 'new-vats.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) });
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('button', { name: 'Score the file' }).click()]);
    expect(download.suggestedFilename()).toBe('new-vats-predictions.csv');
    const parsed = Papa.parse<Record<string, string>>(fs.readFileSync(await download.path(), 'utf8'), { header: true, skipEmptyLines: true, comments: '#' });
    expect(parsed.data.length).toBe(25);
    // That row has text where a number belongs: not scored, and the reason names the column.
    expect(parsed.data[target].linear_predictor).toBe('');
    expect(parsed.data[target].error).toMatch(/milk_fat_pct/);
    await expectVisible(page.getByText(/Saved new-vats-predictions\.csv\./));
  });

  it('runs a second version with a changed spec and lists both versions', async () => {
    await page.getByRole('link', { name: 'Run again with changes' }).click();
    await expectVisible(page.getByRole('heading', { level: 1, name: 'Yield per vat: run version 2' }));
    // The form starts from version 1's settings.
    expect(await page.getByLabel('L1 share').inputValue()).toBe('0.5');
    await page.getByLabel('L1 share').fill('0.9');
    await page.getByRole('button', { name: 'Run the fit' }).click();
    await page.waitForURL((url) => /\/fits\/[^/]+$/.test(url.pathname) && url.href !== firstFitUrl);
    await expectVisible(page.getByRole('heading', { level: 1, name: 'Yield per vat, version 2' }));
    await waitForResults();
    const changes = page.getByRole('list', { name: 'Changes' });
    await expectVisible(changes.getByRole('listitem').filter({ hasText: /L1|l1Share/ }));

    await page.getByRole('link', { name: 'All versions' }).click();
    await expectVisible(page.getByRole('heading', { name: 'Versions' }));
    await expectVisible(page.getByRole('link', { name: 'Version 1', exact: true }));
    await expectVisible(page.getByRole('link', { name: 'Version 2', exact: true }));
    await checkA11y(page, 'model page');
    await page.screenshot({ path: `${SHOTS}/model-versions.png`, fullPage: true });

    await page.getByRole('link', { name: 'All models' }).click();
    const row = page.locator('[data-model="Yield per vat"]');
    await expectVisible(row.getByRole('link', { name: 'Version 2' }));
    await checkA11y(page, 'models page');
  });

  it('cancels a long fit from its progress panel', async () => {
    await page.getByRole('link', { name: /^Yield per vat$/ }).click();
    await page.getByRole('link', { name: 'Run a new version' }).click();
    await expectVisible(page.getByRole('heading', { level: 1, name: 'Yield per vat: run version 3' }));
    // Many lambdas over many folds at a tight tolerance: long enough to cancel by hand.
    await page.getByLabel('Number of lambdas').fill('500');
    await page.getByLabel('Folds', { exact: true }).fill('50');
    await page.getByLabel(/Tolerance/).fill('1e-12');
    await page.getByRole('button', { name: 'Run the fit' }).click();
    await expectVisible(page.getByRole('heading', { level: 1, name: 'Yield per vat, version 3' }));
    await expectVisible(page.getByRole('progressbar', { name: 'Fit progress' }));
    await page.getByRole('button', { name: 'Cancel this fit' }).click();
    // Said once, with who did it (not "This fit was cancelled: Cancelled by …").
    await expectVisible(page.getByText(/^This fit was cancelled by .+\.$/), 30_000);
    expect(await page.getByRole('progressbar', { name: 'Fit progress' }).count()).toBe(0);
    expect(await page.getByRole('heading', { name: 'Chosen lambda' }).count()).toBe(0);
  });
});
