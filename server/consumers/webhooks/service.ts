/** Registering, listing and removing webhooks, and reading their delivery history (admins only). */
import { randomBytes } from 'node:crypto';
import { and, desc, eq, inArray } from 'drizzle-orm';
import { createWebhookSchema, type CreatedWebhookDto, type WebhookDeliveryDto, type WebhookDto } from '../../../shared/consumers';
import { recordAudit } from '../../audit/index';
import type { AppContext } from '../../context';
import type { Database } from '../../db/client';
import { models, users, webhookDeliveries, webhooks } from '../../db/schema/index';
import { fromZod, HttpError, notFound } from '../../http/errors';
import type { Actor } from '../keys/service';
import { webhookUrlProblem } from './address-check';

type WebhookRow = typeof webhooks.$inferSelect;
const DELIVERY_HISTORY = 100;

async function toDtos(db: Database, rows: WebhookRow[]): Promise<WebhookDto[]> {
  const modelIds = rows.flatMap((r) => (r.modelId ? [r.modelId] : []));
  const userIds = rows.flatMap((r) => (r.createdBy ? [r.createdBy] : []));
  const named = modelIds.length ? await db.select({ id: models.id, name: models.name }).from(models).where(inArray(models.id, modelIds)) : [];
  const people = userIds.length ? await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, userIds)) : [];
  return rows.map((r) => ({
    id: r.id,
    url: r.url,
    model: r.modelId ? { id: r.modelId, name: named.find((m) => m.id === r.modelId)?.name ?? '' } : null,
    description: r.description,
    createdBy: r.createdBy ? { id: r.createdBy, name: people.find((p) => p.id === r.createdBy)?.name ?? 'a former member' } : null,
    createdAt: r.createdAt.toISOString(),
    removedAt: r.removedAt?.toISOString() ?? null,
  }));
}

export async function listWebhooks(db: Database, workspaceId: string): Promise<WebhookDto[]> {
  return toDtos(db, await db.select().from(webhooks).where(eq(webhooks.workspaceId, workspaceId)).orderBy(desc(webhooks.createdAt)));
}

export async function createWebhook(ctx: AppContext, workspaceId: string, actor: Actor, body: unknown): Promise<CreatedWebhookDto> {
  const parsed = createWebhookSchema.safeParse(body);
  if (!parsed.success) throw fromZod(parsed.error);
  const input = parsed.data;
  const problem = await webhookUrlProblem(ctx.config, input.url);
  if (problem) throw new HttpError(400, `url: ${problem}`, 'url');
  const secret = `whsec_${randomBytes(32).toString('base64url')}`;
  const row = await ctx.db.transaction(async (tx) => {
    if (input.modelId) {
      const [model] = await tx.select({ id: models.id }).from(models).where(and(eq(models.workspaceId, workspaceId), eq(models.id, input.modelId)));
      if (!model) throw new HttpError(400, 'modelId: no such model in this workspace.', 'modelId');
    }
    const [created] = await tx.insert(webhooks).values({ workspaceId, url: input.url, modelId: input.modelId, description: input.description, secret, createdBy: actor.userId }).returning();
    await recordAudit(tx, { workspaceId, actorUserId: actor.userId, actorLabel: actor.label, action: 'webhook.created', targetType: 'webhook', targetId: created.id, details: { url: input.url, modelId: input.modelId }, ip: actor.ip });
    return created;
  });
  const [dto] = await toDtos(ctx.db, [row]);
  return { ...dto, secret };
}

export async function removeWebhook(db: Database, workspaceId: string, actor: Actor, webhookId: string): Promise<void> {
  await db.transaction(async (tx) => {
    const [found] = await tx.select().from(webhooks).where(and(eq(webhooks.workspaceId, workspaceId), eq(webhooks.id, webhookId))).for('update');
    if (!found) throw notFound('No such webhook in this workspace.');
    if (found.removedAt) return;
    await tx.update(webhooks).set({ removedAt: new Date() }).where(eq(webhooks.id, webhookId));
    await recordAudit(tx, { workspaceId, actorUserId: actor.userId, actorLabel: actor.label, action: 'webhook.removed', targetType: 'webhook', targetId: webhookId, details: { url: found.url }, ip: actor.ip });
  });
}

export async function listDeliveries(db: Database, workspaceId: string, webhookId: string): Promise<WebhookDeliveryDto[]> {
  const [hook] = await db.select({ id: webhooks.id }).from(webhooks).where(and(eq(webhooks.workspaceId, workspaceId), eq(webhooks.id, webhookId)));
  if (!hook) throw notFound('No such webhook in this workspace.');
  const rows = await db.select().from(webhookDeliveries).where(eq(webhookDeliveries.webhookId, webhookId)).orderBy(desc(webhookDeliveries.createdAt)).limit(DELIVERY_HISTORY);
  return rows.map((d) => ({
    id: d.id,
    webhookId: d.webhookId,
    releaseId: d.releaseId,
    event: d.event,
    state: d.state,
    attempts: d.attempts,
    createdAt: d.createdAt.toISOString(),
    deliveredAt: d.deliveredAt?.toISOString() ?? null,
  }));
}
