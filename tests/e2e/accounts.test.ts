/** Sign-up, the workspace areas, sign-out and sign-in again, through the real pages. */
import fs from 'node:fs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { mailedLink, newAccount, signIn, signOut, signUp } from '../support/e2e-flows';

let browser: Browser;
let context: BrowserContext;
let page: Page;
const admin = newAccount('founder');
let workspaceId = '';

beforeAll(async () => {
  browser = await launchBrowser();
  context = await newContext(browser, { colorScheme: 'light' });
  page = await context.newPage();
});

afterAll(async () => {
  await browser?.close();
});

describe('accounts', () => {
  it('shows field errors next to their inputs before anything is sent', async () => {
    await page.goto('/sign-up');
    await checkA11y(page, 'sign-up page');
    await page.getByRole('button', { name: 'Create workspace' }).click();
    const name = page.getByLabel('Your name');
    expect(await name.getAttribute('aria-invalid')).toBe('true');
    const errorId = await name.getAttribute('aria-describedby');
    expect(await page.locator(`[id="${errorId}"]`).textContent()).toBe('Enter your name.');
    await checkA11y(page, 'sign-up page with errors');
  });

  it('signs up: the first account becomes admin of its new workspace and lands in it', async () => {
    workspaceId = await signUp(page, admin);
    await expectVisible(page.getByRole('heading', { level: 1, name: 'Datasets' }));
    expect(await page.locator('#workspace-switcher').inputValue()).toBe(workspaceId);
    expect(await page.locator('#workspace-switcher option:checked').textContent()).toBe(`${admin.workspaceName} (Admin)`);
    await checkA11y(page, 'datasets placeholder');
    await page.screenshot({ path: 'tests/e2e/screenshots/datasets-light.png' });
  });

  it('moves between the workspace areas, each with an honest empty state', async () => {
    const nav = page.getByRole('navigation', { name: 'Workspace' });
    const areas: [string, RegExp][] = [
      ['Models', /No models yet/],
      ['Reviews', /No reviews here yet/],
      ['Releases', /No releases yet/],
    ];
    for (const [area, emptyState] of areas) {
      await nav.getByRole('link', { name: area }).click();
      await page.waitForURL(new RegExp(`/w/${workspaceId}/${area.toLowerCase()}$`));
      await expectVisible(page.getByRole('heading', { level: 1, name: area }));
      await expectVisible(page.getByText(emptyState));
      await checkA11y(page, `${area} page`);
    }
    // The models page carries the statistical cautions.
    await nav.getByRole('link', { name: 'Models' }).click();
    await expectVisible(page.getByRole('heading', { name: 'Read results with care' }));
    await expectVisible(page.getByText(/Selected is not causal/));
    fs.mkdirSync('tests/e2e/screenshots', { recursive: true });
    await page.screenshot({ path: 'tests/e2e/screenshots/models-light.png', fullPage: true });
    await page.getByRole('button', { name: 'Use the dark theme' }).click();
    await checkA11y(page, 'Models page, dark');
    await page.screenshot({ path: 'tests/e2e/screenshots/models-dark.png', fullPage: true });
    await page.getByRole('button', { name: 'Use the light theme' }).click();
  });

  it('shows the admin the members page with the invite form, and the outbox link', async () => {
    await page.getByRole('link', { name: 'Members' }).click();
    await expectVisible(page.getByRole('heading', { name: 'Invite a teammate' }));
    await expectVisible(page.getByRole('cell', { name: admin.email }));
    await checkA11y(page, 'members page (admin)');
    await page.getByRole('link', { name: /Outbox/ }).click();
    await expectVisible(page.getByRole('heading', { level: 1, name: 'Outbox' }));
    await checkA11y(page, 'outbox page');
  });

  it('signs out, refuses a wrong password with a visible message, and signs in again', async () => {
    await signOut(page);
    await checkA11y(page, 'sign-in page');
    await page.goto(`/w/${workspaceId}/models`);
    await page.waitForURL(/\/sign-in\?redirectTo=/);

    await page.getByLabel('E-mail').fill(admin.email);
    await page.getByLabel('Password').fill('not-the-right-one-99');
    await page.getByRole('button', { name: 'Sign in' }).click();
    const alert = page.getByRole('alert').or(page.locator('[id$="-error"]'));
    await alert.first().waitFor();
    expect((await alert.first().textContent())?.length).toBeGreaterThan(0);
    expect(page.url()).toMatch(/\/sign-in/);

    await page.getByLabel('Password').fill(admin.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    // Back where the visitor was headed before signing in.
    await page.waitForURL(new RegExp(`/w/${workspaceId}/models$`));

    await signOut(page);
    await signIn(page, admin.email, admin.password);
    await page.waitForURL(new RegExp(`/w/${workspaceId}/datasets$`));
  });

  it('answers a sign-up with an e-mail already in use like any other, and tells the owner by e-mail', async () => {
    await signOut(page);
    await page.goto('/sign-up');
    await page.getByLabel('Your name').fill('Second Try');
    await page.getByLabel('E-mail').fill(admin.email);
    await page.getByLabel('Password').fill('another-long-passphrase-12');
    await page.getByLabel('Workspace name').fill('Second workspace');
    await page.getByRole('button', { name: 'Create workspace' }).click();
    await expectVisible(page.getByRole('heading', { name: 'Check your inbox' }));
    await expectVisible(page.getByText(/we sent you a link to finish creating your account/));
    await checkA11y(page, 'sign-up sent page');
    // The owner's mail says an account exists and points at sign-in and reset, never at a sign-up link.
    expect(await mailedLink(admin.email, '/forgot-password')).toMatch(/\/forgot-password$/);
  });

  it('has an accessible forgot-password page', async () => {
    await page.goto('/sign-in');
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await expectVisible(page.getByRole('heading', { name: 'Reset your password' }));
    await checkA11y(page, 'forgot-password page');
  });
});
