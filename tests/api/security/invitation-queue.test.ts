/**
 * Issue 8 item 12 (invitations): the e-mail is sent by a queued job. While the mail relay fails, the
 * older invitation keeps working and the job retries; once the relay takes the new e-mail, the new
 * link works and the older one ends. No usable token is ever stored in the job table.
 */
import { sql } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../../support/app';
import { invitationMailed, lastMailId, newMail, signUp, tokenFromMail, uniqueEmail, withCsrf, type Session } from '../../support/session';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(async () => {
  await t?.close();
});

const inviteRequest = (admin: Session, email: string, role: string) =>
  withCsrf(admin.agent.post(`/api/workspaces/${admin.workspaceId}/invitations`), admin.csrf).send({ email, role });

async function until(what: string, check: () => boolean | Promise<boolean>, timeoutMs = 30_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`Timed out waiting for: ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

describe('invitation e-mail through the queue', () => {
  it('keeps the older invitation while the relay fails, and replaces it once the new e-mail is out', async () => {
    const admin = await signUp(t.app);
    const email = uniqueEmail('queued');
    let before = lastMailId(t);
    const first = await inviteRequest(admin, email, 'viewer');
    expect(first.status).toBe(201);
    const oldToken = tokenFromMail((await newMail(t, email, /invited you/, before)).text, 'invitations');
    await invitationMailed(t, first.body.id as string);

    // The relay goes down.
    const realSend = t.ctx.sendMail;
    let refused = 0;
    t.ctx.sendMail = async () => {
      refused += 1;
      throw new Error('connect ECONNREFUSED 127.0.0.1:25');
    };
    let second: request.Response;
    try {
      second = await inviteRequest(admin, email, 'analyst');
      // The answer does not wait for (or fail with) the relay.
      expect(second.status).toBe(201);
      await until('the job to try and fail once', () => refused >= 1);
      // Nothing is lost: the older link still works, and both invitations are pending.
      const preview = await request(t.app).get(`/api/invitations/${oldToken}`);
      expect(preview.status).toBe(200);
      expect(preview.body.role).toBe('viewer');
      const pending = (await admin.agent.get(`/api/workspaces/${admin.workspaceId}/invitations`)).body.invitations as { id: string }[];
      expect(pending.map((i) => i.id).sort()).toEqual([first.body.id, second.body.id].sort());
    } finally {
      t.ctx.sendMail = realSend;
    }

    // The relay is back: the retry sends the new e-mail, and only then the older link ends.
    before = lastMailId(t);
    // Retries back off from 2 s: allow half a minute.
    await until('the retried e-mail', () => t.mail.messages.some((m) => m.id > before && m.to.includes(email)));
    const newToken = tokenFromMail((await newMail(t, email, /invited you/, before)).text, 'invitations');
    await invitationMailed(t, second.body.id as string);
    expect((await request(t.app).get(`/api/invitations/${newToken}`)).body.role).toBe('analyst');
    expect((await request(t.app).get(`/api/invitations/${oldToken}`)).status).toBe(410);

    // The job table holds the invitation's id, never a token.
    const jobs = await t.ctx.db.execute(sql`SELECT data::text AS data FROM pgboss.job WHERE name = 'invitation-mail'`);
    expect(jobs.rows.length).toBeGreaterThanOrEqual(2);
    for (const row of jobs.rows as { data: string }[]) {
      expect(Object.keys(JSON.parse(row.data) as object)).toEqual(['invitationId']);
      expect(row.data).not.toContain(newToken);
      expect(row.data).not.toContain(oldToken);
    }
  });
});
