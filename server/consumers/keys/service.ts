/** Creating, listing and revoking consumer API keys (admins only; the routes check the role). */
import { and, desc, eq, inArray } from 'drizzle-orm';
import { createKeySchema, type ApiKeyDto, type CreatedKeyDto, type KeyState } from '../../../shared/consumers';
import { recordAudit } from '../../audit/index';
import type { Database } from '../../db/client';
import { apiKeyModels, apiKeys, models, users } from '../../db/schema/index';
import { fromZod, HttpError, notFound } from '../../http/errors';
import { newApiKey } from './secret';

export interface Actor {
  userId: string;
  label: string;
  ip: string | null;
}

type KeyRow = typeof apiKeys.$inferSelect;

export function keyState(row: Pick<KeyRow, 'revokedAt' | 'expiresAt'>, now = new Date()): KeyState {
  if (row.revokedAt) return 'revoked';
  return row.expiresAt <= now ? 'expired' : 'active';
}

async function toDtos(db: Database, rows: KeyRow[]): Promise<ApiKeyDto[]> {
  if (rows.length === 0) return [];
  const ids = rows.map((r) => r.id);
  const scoped = await db
    .select({ keyId: apiKeyModels.keyId, id: models.id, name: models.name })
    .from(apiKeyModels)
    .innerJoin(models, eq(models.id, apiKeyModels.modelId))
    .where(inArray(apiKeyModels.keyId, ids));
  const creators = await db.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, rows.flatMap((r) => (r.createdBy ? [r.createdBy] : []))));
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    prefix: r.prefix,
    scope: r.scope,
    models: scoped.filter((s) => s.keyId === r.id).map((s) => ({ id: s.id, name: s.name })),
    state: keyState(r),
    createdBy: r.createdBy ? { id: r.createdBy, name: creators.find((c) => c.id === r.createdBy)?.name ?? 'a former member' } : null,
    createdAt: r.createdAt.toISOString(),
    expiresAt: r.expiresAt.toISOString(),
    lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
    revokedAt: r.revokedAt?.toISOString() ?? null,
  }));
}

export async function listKeys(db: Database, workspaceId: string): Promise<ApiKeyDto[]> {
  const rows = await db.select().from(apiKeys).where(eq(apiKeys.workspaceId, workspaceId)).orderBy(desc(apiKeys.createdAt));
  return toDtos(db, rows);
}

export async function createKey(db: Database, workspaceId: string, actor: Actor, body: unknown): Promise<CreatedKeyDto> {
  const parsed = createKeySchema.safeParse(body);
  if (!parsed.success) throw fromZod(parsed.error);
  const input = parsed.data;
  const modelIds = [...new Set(input.modelIds)];
  const secret = newApiKey();
  const row = await db.transaction(async (tx) => {
    if (modelIds.length > 0) {
      const found = await tx.select({ id: models.id }).from(models).where(and(eq(models.workspaceId, workspaceId), inArray(models.id, modelIds)));
      const missing = modelIds.find((id) => !found.some((f) => f.id === id));
      if (missing) throw new HttpError(400, `modelIds: no model ${missing} in this workspace.`, 'modelIds');
    }
    const [created] = await tx
      .insert(apiKeys)
      .values({
        workspaceId,
        name: input.name,
        prefix: secret.prefix,
        keyHash: secret.hash,
        scope: input.scope,
        createdBy: actor.userId,
        expiresAt: new Date(Date.now() + input.expiresInDays * 86_400_000),
      })
      .returning();
    if (modelIds.length > 0) await tx.insert(apiKeyModels).values(modelIds.map((modelId) => ({ keyId: created.id, modelId })));
    await recordAudit(tx, {
      workspaceId,
      actorUserId: actor.userId,
      actorLabel: actor.label,
      action: 'key.created',
      targetType: 'api-key',
      targetId: created.id,
      details: { name: input.name, scope: input.scope, modelIds, expiresAt: created.expiresAt.toISOString() },
      ip: actor.ip,
    });
    return created;
  });
  const [dto] = await toDtos(db, [row]);
  return { ...dto, key: secret.key };
}

export async function revokeKey(db: Database, workspaceId: string, actor: Actor, keyId: string): Promise<ApiKeyDto> {
  const row = await db.transaction(async (tx) => {
    const [found] = await tx.select().from(apiKeys).where(and(eq(apiKeys.workspaceId, workspaceId), eq(apiKeys.id, keyId))).for('update');
    if (!found) throw notFound('No such key in this workspace.');
    if (found.revokedAt) return found; // revoking twice changes nothing
    const [updated] = await tx.update(apiKeys).set({ revokedAt: new Date(), revokedBy: actor.userId }).where(eq(apiKeys.id, keyId)).returning();
    await recordAudit(tx, { workspaceId, actorUserId: actor.userId, actorLabel: actor.label, action: 'key.revoked', targetType: 'api-key', targetId: keyId, details: { name: found.name }, ip: actor.ip });
    return updated;
  });
  const [dto] = await toDtos(db, [row]);
  return dto;
}
