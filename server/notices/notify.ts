/**
 * Notices: a row per person in the app (the bell), and the same notice by e-mail through the queue,
 * one job per notice, so a mail relay hiccup is retried and never loses or repeats anyone else's e-mail.
 * The e-mail honours the person's opt-out at the time it is sent.
 */
import { and, eq, isNull } from 'drizzle-orm';
import type { WorkspaceRole } from '../../shared/members';
import type { MailPreferencesDto, NoticeKind } from '../../shared/reviews';
import type { AppContext } from '../context';
import type { Executor } from '../datasets/data/executor';
import { mailPreferences, memberships, notices, users, workspaces } from '../db/schema/index';
import { reportUnexpected } from '../http/unexpected';

export const NOTICE_MAIL_JOB = 'notice-mail';

const PREFERENCE_OF: Record<NoticeKind, keyof MailPreferencesDto> = {
  'review-requested': 'reviewRequested',
  'review-decided': 'reviewDecided',
  'release-published': 'releasePublished',
};

/** Members of the workspace with one of `roles` (all members when absent), minus `except`. */
export async function membersToTell(db: Executor, workspaceId: string, opts: { roles?: WorkspaceRole[]; only?: (string | null)[]; except?: (string | null)[] }): Promise<string[]> {
  const rows = await db
    .select({ userId: memberships.userId, role: memberships.role })
    .from(memberships)
    .where(eq(memberships.workspaceId, workspaceId));
  const except = new Set(opts.except?.filter((x): x is string => x !== null));
  const only = opts.only ? new Set(opts.only.filter((x): x is string => x !== null)) : null;
  return rows.filter((r) => (!opts.roles || opts.roles.includes(r.role)) && (!only || only.has(r.userId)) && !except.has(r.userId)).map((r) => r.userId);
}

/** Inserts one notice per person (inside the caller's transaction); returns their ids for queueNoticeMails. */
export async function addNotices(db: Executor, n: { workspaceId: string; kind: NoticeKind; title: string; link: string; userIds: string[] }): Promise<string[]> {
  if (n.userIds.length === 0) return [];
  const rows = await db
    .insert(notices)
    .values(n.userIds.map((userId) => ({ workspaceId: n.workspaceId, userId, kind: n.kind, title: n.title, link: n.link })))
    .returning({ id: notices.id });
  return rows.map((r) => r.id);
}

/**
 * After the transaction committed: one queued job per change of state, carrying its notices. One job
 * rather than one per person keeps the queue short; each notice records when its e-mail went out, so
 * a job retried after a relay hiccup sends only the e-mails still missing.
 */
export async function queueNoticeMails(ctx: AppContext, noticeIds: string[]): Promise<void> {
  if (noticeIds.length === 0) return;
  try {
    await ctx.queue.send(NOTICE_MAIL_JOB, { noticeIds });
  } catch (error) {
    // The change is stored and the in-app notices exist; only these e-mails are lost.
    reportUnexpected(error, 'queueing notice e-mails');
  }
}

/** The queued job: every notice's e-mail not sent yet. Throws on the first relay error (retried). */
export async function sendNoticeMails(ctx: AppContext, noticeIds: string[]): Promise<void> {
  for (const noticeId of noticeIds) await sendNoticeMail(ctx, noticeId);
}

export async function mailPreferencesOf(db: Executor, userId: string): Promise<MailPreferencesDto> {
  const [row] = await db.select().from(mailPreferences).where(eq(mailPreferences.userId, userId));
  return { reviewRequested: row?.reviewRequested ?? true, reviewDecided: row?.reviewDecided ?? true, releasePublished: row?.releasePublished ?? true };
}

/** One notice's e-mail, unless already sent or the person opted out. Throws on a relay error. */
async function sendNoticeMail(ctx: AppContext, noticeId: string): Promise<void> {
  const [row] = await ctx.db
    .select({ notice: notices, email: users.email, workspaceName: workspaces.name })
    .from(notices)
    .innerJoin(users, eq(users.id, notices.userId))
    .innerJoin(workspaces, eq(workspaces.id, notices.workspaceId))
    .where(and(eq(notices.id, noticeId), isNull(notices.mailedAt)));
  if (!row) return; // already mailed, or the person or workspace is gone
  const markMailed = () => ctx.db.update(notices).set({ mailedAt: new Date() }).where(eq(notices.id, noticeId));
  const prefs = await mailPreferencesOf(ctx.db, row.notice.userId);
  if (!prefs[PREFERENCE_OF[row.notice.kind]]) {
    await markMailed();
    return;
  }
  const base = ctx.config.publicUrl;
  await ctx.sendMail({
    to: row.email,
    headers: { 'X-Lariat-Workspace': row.notice.workspaceId, 'X-Lariat-Notice': row.notice.kind },
    subject: `${row.notice.title} (${row.workspaceName})`,
    text: [
      row.notice.title,
      '',
      `Open it in Lariat: ${base}${row.notice.link}`,
      '',
      `You get this e-mail as a member of the workspace "${row.workspaceName}". Choose which e-mails you get on the Reviews page: ${base}/w/${row.notice.workspaceId}/reviews#mail`,
    ].join('\n'),
  });
  await markMailed();
}

