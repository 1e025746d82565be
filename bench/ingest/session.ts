/**
 * A signed-in account on a benchmark server: sign-up answers 202 and finishes through the e-mailed
 * link (server/accounts/sign-up.ts), which the benchmark reads from its own fake SMTP server (the
 * server process is started with LARIAT_SMTP_URL pointing at it, see server.ts).
 */
import type { FakeSmtp } from '../../server/mail/fake-smtp';

export interface BenchSession {
  cookie: string;
  csrf: string;
  workspaceId: string;
}

export async function signUp(url: string, mailbox: FakeSmtp, who = 'bench'): Promise<BenchSession> {
  const email = `${who}-${Date.now()}-${Math.floor(Math.random() * 1e6)}@example.test`;
  const requested = await fetch(`${url}/api/auth/sign-up`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: 'correct horse battery staple', name: `Bench ${who}` }),
  });
  if (requested.status !== 202) throw new Error(`sign-up failed: ${requested.status} ${await requested.text()}`);
  const mail = await mailbox.waitFor(email, /Finish creating/);
  const token = /\/sign-up\/finish\/([A-Za-z0-9_-]+)/.exec(mail.text)?.[1];
  if (!token) throw new Error(`no sign-up link in the e-mail to ${email}`);
  const res = await fetch(`${url}/api/auth/sign-up/complete`, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify({ token }) });
  if (res.status !== 201) throw new Error(`finishing the sign-up failed: ${res.status} ${await res.text()}`);
  const body = (await res.json()) as { csrfToken: string; memberships: { workspaceId: string }[] };
  return { cookie: res.headers.getSetCookie().map((c) => c.split(';')[0]).join('; '), csrf: body.csrfToken, workspaceId: body.memberships[0].workspaceId };
}
