/**
 * Authentication of the consumer API (/api/v1): `Authorization: Bearer lariat_...` and nothing else.
 * Cookies are never read here, so a browser session cannot call the consumer API, and the session
 * middleware never reads this header, so a key cannot act as a session. Unknown, revoked and expired
 * keys get a 401 (the holder of a revoked or expired key learns only that); a model outside the key's
 * workspace or scope is a 404 with one message for both, so a key cannot probe for other models.
 */
import type { Request, RequestHandler } from 'express';
import { and, eq, sql } from 'drizzle-orm';
import type { AppContext } from '../../context';
import { apiKeyModels, apiKeys } from '../../db/schema/index';
import { HttpError, notFound } from '../../http/errors';
import { hashApiKey, looksLikeApiKey } from './secret';

export interface RequestApiKey {
  id: string;
  name: string;
  workspaceId: string;
  scope: 'workspace' | 'models';
}

declare module 'express-serve-static-core' {
  interface Request {
    /** Set by requireApiKey (consumer API only). */
    apiKey?: RequestApiKey;
  }
}

const refused = (message: string) => new HttpError(401, message, 'Authorization');

/** last_used_at is written at most once a minute per key: a busy consumer should not write on every call. */
const LAST_USED_GRANULARITY_MS = 60_000;

export function requireApiKey(ctx: AppContext): RequestHandler {
  return async (req, res, next) => {
    res.set('WWW-Authenticate', 'Bearer realm="lariat-consumer-api"');
    const header = req.get('authorization');
    if (!header) throw refused('Send your API key in the Authorization header: "Bearer lariat_...". Browser sessions do not work here.');
    const match = /^Bearer\s+(\S+)\s*$/i.exec(header);
    if (!match || !looksLikeApiKey(match[1])) throw refused('The Authorization header must be "Bearer " followed by a Lariat API key (lariat_...).');
    const [row] = await ctx.db.select().from(apiKeys).where(eq(apiKeys.keyHash, hashApiKey(match[1])));
    if (!row) throw refused('This API key is not valid.');
    if (row.revokedAt) throw refused('This API key was revoked; ask a workspace admin for a new one.');
    const now = new Date();
    if (row.expiresAt <= now) throw refused('This API key has expired; ask a workspace admin for a new one.');
    if (!row.lastUsedAt || now.getTime() - row.lastUsedAt.getTime() > LAST_USED_GRANULARITY_MS) {
      await ctx.db.update(apiKeys).set({ lastUsedAt: sql`now()` }).where(eq(apiKeys.id, row.id));
    }
    res.set('Cache-Control', 'no-store');
    req.apiKey = { id: row.id, name: row.name, workspaceId: row.workspaceId, scope: row.scope };
    next();
  };
}

export function requestKey(req: Request): RequestApiKey {
  if (!req.apiKey) throw refused('Send your API key in the Authorization header.');
  return req.apiKey;
}

export const HIDDEN_MODEL = 'No released model with this id is visible to this API key.';

/** The model ids a `models`-scoped key may see (null: every model of its workspace). */
export async function scopedModelIds(ctx: AppContext, key: RequestApiKey): Promise<Set<string> | null> {
  if (key.scope === 'workspace') return null;
  const rows = await ctx.db.select({ modelId: apiKeyModels.modelId }).from(apiKeyModels).where(eq(apiKeyModels.keyId, key.id));
  return new Set(rows.map((r) => r.modelId));
}

/** 404 unless the key's scope includes this model (the workspace check comes with the release lookup). */
export async function requireModelInScope(ctx: AppContext, key: RequestApiKey, modelId: string): Promise<void> {
  if (key.scope === 'workspace') return;
  const [row] = await ctx.db
    .select({ modelId: apiKeyModels.modelId })
    .from(apiKeyModels)
    .where(and(eq(apiKeyModels.keyId, key.id), eq(apiKeyModels.modelId, modelId)));
  if (!row) throw notFound(HIDDEN_MODEL);
}
