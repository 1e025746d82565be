/**
 * A fit through review and release in the browser: the analyst asks for a review; the reviewer opens
 * the link in the captured e-mail, comments on one coefficient and approves; the analyst, told by
 * e-mail, releases the approved fit with release notes; the admin reads the audit log; a consumer key
 * then scores rows with the same predictions as the fit's own predictions download. The team and
 * the fit are set up over the API (the fits' own browser test covers those pages); axe-core runs on
 * every page this feature adds.
 */
import fs from 'node:fs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { regressionCsv } from '../api/fits/data';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { PASSWORD, csrfHeader, mailedLink, newAccount, signUp, uniqueEmail } from '../support/e2e-flows';

const SHOTS = 'tests/e2e/screenshots';
let browser: Browser;
let adminContext: BrowserContext;
let admin: Page;
let analystContext: BrowserContext;
let analyst: Page;
let reviewerContext: BrowserContext;
let reviewer: Page;
let workspaceId = '';
let fitId = '';
const analystEmail = uniqueEmail('analyst');
const reviewerEmail = uniqueEmail('reviewer');

/** The admin invites over the API; the invitee accepts the e-mailed link in their own browser profile. */
async function join(context: BrowserContext, email: string, role: string, name: string): Promise<void> {
  const invited = await adminContext.request.post(`/api/workspaces/${workspaceId}/invitations`, { data: { email, role }, headers: await csrfHeader(adminContext) });
  expect(invited.status()).toBe(201);
  const token = new URL(await mailedLink(email, '/invitations/')).pathname.split('/').pop()!;
  const accepted = await context.request.post(`/api/invitations/${token}/accept`, { data: { name, password: PASSWORD } });
  expect(accepted.status(), await accepted.text()).toBe(201);
}

beforeAll(async () => {
  browser = await launchBrowser();
  adminContext = await newContext(browser);
  admin = await adminContext.newPage();
  workspaceId = await signUp(admin, newAccount('owner'));
  analystContext = await newContext(browser);
  analyst = await analystContext.newPage();
  reviewerContext = await newContext(browser);
  reviewer = await reviewerContext.newPage();
  await join(analystContext, analystEmail, 'analyst', 'Ana Analyst');
  await join(reviewerContext, reviewerEmail, 'reviewer', 'Rey Reviewer');

  // The analyst's data, model and one finished fit, over the API.
  const api = analystContext.request;
  const headers = await csrfHeader(analystContext);
  const base = `/api/workspaces/${workspaceId}`;
  const uploaded = await api.post(`${base}/datasets/uploads`, { headers, multipart: { name: 'Vats', file: { name: 'vats.csv', mimeType: 'text/csv', buffer: Buffer.from(regressionCsv(150, 2)) } } });
  expect(uploaded.status(), await uploaded.text()).toBe(201);
  const { datasetId } = (await uploaded.json()) as { datasetId: string };
  const model = await api.post(`${base}/models`, { headers, data: { name: 'Vat yield', datasetId, outcome: 'y', family: 'gaussian' } });
  expect(model.status()).toBe(201);
  const modelId = ((await model.json()) as { id: string }).id;
  const run = await api.post(`${base}/models/${modelId}/fits`, { headers, data: { predictors: ['x1', 'x2', 'g'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 12 }, cv: { kind: 'folds', folds: 4, seed: 3 } } });
  expect(run.status()).toBe(202);
  fitId = ((await run.json()) as { id: string }).id;
  const deadline = Date.now() + 150_000;
  for (;;) {
    const fit = (await (await api.get(`${base}/fits/${fitId}`)).json()) as { status: string };
    if (fit.status === 'finished') break;
    if (fit.status === 'failed' || fit.status === 'cancelled' || Date.now() > deadline) throw new Error(`fit ${fit.status}`);
    await new Promise((r) => setTimeout(r, 300));
  }
  fs.mkdirSync(SHOTS, { recursive: true });
}, 240_000);
afterAll(async () => {
  await browser?.close();
});

describe('review and release in the browser', () => {
  let reviewUrl = '';

  it('the analyst asks for a review of the finished version', async () => {
    await analyst.goto(`/w/${workspaceId}/reviews`);
    await expectVisible(analyst.getByRole('heading', { level: 1, name: 'Reviews' }));
    const form = analyst.getByRole('form', { name: 'Ask for a review' });
    await form.getByLabel('Model').selectOption({ label: 'Vat yield' });
    await form.getByLabel('Version').selectOption({ label: 'Version 1' });
    await form.getByLabel('Note for the reviewers').fill('First version: three predictors.');
    await checkA11y(analyst, 'reviews page with the request form');
    await form.getByRole('button', { name: 'Ask for a review' }).click();
    await analyst.waitForURL(new RegExp(`/w/${workspaceId}/reviews/[0-9a-f-]{36}$`));
    await expectVisible(analyst.getByRole('heading', { level: 1, name: 'Review of Vat yield, version 1' }));
    await expectVisible(analyst.getByText('Waiting for a reviewer'));
    await expectVisible(analyst.getByText('You asked for this review: someone else decides it.'));
    reviewUrl = new URL(analyst.url()).pathname;
  });

  it('the reviewer follows the link in the e-mail, comments on one coefficient and approves', async () => {
    const link = await mailedLink(reviewerEmail, `/w/${workspaceId}/reviews/`);
    expect(new URL(link).pathname).toBe(reviewUrl);
    await reviewer.goto(new URL(link).pathname);
    await expectVisible(reviewer.getByRole('heading', { level: 1, name: 'Review of Vat yield, version 1' }));
    await expectVisible(reviewer.getByRole('heading', { name: 'Read results with care' }));
    await expectVisible(reviewer.getByText('Note from Ana Analyst:'));
    await reviewer.getByRole('button', { name: 'Comment on x1' }).click();
    expect(await reviewer.getByLabel('About').inputValue()).toBe('x1');
    await reviewer.getByLabel('Comment', { exact: true }).fill('The x1 effect looks plausible; keep an eye on its stability.');
    await reviewer.getByRole('button', { name: 'Add the comment' }).click();
    await expectVisible(reviewer.getByText('The x1 effect looks plausible; keep an eye on its stability.'));
    await expectVisible(reviewer.getByText('on x1'));
    await checkA11y(reviewer, 'review page (reviewer, waiting)');
    await reviewer.screenshot({ path: `${SHOTS}/review-light.png`, fullPage: true });
    await reviewer.getByRole('button', { name: 'Approve' }).click();
    await expectVisible(reviewer.getByText(/Approved by Rey Reviewer/));
    expect(await reviewer.getByRole('button', { name: 'Approve' }).count()).toBe(0);
  });

  it('the analyst is told by e-mail and in the app, then releases the approved fit with notes', async () => {
    const link = await mailedLink(analystEmail, `/w/${workspaceId}/reviews/`);
    expect(new URL(link).pathname).toBe(reviewUrl);
    await analyst.goto(`/w/${workspaceId}/reviews`);
    await expectVisible(analyst.getByRole('link', { name: /Rey Reviewer approved Vat yield, version 1/ }));
    await analyst.getByRole('navigation', { name: 'Workspace' }).getByRole('link', { name: 'Releases' }).click();
    await expectVisible(analyst.getByRole('heading', { level: 1, name: 'Releases' }));
    const form = analyst.getByRole('form', { name: 'Release an approved fit' });
    await form.getByLabel('Approved fit').selectOption({ index: 1 });
    await form.getByLabel('Release notes').fill('First release of the vat yield model.');
    await form.getByRole('button', { name: 'Release' }).click();
    await expectVisible(analyst.getByText('Vat yield: release 1 is now current.'));
    const releases = analyst.getByRole('region', { name: 'Releases of Vat yield' });
    await expectVisible(releases.getByText('Current'));
    await expectVisible(releases.getByText('First release of the vat yield model.'));
    await checkA11y(analyst, 'releases page (analyst)');
    await analyst.screenshot({ path: `${SHOTS}/releases-light.png`, fullPage: true });
  });

  it('the reviewer is e-mailed about the release and cannot release; the admin reads the audit log', async () => {
    const link = await mailedLink(reviewerEmail, `/w/${workspaceId}/releases`);
    expect(new URL(link).searchParams.get('model')).toBeTruthy();
    await reviewer.goto(new URL(link).pathname + new URL(link).search);
    await expectVisible(reviewer.getByText('First release of the vat yield model.'));
    expect(await reviewer.getByRole('form', { name: 'Release an approved fit' }).count()).toBe(0);
    const forced = await reviewerContext.request.post(`/api/workspaces/${workspaceId}/releases/${'0'.repeat(8)}-0000-4000-8000-000000000000/restore`, { data: { notes: 'x' }, headers: await csrfHeader(reviewerContext) });
    expect(forced.status()).toBe(403);

    await admin.goto(`/w/${workspaceId}/releases`);
    const audit = admin.getByRole('region', { name: 'Audit log' });
    await expectVisible(audit.getByText('release.published'));
    await expectVisible(audit.getByText('review.approved'));
    await expectVisible(audit.getByText('review.requested'));
    const csv = await adminContext.request.get(`/api/workspaces/${workspaceId}/audit.csv`);
    expect(csv.status()).toBe(200);
    expect((await csv.text()).split('\n').filter((l) => l.includes(',release.published,'))).toHaveLength(1);
    await checkA11y(admin, 'releases page with the audit log (admin)');
  });

  it('a consumer key then scores rows over HTTP with the same predictions as the fit\'s own predictions', async () => {
    const made = await adminContext.request.post(`/api/workspaces/${workspaceId}/keys`, { data: { name: 'Dashboard', scope: 'workspace', expiresInDays: 30 }, headers: await csrfHeader(adminContext) });
    expect(made.status(), await made.text()).toBe(201);
    const { key } = (await made.json()) as { key: string };
    const fit = (await (await analystContext.request.get(`/api/workspaces/${workspaceId}/fits/${fitId}`)).json()) as { modelId: string; datasetVersion: { id: string } };
    const [header, ...lines] = regressionCsv(150, 2).trim().split('\n');
    const names = header.split(',');
    const rows = lines.slice(0, 25).map((line) => Object.fromEntries(line.split(',').map((v, k) => [names[k], names[k] === 'g' || names[k] === 'yes' ? v : Number(v)])));
    const scored = await reviewerContext.request.post(`/api/v1/models/${fit.modelId}/score`, { data: { rows }, headers: { Authorization: `Bearer ${key}` } });
    expect(scored.status(), await scored.text()).toBe(200);
    const body = (await scored.json()) as { rows: { row: number; linearPredictor: number | null; error: string | null }[]; fitId: string };
    expect(body.fitId).toBe(fitId);
    const csv = await (await analystContext.request.get(`/api/workspaces/${workspaceId}/fits/${fitId}/predictions?datasetVersionId=${fit.datasetVersion.id}`)).text();
    const predicted = csv.split('\n').filter((l) => l && !l.startsWith('#')).slice(1).map((l) => Number(l.split(',')[1]));
    for (let i = 0; i < rows.length; i++) {
      const a = body.rows[i].linearPredictor!;
      const b = predicted[i];
      expect(body.rows[i].error).toBeNull();
      expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(a), Math.abs(b)));
    }
  });

  it('compares the released version with a second one through a shareable link', async () => {
    const api = analystContext.request;
    const headers = await csrfHeader(analystContext);
    const fit = (await (await api.get(`/api/workspaces/${workspaceId}/fits/${fitId}`)).json()) as { modelId: string };
    const run = await api.post(`/api/workspaces/${workspaceId}/models/${fit.modelId}/fits`, { headers, data: { predictors: ['x1', 'x2', 'g', 'n1', 'n2'], penalty: 'lasso', path: { kind: 'automatic', pathLength: 12 }, cv: { kind: 'folds', folds: 4, seed: 3 } } });
    const second = ((await run.json()) as { id: string }).id;
    const deadline = Date.now() + 150_000;
    while (((await (await api.get(`/api/workspaces/${workspaceId}/fits/${second}`)).json()) as { status: string }).status !== 'finished') {
      if (Date.now() > deadline) throw new Error('second fit did not finish');
      await new Promise((r) => setTimeout(r, 300));
    }
    await reviewer.goto(`/w/${workspaceId}/compare?fits=${fitId},${second}`);
    await expectVisible(reviewer.getByRole('heading', { name: 'The fits at their chosen lambdas' }));
    await expectVisible(reviewer.getByRole('heading', { name: 'Vat yield v2 against Vat yield v1' }));
    await expectVisible(reviewer.getByText(/Predictors: added n1/));
    await expectVisible(reviewer.getByRole('heading', { name: 'Read results with care' }));
    await checkA11y(reviewer, 'compare page');
    await reviewer.screenshot({ path: `${SHOTS}/compare-light.png`, fullPage: true });
  });
});
