/** Inviting by e-mail with a role; accepting as a new or existing account; single use and expiry. */
import { eq } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { invitations } from '../../../server/db/schema/auth';
import { hashToken } from '../../../server/auth/tokens';
import { startTestApp, type TestApp } from '../../support/app';
import { invitationMailed, inviteAndJoin, lastMailId, newMail, signIn, signUp, TEST_PASSWORD, tokenFromMail, uniqueEmail, withCsrf, type Session } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

/** Invites `email` and returns the token from the captured e-mail. */
async function invite(admin: Session, email: string, role = 'analyst'): Promise<{ token: string; id: string; text: string }> {
  const before = lastMailId(t);
  const res = await withCsrf(admin.agent.post(`/api/workspaces/${admin.workspaceId}/invitations`), admin.csrf).send({ email, role });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  const mail = await newMail(t, email, /invited you/, before);
  await invitationMailed(t, res.body.id as string);
  return { token: tokenFromMail(mail.text, 'invitations'), id: res.body.id as string, text: mail.text };
}

describe('invitations', () => {
  it('e-mails a link to the public URL; the preview tells the workspace, role and e-mail', async () => {
    const admin = await signUp(t.app, { workspaceName: 'Orchard trials', name: 'Grace' });
    const email = uniqueEmail('invitee');
    const { token, text } = await invite(admin, email, 'reviewer');
    expect(text).toContain(`${t.ctx.config.publicUrl}/invitations/${token}`);
    const preview = await request(t.app).get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toEqual({ workspaceName: 'Orchard trials', email, role: 'reviewer', invitedByName: 'Grace', expiresAt: expect.any(String), accountExists: false });
    const days = (Date.parse(preview.body.expiresAt) - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(6.99);
    expect(days).toBeLessThanOrEqual(7);
  });

  it('stores only a hash of the token', async () => {
    const admin = await signUp(t.app);
    const { token, id } = await invite(admin, uniqueEmail());
    const [row] = await t.ctx.db.select().from(invitations).where(eq(invitations.id, id));
    expect(row.tokenHash).toBe(hashToken(token));
    expect(JSON.stringify(row)).not.toContain(token);
  });

  it('a new person sets a name and password, is signed in, and holds the invited role', async () => {
    const admin = await signUp(t.app);
    const viewer = await inviteAndJoin(t, admin, uniqueEmail('viewer'), 'viewer', 'Vera');
    const me = await viewer.agent.get('/api/auth/me');
    expect(me.body.user.name).toBe('Vera');
    expect(me.body.memberships).toEqual([expect.objectContaining({ workspaceId: admin.workspaceId, role: 'viewer' })]);
    const members = await admin.agent.get(`/api/workspaces/${admin.workspaceId}/members`);
    expect(members.body.members.map((m: { role: string }) => m.role).sort()).toEqual(['admin', 'viewer']);
  });

  it('a reused link is a clear 410, and writes nothing', async () => {
    const admin = await signUp(t.app);
    const email = uniqueEmail();
    const { token } = await invite(admin, email);
    expect((await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'One', password: TEST_PASSWORD })).status).toBe(201);
    const again = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Two', password: TEST_PASSWORD });
    expect(again.status).toBe(410);
    expect(again.body.error).toEqual({ message: expect.stringMatching(/already been used/), field: 'token' });
    expect((await request(t.app).get(`/api/invitations/${token}`)).status).toBe(410);
  });

  it('an expired link is a clear 410', async () => {
    const admin = await signUp(t.app);
    const { token, id } = await invite(admin, uniqueEmail());
    await t.ctx.db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.id, id));
    const res = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'Late', password: TEST_PASSWORD });
    expect(res.status).toBe(410);
    expect(res.body.error.message).toMatch(/expired/);
  });

  it('a made-up token is a 404 naming the token', async () => {
    const res = await request(t.app).get('/api/invitations/this-token-was-never-issued');
    expect(res.status).toBe(404);
    expect(res.body.error.field).toBe('token');
  });

  it('a weak password on acceptance is refused by field, and the invitation stays usable', async () => {
    const admin = await signUp(t.app);
    const email = uniqueEmail();
    const { token } = await invite(admin, email);
    const weak = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'W', password: email });
    expect(weak.status).toBe(400);
    expect(weak.body.error.field).toBe('password');
    const missing = await request(t.app).post(`/api/invitations/${token}/accept`).send({ password: TEST_PASSWORD });
    expect(missing.body.error.field).toBe('name');
    expect((await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'W', password: TEST_PASSWORD })).status).toBe(201);
  });

  it('an existing account must sign in first, then joins with no body', async () => {
    const admin = await signUp(t.app);
    const other = await signUp(t.app);
    const { token } = await invite(admin, other.email, 'reviewer');
    expect((await request(t.app).get(`/api/invitations/${token}`)).body.accountExists).toBe(true);
    const anonymous = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'X', password: TEST_PASSWORD });
    expect(anonymous.status).toBe(409);
    expect(anonymous.body.error.message).toMatch(/sign in/i);
    const joined = await other.agent.post(`/api/invitations/${token}/accept`).send();
    expect(joined.status).toBe(201);
    const list = await other.agent.get('/api/workspaces');
    expect(list.body.workspaces.map((w: { id: string; role: string }) => [w.id, w.role]).sort()).toEqual(
      [[admin.workspaceId, 'reviewer'], [other.workspaceId, 'admin']].sort(),
    );
  });

  it('someone signed in as another e-mail cannot take the invitation (403)', async () => {
    const admin = await signUp(t.app);
    const intruder = await signUp(t.app);
    const { token } = await invite(admin, uniqueEmail('intended'));
    const res = await intruder.agent.post(`/api/invitations/${token}/accept`).send();
    expect(res.status).toBe(403);
    expect((await admin.agent.get(`/api/workspaces/${admin.workspaceId}/members`)).body.members).toHaveLength(1);
  });

  it('admins list pending invitations and withdraw them; a withdrawn link stops working', async () => {
    const admin = await signUp(t.app);
    const email = uniqueEmail();
    const { token, id } = await invite(admin, email, 'viewer');
    const pending = await admin.agent.get(`/api/workspaces/${admin.workspaceId}/invitations`);
    expect(pending.body.invitations).toEqual([expect.objectContaining({ id, email, role: 'viewer' })]);
    expect((await withCsrf(admin.agent.delete(`/api/workspaces/${admin.workspaceId}/invitations/${id}`), admin.csrf)).status).toBe(204);
    expect((await admin.agent.get(`/api/workspaces/${admin.workspaceId}/invitations`)).body.invitations).toEqual([]);
    const res = await request(t.app).post(`/api/invitations/${token}/accept`).send({ name: 'N', password: TEST_PASSWORD });
    expect(res.status).toBe(410);
    expect(res.body.error.message).toMatch(/withdrawn/);
  });

  it('inviting the same e-mail again replaces the older link', async () => {
    const admin = await signUp(t.app);
    const email = uniqueEmail('twice');
    const first = await invite(admin, email, 'viewer');
    const second = await invite(admin, email, 'analyst');
    expect(second.token).not.toBe(first.token);
    expect((await admin.agent.get(`/api/workspaces/${admin.workspaceId}/invitations`)).body.invitations).toEqual([expect.objectContaining({ id: second.id, role: 'analyst' })]);
    expect((await request(t.app).get(`/api/invitations/${first.token}`)).status).toBe(410);
    expect((await request(t.app).get(`/api/invitations/${second.token}`)).body.role).toBe('analyst');
  });

  it('inviting someone who is already a member is a 409 naming email', async () => {
    const admin = await signUp(t.app);
    const res = await withCsrf(admin.agent.post(`/api/workspaces/${admin.workspaceId}/invitations`), admin.csrf).send({ email: admin.email, role: 'viewer' });
    expect(res.status).toBe(409);
    expect(res.body.error.field).toBe('email');
  });

  it('the new member can sign in later with the password they chose', async () => {
    const admin = await signUp(t.app);
    const email = uniqueEmail();
    await inviteAndJoin(t, admin, email, 'analyst');
    const again = await signIn(t.app, email);
    expect(again.workspaceId).toBe(admin.workspaceId);
  });
});
