/** Roles on the server, the last-admin rule, and workspace isolation (404 on every route of B for a member of A). */
import type { Test } from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';
import { inviteAndJoin, signUp, uniqueEmail, withCsrf, type Session } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

const membersUrl = (s: Session, userId = '') => `/api/workspaces/${s.workspaceId}/members${userId ? `/${userId}` : ''}`;

describe('roles', () => {
  it('a viewer can list members but cannot invite, change roles or remove anyone (403)', async () => {
    const admin = await signUp(t.app);
    const viewer = await inviteAndJoin(t, admin, uniqueEmail('viewer'), 'viewer');
    expect((await viewer.agent.get(membersUrl(admin))).status).toBe(200);
    const inviteRes = await withCsrf(viewer.agent.post(`/api/workspaces/${admin.workspaceId}/invitations`), viewer.csrf).send({ email: uniqueEmail(), role: 'admin' });
    expect(inviteRes.status).toBe(403);
    expect(inviteRes.body.error.message).toMatch(/admin/);
    expect((await withCsrf(viewer.agent.patch(membersUrl(admin, viewer.userId)), viewer.csrf).send({ role: 'admin' })).status).toBe(403);
    expect((await withCsrf(viewer.agent.delete(membersUrl(admin, admin.userId)), viewer.csrf)).status).toBe(403);
    expect((await viewer.agent.get(`/api/workspaces/${admin.workspaceId}/invitations`)).status).toBe(403);
    const roles = (await admin.agent.get(membersUrl(admin))).body.members.map((m: { role: string }) => m.role).sort();
    expect(roles).toEqual(['admin', 'viewer']);
  });

  it('analysts and reviewers cannot manage members either', async () => {
    const admin = await signUp(t.app);
    for (const role of ['analyst', 'reviewer'] as const) {
      const m = await inviteAndJoin(t, admin, uniqueEmail(role), role);
      const res = await withCsrf(m.agent.patch(membersUrl(admin, m.userId)), m.csrf).send({ role: 'admin' });
      expect(res.status, role).toBe(403);
    }
  });

  it('an admin changes a role; the member sees the new role', async () => {
    const admin = await signUp(t.app);
    const m = await inviteAndJoin(t, admin, uniqueEmail(), 'viewer');
    const res = await withCsrf(admin.agent.patch(membersUrl(admin, m.userId)), admin.csrf).send({ role: 'analyst' });
    expect(res.status).toBe(200);
    const me = await m.agent.get('/api/auth/me');
    expect(me.body.memberships[0].role).toBe('analyst');
  });

  it('never demotes or removes the last admin (409); with a second admin it works', async () => {
    const admin = await signUp(t.app);
    const demote = await withCsrf(admin.agent.patch(membersUrl(admin, admin.userId)), admin.csrf).send({ role: 'viewer' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.message).toMatch(/last admin/);
    const remove = await withCsrf(admin.agent.delete(membersUrl(admin, admin.userId)), admin.csrf);
    expect(remove.status).toBe(409);

    const second = await inviteAndJoin(t, admin, uniqueEmail('second-admin'), 'admin');
    expect((await withCsrf(second.agent.delete(membersUrl(admin, admin.userId)), second.csrf)).status).toBe(204);
    const members = (await second.agent.get(membersUrl(admin))).body.members;
    expect(members).toEqual([expect.objectContaining({ userId: second.userId, role: 'admin' })]);
    // The removed admin no longer reaches the workspace at all.
    expect((await admin.agent.get(membersUrl(admin))).status).toBe(404);
  });

  it('removing someone who is not a member is a 404', async () => {
    const admin = await signUp(t.app);
    const stranger = await signUp(t.app);
    expect((await withCsrf(admin.agent.delete(membersUrl(admin, stranger.userId)), admin.csrf)).status).toBe(404);
  });
});

describe('workspace isolation', () => {
  it('an admin of workspace A gets 404 on every workspace route of B, and B is unchanged', async () => {
    const a = await signUp(t.app, { workspaceName: 'A' });
    const b = await signUp(t.app, { workspaceName: 'B' });
    const bMember = await inviteAndJoin(t, b, uniqueEmail('b-viewer'), 'viewer');
    const bInvite = await withCsrf(b.agent.post(`/api/workspaces/${b.workspaceId}/invitations`), b.csrf).send({ email: uniqueEmail(), role: 'viewer' });
    const ws = `/api/workspaces/${b.workspaceId}`;
    const attempts: Array<[string, () => Test]> = [
      ['GET workspace', () => a.agent.get(ws)],
      ['GET members', () => a.agent.get(`${ws}/members`)],
      ['PATCH member', () => withCsrf(a.agent.patch(`${ws}/members/${bMember.userId}`), a.csrf).send({ role: 'admin' })],
      ['DELETE member', () => withCsrf(a.agent.delete(`${ws}/members/${bMember.userId}`), a.csrf)],
      ['GET invitations', () => a.agent.get(`${ws}/invitations`)],
      ['POST invitation', () => withCsrf(a.agent.post(`${ws}/invitations`), a.csrf).send({ email: uniqueEmail(), role: 'admin' })],
      ['DELETE invitation', () => withCsrf(a.agent.delete(`${ws}/invitations/${bInvite.body.id}`), a.csrf)],
    ];
    for (const [label, attempt] of attempts) {
      const res = await attempt();
      expect(res.status, label).toBe(404);
      expect(res.body.error.message).not.toMatch(/B\b/);
    }
    // A workspace id that does not exist at all gets the same answer: existence does not leak.
    const missing = await a.agent.get('/api/workspaces/00000000-0000-4000-8000-000000000000/members');
    expect(missing.status).toBe(404);
    expect(missing.body).toEqual((await a.agent.get(`${ws}/members`)).body);
    const bMembers = (await b.agent.get(`${ws}/members`)).body.members;
    expect(bMembers.map((m: { role: string }) => m.role).sort()).toEqual(['admin', 'viewer']);
    expect((await b.agent.get(`${ws}/invitations`)).body.invitations).toHaveLength(1);
    expect((await a.agent.get('/api/workspaces')).body.workspaces.map((w: { id: string }) => w.id)).toEqual([a.workspaceId]);
  });

  it('creating a workspace adds it to my list as admin; switching is by id in the URL', async () => {
    const s = await signUp(t.app, { workspaceName: 'First' });
    const created = await withCsrf(s.agent.post('/api/workspaces'), s.csrf).send({ name: 'Second' });
    expect(created.status).toBe(201);
    expect(created.body).toEqual({ id: expect.any(String), name: 'Second', role: 'admin', createdAt: expect.any(String) });
    const list = (await s.agent.get('/api/workspaces')).body.workspaces;
    expect(list.map((w: { name: string }) => w.name)).toEqual(['First', 'Second']);
    const detail = await s.agent.get(`/api/workspaces/${created.body.id}`);
    expect(detail.body.name).toBe('Second');
  });

  it('workspace routes need a session (401)', async () => {
    const s = await signUp(t.app);
    const { default: request } = await import('supertest');
    expect((await request(t.app).get(`/api/workspaces/${s.workspaceId}/members`)).status).toBe(401);
    expect((await request(t.app).get('/api/workspaces')).status).toBe(401);
  });
});
