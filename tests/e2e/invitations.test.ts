/**
 * Invitations end to end: an admin invites by e-mail, the link is read from the captured e-mail,
 * the invitee sets a password in another browser profile and lands in the workspace with the
 * invited role; a viewer sees members read-only and the server refuses forced requests.
 */
import fs from 'node:fs';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { PASSWORD, csrfHeader, newAccount, signUp, uniqueEmail, waitForEmail } from '../support/e2e-flows';

let browser: Browser;
let adminContext: BrowserContext;
let admin: Page;
let viewerContext: BrowserContext;
let viewer: Page;
const owner = newAccount('owner');
const viewerEmail = uniqueEmail('viewer');
let workspaceId = '';

beforeAll(async () => {
  browser = await launchBrowser();
  adminContext = await newContext(browser);
  admin = await adminContext.newPage();
  viewerContext = await newContext(browser);
  viewer = await viewerContext.newPage();
  workspaceId = await signUp(admin, owner);
});

afterAll(async () => {
  await browser?.close();
});

async function invite(email: string, role: string): Promise<void> {
  await admin.goto(`/w/${workspaceId}/members`);
  const form = admin.getByRole('region', { name: 'Invite a teammate' });
  await form.getByLabel('E-mail').fill(email);
  await form.getByLabel('Role').selectOption({ label: role });
  await form.getByRole('button', { name: 'Send invitation' }).click();
  await expectVisible(admin.getByText(`Invitation sent to ${email}.`));
}

describe('invitations', () => {
  it('lets the admin invite by e-mail, and lists the invitation as pending', async () => {
    await invite(viewerEmail, 'Viewer');
    const pending = admin.getByRole('region', { name: 'Pending invitations' });
    await expectVisible(pending.getByText(viewerEmail));
    await checkA11y(admin, 'members page with a pending invitation');
    fs.mkdirSync('tests/e2e/screenshots', { recursive: true });
    await admin.screenshot({ path: 'tests/e2e/screenshots/members-light.png', fullPage: true });
    await admin.getByRole('button', { name: 'Use the dark theme' }).click();
    await checkA11y(admin, 'members page with a pending invitation, dark');
    await admin.screenshot({ path: 'tests/e2e/screenshots/members-dark.png', fullPage: true });
    await admin.getByRole('button', { name: 'Use the light theme' }).click();
  });

  it('shows the captured e-mail in the outbox with its link clickable', async () => {
    const { link } = await waitForEmail(adminContext, viewerEmail, '/invitations/');
    await admin.goto(`/w/${workspaceId}/outbox`);
    await expectVisible(admin.getByRole('link', { name: link }));
    await checkA11y(admin, 'outbox with messages');
    await admin.screenshot({ path: 'tests/e2e/screenshots/outbox-light.png' });
  });

  it('lets the invitee set a name and password and land in the workspace as a viewer', async () => {
    const { link } = await waitForEmail(adminContext, viewerEmail, '/invitations/');
    await viewer.goto(new URL(link).pathname);
    await expectVisible(viewer.getByRole('heading', { name: `Join ${owner.workspaceName}` }));
    expect(await viewer.getByLabel('E-mail').inputValue()).toBe(viewerEmail);
    await checkA11y(viewer, 'accept-invitation page');

    await viewer.getByLabel('Your name').fill('Vera Viewer');
    await viewer.getByLabel('Choose a password').fill(PASSWORD);
    await viewer.getByRole('button', { name: 'Join workspace' }).click();
    await viewer.waitForURL(new RegExp(`/w/${workspaceId}/datasets$`));
    expect(await viewer.locator('#workspace-switcher option:checked').textContent()).toBe(`${owner.workspaceName} (Viewer)`);
  });

  it('shows a viewer the members read-only: no invite form, no role or remove controls', async () => {
    await viewer.getByRole('link', { name: 'Members' }).click();
    await expectVisible(viewer.getByRole('cell', { name: owner.email }));
    await expectVisible(viewer.getByText('Only admins can invite people or change roles.'));
    expect(await viewer.getByRole('heading', { name: 'Invite a teammate' }).count()).toBe(0);
    expect(await viewer.getByRole('button', { name: /Remove/ }).count()).toBe(0);
    expect(await viewer.getByRole('region', { name: 'Pending invitations' }).count()).toBe(0);
    // The only select on the page is the workspace switcher: roles are plain text.
    expect(await viewer.getByRole('combobox').count()).toBe(1);
    await checkA11y(viewer, 'members page (viewer)');
  });

  it('answers 403 when a viewer forces the admin-only requests', async () => {
    const headers = await csrfHeader(viewerContext);
    const inviteAttempt = await viewerContext.request.post(`/api/workspaces/${workspaceId}/invitations`, {
      data: { email: uniqueEmail('sneaky'), role: 'admin' },
      headers,
    });
    expect(inviteAttempt.status()).toBe(403);
    const members = (await (await viewerContext.request.get(`/api/workspaces/${workspaceId}/members`)).json()) as { members: { userId: string; email: string }[] };
    const ownerId = members.members.find((m) => m.email === owner.email)?.userId;
    expect(ownerId).toBeTruthy();
    const demote = await viewerContext.request.patch(`/api/workspaces/${workspaceId}/members/${ownerId}`, { data: { role: 'viewer' }, headers });
    expect(demote.status()).toBe(403);
    // The viewer's outbox holds only mail to the viewer: not the owner's sign-up or any other invitation.
    const outbox = (await (await viewerContext.request.get('/api/dev/outbox')).json()) as { messages: { to: string[] }[] };
    expect(outbox.messages.length).toBeGreaterThan(0);
    expect(outbox.messages.every((m) => m.to.includes(viewerEmail.toLowerCase()))).toBe(true);
  });

  it('lets the admin change the new member\'s role, which the member then sees', async () => {
    await admin.goto(`/w/${workspaceId}/members`);
    await expectVisible(admin.getByText('No invitations are waiting for an answer.'));
    const roleSelect = admin.getByLabel('Role of Vera Viewer');
    expect(await roleSelect.inputValue()).toBe('viewer');
    await roleSelect.selectOption('analyst');
    await admin.waitForResponse((r) => r.url().includes('/members') && r.request().method() === 'GET');
    await viewer.reload();
    await expectVisible(viewer.getByText('Analyst', { exact: true }).first());
    expect(await viewer.locator('#workspace-switcher option:checked').textContent()).toBe(`${owner.workspaceName} (Analyst)`);
  });

  it('revokes a pending invitation, after which its link no longer works', async () => {
    const email = uniqueEmail('revoked');
    await invite(email, 'Reviewer');
    const { link } = await waitForEmail(adminContext, email, '/invitations/');
    await admin.getByRole('button', { name: `Revoke the invitation for ${email}` }).click();
    await expectVisible(admin.getByText('No invitations are waiting for an answer.'));

    const stranger = await newContext(browser);
    const page = await stranger.newPage();
    await page.goto(new URL(link).pathname);
    await expectVisible(page.getByRole('heading', { name: 'This invitation cannot be used' }));
    await checkA11y(page, 'revoked invitation page');
    await stranger.close();
  });

  it('lets someone who already has an account sign in from the link and join', async () => {
    const other = newAccount('elsewhere');
    const context = await newContext(browser);
    const page = await context.newPage();
    const ownWorkspace = await signUp(page, other);
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.waitForURL(/\/sign-in/);

    await invite(other.email, 'Reviewer');
    const { link } = await waitForEmail(adminContext, other.email, '/invitations/');
    await page.goto(new URL(link).pathname);
    await page.getByRole('link', { name: `Sign in as ${other.email}` }).click();
    await page.getByLabel('E-mail').fill(other.email);
    await page.getByLabel('Password').fill(other.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    // Back on the invitation, now signed in as the invited address.
    await page.getByRole('button', { name: 'Join workspace' }).click();
    await page.waitForURL(new RegExp(`/w/${workspaceId}/datasets$`));
    const options = await page.locator('#workspace-switcher option').evaluateAll((els) => els.map((e) => (e as HTMLOptionElement).value));
    expect(options).toEqual(expect.arrayContaining([ownWorkspace, workspaceId]));
    expect(await page.locator('#workspace-switcher option:checked').textContent()).toBe(`${owner.workspaceName} (Reviewer)`);
    await context.close();
  });

  it('lets the admin remove a member after confirming', async () => {
    await admin.getByRole('button', { name: 'Remove Vera Viewer' }).click();
    await admin.getByRole('button', { name: 'Yes, remove' }).click();
    await admin.getByRole('cell', { name: viewerEmail }).waitFor({ state: 'detached' });
    expect((await viewerContext.request.get(`/api/workspaces/${workspaceId}/members`)).status()).toBeGreaterThanOrEqual(403);
  });
});
