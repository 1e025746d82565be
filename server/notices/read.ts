/** The signed-in person's notices in one workspace, and marking them read. */
import { and, desc, eq, inArray, isNull } from 'drizzle-orm';
import { mailPreferencesSchema, markNoticesReadSchema, type MailPreferencesDto, type NoticeDto } from '../../shared/reviews';
import type { Executor } from '../datasets/data/executor';
import { mailPreferences, notices } from '../db/schema/index';
import { fromZod } from '../http/errors';
import { mailPreferencesOf } from './notify';

export async function listNotices(db: Executor, workspaceId: string, userId: string): Promise<NoticeDto[]> {
  const rows = await db
    .select()
    .from(notices)
    .where(and(eq(notices.workspaceId, workspaceId), eq(notices.userId, userId)))
    .orderBy(desc(notices.createdAt))
    .limit(100);
  return rows.map((n) => ({ id: n.id, kind: n.kind, title: n.title, link: n.link, createdAt: n.createdAt.toISOString(), read: n.readAt !== null }));
}

export async function markNoticesRead(db: Executor, workspaceId: string, userId: string, body: unknown): Promise<{ marked: number }> {
  const parsed = markNoticesReadSchema.safeParse(body ?? {});
  if (!parsed.success) throw fromZod(parsed.error);
  const where = [eq(notices.workspaceId, workspaceId), eq(notices.userId, userId), isNull(notices.readAt)];
  if (parsed.data.ids) where.push(inArray(notices.id, parsed.data.ids.length ? parsed.data.ids : ['00000000-0000-4000-8000-000000000000']));
  const rows = await db.update(notices).set({ readAt: new Date() }).where(and(...where)).returning({ id: notices.id });
  return { marked: rows.length };
}

export async function getMailPreferences(db: Executor, userId: string): Promise<MailPreferencesDto> {
  return mailPreferencesOf(db, userId);
}

export async function setMailPreferences(db: Executor, userId: string, body: unknown): Promise<MailPreferencesDto> {
  const parsed = mailPreferencesSchema.safeParse(body ?? {});
  if (!parsed.success) throw fromZod(parsed.error);
  const values = { ...parsed.data, updatedAt: new Date() };
  await db.insert(mailPreferences).values({ userId, ...values }).onConflictDoUpdate({ target: mailPreferences.userId, set: values });
  return mailPreferencesOf(db, userId);
}
