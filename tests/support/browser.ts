/**
 * Chromium for the browser tests: Debian's build driven by playwright-core (no browser download),
 * a fresh context per test file, and an accessibility check with axe-core.
 */
import axe from 'axe-core';
import { chromium, type Browser, type BrowserContext, type BrowserContextOptions, type Locator, type Page } from 'playwright-core';
import { inject } from 'vitest';

export function baseUrl(): string {
  return inject('baseUrl');
}

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.LARIAT_CHROMIUM ?? '/usr/bin/chromium',
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    headless: true,
  });
}

/** A clean browser profile (no cookies, no storage) pointed at the test server. */
export function newContext(browser: Browser, options: BrowserContextOptions = {}): Promise<BrowserContext> {
  return browser.newContext({ baseURL: baseUrl(), viewport: { width: 1280, height: 800 }, ...options });
}

interface AxeViolation {
  id: string;
  impact?: string | null;
  help: string;
  nodes: { target: unknown[]; summary?: string }[];
}

/**
 * Runs axe-core on the page as it is now and fails on serious or critical violations, listing each
 * rule with the elements it found. Moderate/minor findings are not failures (they are often
 * judgement calls), but they are printed so they stay visible.
 */
export async function checkA11y(page: Page, where = page.url()): Promise<void> {
  const loaded = await page.evaluate(() => typeof (window as unknown as { axe?: unknown }).axe !== 'undefined');
  // Evaluated through the DevTools protocol rather than an inline <script> tag, which the server's
  // content security policy (rightly) blocks.
  if (!loaded) await page.evaluate(axe.source);
  const violations = await page.evaluate(async () => {
    const result = await (window as unknown as { axe: typeof axe }).axe.run(document, { resultTypes: ['violations'] });
    return result.violations.map((v) => ({ id: v.id, impact: v.impact, help: v.help, nodes: v.nodes.map((n) => ({ target: n.target, summary: n.failureSummary?.split('\n').slice(1).join(' ') })) }));
  });
  const describe = (v: AxeViolation) =>
    `  [${v.impact}] ${v.id}: ${v.help}\n${v.nodes.map((n) => `      at ${JSON.stringify(n.target)}${n.summary ? `: ${n.summary}` : ''}`).join('\n')}`;
  const minor = violations.filter((v: AxeViolation) => v.impact !== 'serious' && v.impact !== 'critical');
  if (minor.length > 0) console.warn(`axe (not failing) on ${where}:\n${minor.map(describe).join('\n')}`);
  const bad = violations.filter((v: AxeViolation) => v.impact === 'serious' || v.impact === 'critical');
  if (bad.length > 0) throw new Error(`Accessibility problems on ${where}:\n${bad.map(describe).join('\n')}`);
}

/** Waits (up to `timeout`) for the element to be visible; fails naming the locator otherwise. */
export async function expectVisible(locator: Locator, timeout = 10_000): Promise<void> {
  try {
    await locator.first().waitFor({ state: 'visible', timeout });
  } catch {
    throw new Error(`Expected to see ${locator.toString()} within ${timeout} ms`);
  }
}
