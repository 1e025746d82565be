/** Forgot password -> e-mailed link -> new password; the old one stops working. */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { newAccount, signIn, signUp, waitForEmail } from '../support/e2e-flows';

let browser: Browser;
let adminContext: BrowserContext;
let visitorContext: BrowserContext;
let visitor: Page;
const admin = newAccount('keeper');
const forgetful = newAccount('forgetful');
const NEW_PASSWORD = 'amber-harbour-lights-83';

beforeAll(async () => {
  browser = await launchBrowser();
  // The outbox is for admins: one stays signed in to read the captured e-mail.
  adminContext = await newContext(browser);
  await signUp(await adminContext.newPage(), admin);
  visitorContext = await newContext(browser);
  visitor = await visitorContext.newPage();
  await signUp(visitor, forgetful);
  await visitorContext.clearCookies();
});

afterAll(async () => {
  await browser?.close();
});

describe('password reset', () => {
  it('accepts a reset request without saying whether the account exists', async () => {
    await visitor.goto('/forgot-password');
    await visitor.getByLabel('E-mail').fill(forgetful.email);
    await visitor.getByRole('button', { name: 'Send reset link' }).click();
    await expectVisible(visitor.getByText(/a reset link is on its way/));
  });

  it('sets a new password from the e-mailed link', async () => {
    const { link } = await waitForEmail(adminContext, forgetful.email, '/reset-password/');
    await visitor.goto(new URL(link).pathname);
    await expectVisible(visitor.getByRole('heading', { name: 'Choose a new password' }));
    await checkA11y(visitor, 'reset-password page');

    await visitor.getByLabel('New password', { exact: true }).fill(NEW_PASSWORD);
    await visitor.getByLabel('New password, again').fill('something-else-entirely-1');
    await visitor.getByRole('button', { name: 'Set new password' }).click();
    await expectVisible(visitor.getByText('The two passwords differ.'));

    await visitor.getByLabel('New password, again').fill(NEW_PASSWORD);
    await visitor.getByRole('button', { name: 'Set new password' }).click();
    await expectVisible(visitor.getByRole('heading', { name: 'Password changed' }));
  });

  it('refuses the old password and accepts the new one', async () => {
    await signIn(visitor, forgetful.email, forgetful.password);
    // The refusal shows next to the password field (or above the form, if the server names no field).
    await expectVisible(visitor.locator('[id$="-error"]').or(visitor.getByRole('alert')));
    expect(visitor.url()).toMatch(/\/sign-in$/);
    await signIn(visitor, forgetful.email, NEW_PASSWORD);
    await visitor.waitForURL(/\/w\/[^/]+\/datasets$/);
  });

  it('does not accept the same link twice', async () => {
    const { link } = await waitForEmail(adminContext, forgetful.email, '/reset-password/');
    const response = await visitorContext.request.post('/api/auth/password-reset/complete', {
      data: { token: decodeURIComponent(new URL(link).pathname.split('/').pop() ?? ''), password: 'yet-another-password-71' },
      headers: Object.fromEntries((await visitorContext.cookies()).filter((c) => c.name === 'lariat_csrf').map((c) => ['X-Lariat-CSRF', c.value])),
    });
    expect(response.status()).toBeGreaterThanOrEqual(400);
    expect(response.status()).toBeLessThan(500);
  });
});
