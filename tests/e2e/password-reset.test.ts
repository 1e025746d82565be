/** Forgot password -> e-mailed link -> new password; the old one stops working. */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { newAccount, signIn, signUp, waitForEmail } from '../support/e2e-flows';

let browser: Browser;
let mailContext: BrowserContext;
let visitorContext: BrowserContext;
let visitor: Page;
const forgetful = newAccount('forgetful');
const NEW_PASSWORD = 'amber-harbour-lights-83';
/** The e-mailed reset link, read once: completing the reset signs out the session that read it. */
let resetLink = '';

beforeAll(async () => {
  browser = await launchBrowser();
  // The outbox shows each person only their own mail: a second browser stays signed in as the
  // forgetful person (a phone still signed in, say) to read it.
  mailContext = await newContext(browser);
  await signUp(await mailContext.newPage(), forgetful);
  visitorContext = await newContext(browser);
  visitor = await visitorContext.newPage();
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
    resetLink = (await waitForEmail(mailContext, forgetful.email, '/reset-password/')).link;
    await visitor.goto(new URL(resetLink).pathname);
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
    expect(resetLink).toContain('/reset-password/');
    const response = await visitorContext.request.post('/api/auth/password-reset/complete', {
      data: { token: decodeURIComponent(new URL(resetLink).pathname.split('/').pop() ?? ''), password: 'yet-another-password-71' },
      headers: Object.fromEntries((await visitorContext.cookies()).filter((c) => c.name === 'lariat_csrf').map((c) => ['X-Lariat-CSRF', c.value])),
    });
    expect(response.status()).toBe(410);
    const body = (await response.json()) as { error: { message: string; field: string } };
    expect(body.error).toEqual({ message: expect.stringMatching(/already been used/), field: 'token' });
  });

  it('signed out the session that was open elsewhere when the password changed', async () => {
    expect((await mailContext.request.get('/api/auth/me')).status()).toBe(401);
  });
});
