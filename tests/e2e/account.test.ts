/** The account page: sessions with "sign out the others", and changing the password (issue 8 item 10). */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { newAccount, signIn, signUp, waitForEmail } from '../support/e2e-flows';

let browser: Browser;
let main: BrowserContext;
let other: BrowserContext;
let page: Page;
let workspaceId = '';
const person = newAccount('sessions');
const NEW_PASSWORD = 'lantern-orchard-tide-64';

beforeAll(async () => {
  browser = await launchBrowser();
  main = await newContext(browser);
  page = await main.newPage();
  workspaceId = await signUp(page, person);
  // The same person on a second device.
  other = await newContext(browser, { userAgent: 'Second device browser' });
  const otherPage = await other.newPage();
  await signIn(otherPage, person.email, person.password);
  await otherPage.waitForURL(/\/w\/[^/]+\/datasets$/);
});

afterAll(async () => {
  await browser?.close();
});

describe('account page', () => {
  it('lists both sessions, marks this one, and signs out the other', async () => {
    await page.getByRole('link', { name: 'Your account' }).click();
    await page.waitForURL(new RegExp(`/w/${workspaceId}/account$`));
    await expectVisible(page.getByRole('heading', { name: 'Where you are signed in' }));
    const rows = page.getByRole('table', { name: 'Your sessions' }).locator('tbody tr');
    await expectVisible(rows.filter({ hasText: 'Second device browser' }));
    expect(await rows.count()).toBe(2);
    await expectVisible(rows.filter({ hasText: 'This session' }));
    await checkA11y(page, 'account page');

    await page.getByRole('button', { name: 'Sign out the other sessions' }).click();
    await expectVisible(page.getByText('1 other session was signed out.'));
    expect((await other.request.get('/api/auth/me')).status()).toBe(401);
    expect(await rows.count()).toBe(1);
  });

  it('refuses a wrong current password next to its field, then changes the password and e-mails a notice', async () => {
    await page.getByLabel('Current password').fill('not-the-password-at-all');
    await page.getByLabel('New password', { exact: true }).fill(NEW_PASSWORD);
    await page.getByLabel('New password, again').fill(NEW_PASSWORD);
    await page.getByRole('button', { name: 'Change password' }).click();
    await expectVisible(page.getByText('This is not your current password.'));
    await checkA11y(page, 'account page with an error');

    await page.getByLabel('Current password').fill(person.password);
    await page.getByRole('button', { name: 'Change password' }).click();
    await expectVisible(page.getByText(/Your password is changed/));
    const { message } = await waitForEmail(main, person.email, '/forgot-password');
    expect(message.subject).toBe('Your Lariat password was changed');

    const fresh = await (await newContext(browser)).newPage();
    await signIn(fresh, person.email, NEW_PASSWORD);
    await fresh.waitForURL(/\/w\/[^/]+\/datasets$/);
  });
});

describe('finishing a sign-up', () => {
  it('asks for one click, and explains a link that is not valid', async () => {
    const visitor = await (await newContext(browser)).newPage();
    await visitor.goto('/sign-up/finish/not-a-real-token-at-all');
    await expectVisible(visitor.getByRole('heading', { name: 'Finish creating your account' }));
    await checkA11y(visitor, 'finish sign-up page');
    await visitor.getByRole('button', { name: 'Create my account' }).click();
    await expectVisible(visitor.getByText('This sign-up link is not valid.', { exact: false }));
    await checkA11y(visitor, 'finish sign-up page with an error');
  });
});
