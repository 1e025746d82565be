/**
 * Issue 8 item 9: the built client runs under the server's content security policy without a single
 * violation (pages with forms, tables, charts, the bundled fonts, both themes), and the security
 * headers are on every answer.
 */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectVisible, launchBrowser, newContext } from '../support/browser';
import { csrfHeader, newAccount, signUp } from '../support/e2e-flows';

let browser: Browser;
let context: BrowserContext;
let page: Page;
const violations: string[] = [];

beforeAll(async () => {
  browser = await launchBrowser();
  context = await newContext(browser);
  // Recorded in the page before any script of ours runs, and reported back through a binding.
  await context.exposeBinding('reportCsp', (_source, text: string) => {
    violations.push(text);
  });
  await context.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      (window as unknown as { reportCsp(t: string): void }).reportCsp(`${e.violatedDirective} blocked ${e.blockedURI} at ${e.sourceFile}:${e.lineNumber}:${e.columnNumber} ${e.sample}`);
    });
  });
  page = await context.newPage();
  page.on('console', (m) => {
    if (/Content Security Policy/i.test(m.text())) violations.push(m.text());
  });
});

afterAll(async () => {
  await browser?.close();
});

const CSV = ['id,score,grade,passed', ...Array.from({ length: 200 }, (_, i) => `${i + 1},${(i * 37) % 100},${(i % 5) + 1},${i % 3 === 0 ? 'yes' : 'no'}`)].join('\n');

describe('content security policy', () => {
  it('lets every page of the built client run without a violation', async () => {
    await page.goto('/sign-in');
    await expectVisible(page.getByRole('heading', { name: 'Sign in', level: 1 }));
    await page.goto('/forgot-password');
    await expectVisible(page.getByRole('button', { name: 'Send reset link' }));
    const workspaceId = await signUp(page, newAccount('headers'));

    const uploaded = await context.request.post(`/api/workspaces/${workspaceId}/datasets/uploads`, {
      headers: await csrfHeader(context),
      multipart: { name: 'Scores for headers', file: { name: 'scores.csv', mimeType: 'text/csv', buffer: Buffer.from(CSV) } },
    });
    expect(uploaded.status(), await uploaded.text()).toBe(201);
    const { datasetId } = (await uploaded.json()) as { datasetId: string };
    await page.goto(`/w/${workspaceId}/datasets/${datasetId}/versions/1`);
    await expectVisible(page.getByRole('heading', { name: 'Scores for headers, version 1' }));
    await page.getByRole('button', { name: 'Use the dark theme' }).click();
    for (const area of ['datasets', 'models', 'members', 'outbox', 'account', 'no-such-area']) {
      await page.goto(`/w/${workspaceId}/${area}`);
      await page.locator('main h1').first().waitFor();
    }
    // Fonts load lazily: make sure the bundled Lato faces were really fetched under the policy.
    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      return [...document.fonts].filter((f) => f.family.includes('Lato') && f.status === 'loaded').length;
    });
    expect(fonts).toBeGreaterThan(0);
    expect(violations).toEqual([]);
  });
});

describe('security headers', () => {
  it('sends the policy, no-referrer, nosniff and no framing on pages and API answers, and no HSTS over http', async () => {
    for (const path of ['/', '/sign-in', '/api/health', '/api/no-such-route']) {
      const res = await context.request.get(path);
      const h = res.headers();
      expect(h['content-security-policy'], path).toContain("frame-ancestors 'none'");
      expect(h['content-security-policy'], path).toContain("script-src 'self'");
      expect(h['content-security-policy'], path).not.toContain('unsafe-inline');
      expect(h['referrer-policy'], path).toBe('no-referrer');
      expect(h['x-content-type-options'], path).toBe('nosniff');
      expect(h['x-frame-options'], path).toBe('DENY');
      expect(h['strict-transport-security'], path).toBeUndefined();
    }
  });
});
