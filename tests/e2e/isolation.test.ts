/** No data crosses workspaces: someone from workspace B who opens A's address gets "not found". */
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkA11y, expectVisible, launchBrowser, newContext } from '../support/browser';
import { newAccount, signUp } from '../support/e2e-flows';

let browser: Browser;
let contextA: BrowserContext;
let contextB: BrowserContext;
let pageA: Page;
let pageB: Page;
const alice = newAccount('alice');
const bruno = newAccount('bruno');
let workspaceA = '';
let workspaceB = '';

beforeAll(async () => {
  browser = await launchBrowser();
  contextA = await newContext(browser);
  contextB = await newContext(browser);
  pageA = await contextA.newPage();
  pageB = await contextB.newPage();
  workspaceA = await signUp(pageA, alice);
  workspaceB = await signUp(pageB, bruno);
});

afterAll(async () => {
  await browser?.close();
});

describe('workspace isolation', () => {
  it('gives separate sign-ups separate workspaces', () => {
    expect(workspaceA).not.toBe(workspaceB);
  });

  it("shows B a not-found page at A's members address, without A's data", async () => {
    for (const area of ['members', 'models', 'datasets']) {
      await pageB.goto(`/w/${workspaceA}/${area}`);
      await expectVisible(pageB.getByRole('heading', { name: 'Page not found' }));
      const text = await pageB.locator('body').innerText();
      expect(text).not.toContain(alice.email);
      expect(text).not.toContain(alice.workspaceName);
    }
    await checkA11y(pageB, 'workspace not found page');
  });

  it("refuses B's direct API requests for A's members", async () => {
    // 404, not 403: a workspace you are not in looks exactly like one that does not exist.
    for (const path of ['', '/members', '/datasets', '/invitations']) {
      const response = await contextB.request.get(`/api/workspaces/${workspaceA}${path}`);
      expect(response.status(), path).toBe(404);
      const text = await response.text();
      expect(JSON.parse(text)).toEqual({ error: { message: 'No such workspace, or you are not a member of it.' } });
      expect(text).not.toContain(alice.email);
    }
    const unknown = await contextB.request.get(`/api/workspaces/00000000-0000-4000-8000-000000000000/members`);
    expect(unknown.status()).toBe(404);
  });

  it('shows a not-found message inside the shell for an unknown area of a workspace', async () => {
    await pageB.goto(`/w/${workspaceB}/no-such-area`);
    await expectVisible(pageB.getByRole('heading', { name: 'Page not found' }));
    await expectVisible(pageB.getByRole('navigation', { name: 'Workspace' }));
    expect(await pageB.locator('main').count()).toBe(1);
    await checkA11y(pageB, 'unknown area inside a workspace');
  });

  it("offers B only B's own workspace in the switcher", async () => {
    await pageB.goto(`/w/${workspaceB}/members`);
    await expectVisible(pageB.getByRole('cell', { name: bruno.email }));
    const options = await pageB.locator('#workspace-switcher option').allTextContents();
    expect(options).toEqual([`${bruno.workspaceName} (Admin)`, 'New workspace…']);
  });

  it('starts a second workspace from the switcher and switches between the two', async () => {
    // Its own person, so the other tests' expectations (one workspace for Bruno) hold in any order.
    const contextC = await newContext(browser);
    const pageC = await contextC.newPage();
    const carla = newAccount('carla');
    const workspaceC = await signUp(pageC, carla);
    await pageC.locator('#workspace-switcher').selectOption({ label: 'New workspace…' });
    await pageC.waitForURL(/\/new-workspace$/);
    await checkA11y(pageC, 'new workspace page');
    await pageC.getByLabel('Workspace name').fill('Carla side project');
    await pageC.getByRole('button', { name: 'Create workspace' }).click();
    await pageC.waitForURL((url) => /\/w\/[^/]+\/datasets$/.test(url.pathname) && !url.pathname.includes(workspaceC));
    expect(await pageC.locator('#workspace-switcher option:checked').textContent()).toBe('Carla side project (Admin)');

    await pageC.locator('#workspace-switcher').selectOption(workspaceC);
    await pageC.waitForURL(new RegExp(`/w/${workspaceC}/datasets$`));
    expect(await pageC.locator('#workspace-switcher option').count()).toBe(3);
  });
});
