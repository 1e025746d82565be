/**
 * Consumers of released fits: API keys, webhooks (managed by workspace admins), and the consumer
 * API's request shapes (/api/v1, authenticated by a key). One source for the client's forms and the
 * Express handlers; the consumer API's full description is its OpenAPI document (server/consumers/openapi.ts).
 */
import { z } from 'zod';
import type { UserRef } from './datasets';

// ---- limits -------------------------------------------------------------------------------------
export const KEY_NAME_MAX = 120;
export const MAX_KEY_DAYS = 366;
export const DEFAULT_KEY_DAYS = 90;
export const MAX_KEY_MODELS = 200;
/** Rows per scoring request (JSON or CSV); larger batches are split by the caller. */
export const MAX_SCORE_ROWS = 50_000;
/** Body size of a scoring request. */
export const MAX_SCORE_BYTES = 8 * 1024 * 1024;
export const WEBHOOK_URL_MAX = 2000;
/** Header names of a webhook delivery. */
export const WEBHOOK_SIGNATURE_HEADER = 'X-Lariat-Signature';
export const WEBHOOK_TIMESTAMP_HEADER = 'X-Lariat-Timestamp';
export const WEBHOOK_DELIVERY_HEADER = 'X-Lariat-Delivery';
/** A receiver should refuse a delivery whose timestamp is further than this from its clock. */
export const WEBHOOK_TOLERANCE_SECONDS = 300;

// ---- keys ---------------------------------------------------------------------------------------
/** POST /api/workspaces/:workspaceId/keys */
export const createKeySchema = z
  .strictObject({
    name: z.string({ error: 'Give the key a name.' }).trim().min(1, 'Give the key a name.').max(KEY_NAME_MAX, `At most ${KEY_NAME_MAX} characters.`),
    /** workspace: every released model of the workspace; models: only those listed in modelIds. */
    scope: z.enum(['workspace', 'models'], { error: () => 'Choose the scope: workspace or models.' }),
    modelIds: z.array(z.uuid('Each model id must be a model id.')).max(MAX_KEY_MODELS, `At most ${MAX_KEY_MODELS} models.`).default([]),
    expiresInDays: z
      .number({ error: 'Give the days until the key expires.' })
      .int('Give whole days.')
      .min(1, 'At least 1 day.')
      .max(MAX_KEY_DAYS, `At most ${MAX_KEY_DAYS} days.`)
      .default(DEFAULT_KEY_DAYS),
  })
  .superRefine((k, ctx) => {
    if (k.scope === 'models' && k.modelIds.length === 0) ctx.addIssue({ code: 'custom', path: ['modelIds'], message: 'Choose at least one model.' });
    if (k.scope === 'workspace' && k.modelIds.length > 0) ctx.addIssue({ code: 'custom', path: ['modelIds'], message: 'A workspace-wide key lists no models.' });
  });
export type CreateKeyInput = z.input<typeof createKeySchema>;

export type KeyState = 'active' | 'expired' | 'revoked';
export const KEY_STATE_LABELS: Record<KeyState, string> = { active: 'Active', expired: 'Expired', revoked: 'Revoked' };

export interface ApiKeyDto {
  id: string;
  name: string;
  /** First characters of the key, to tell keys apart (the key itself is never shown again). */
  prefix: string;
  scope: 'workspace' | 'models';
  models: { id: string; name: string }[];
  state: KeyState;
  createdBy: UserRef | null;
  createdAt: string;
  expiresAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

/** The answer to creating a key: the only time the key is shown. */
export interface CreatedKeyDto extends ApiKeyDto {
  key: string;
}

// ---- webhooks -----------------------------------------------------------------------------------
/** POST /api/workspaces/:workspaceId/webhooks */
export const createWebhookSchema = z.strictObject({
  url: z
    .string({ error: 'Give the address to call.' })
    .trim()
    .max(WEBHOOK_URL_MAX, `At most ${WEBHOOK_URL_MAX} characters.`)
    .refine((u) => URL.canParse(u) && ['http:', 'https:'].includes(new URL(u).protocol), 'Give an http:// or https:// address.'),
  /** Absent or null: releases of every model of the workspace. */
  modelId: z.uuid('modelId must be a model id').nullable().default(null),
  description: z.string().trim().max(500, 'At most 500 characters.').default(''),
});
export type CreateWebhookInput = z.input<typeof createWebhookSchema>;

export interface WebhookDto {
  id: string;
  url: string;
  model: { id: string; name: string } | null;
  description: string;
  createdBy: UserRef | null;
  createdAt: string;
  removedAt: string | null;
}

export interface CreatedWebhookDto extends WebhookDto {
  /** Signs every delivery (HMAC-SHA256); shown once. */
  secret: string;
}

export type DeliveryState = 'pending' | 'delivered' | 'failed';
export const DELIVERY_STATE_LABELS: Record<DeliveryState, string> = { pending: 'Trying', delivered: 'Delivered', failed: 'Gave up' };

export interface WebhookDeliveryDto {
  id: string;
  webhookId: string;
  releaseId: string;
  event: string;
  state: DeliveryState;
  attempts: { at: string; status: number | null; error: string | null; ms: number }[];
  createdAt: string;
  deliveredAt: string | null;
}

/** What a webhook receives (JSON body), event `release.published`. */
export interface ReleaseEventDto {
  event: 'release.published';
  deliveryId: string;
  workspaceId: string;
  model: { id: string; name: string };
  release: { id: string; number: number; fitId: string; fitVersion: number; releasedAt: string };
  /** Where a key holder reads the release. */
  url: string;
}

// ---- consumer API -------------------------------------------------------------------------------
/**
 * POST /api/v1/models/:modelId/score: JSON `{ "rows": [ { column: number | text | null } ] }` or a CSV
 * body (Content-Type text/csv). The server checks the shape by hand (server/consumers/api/score.ts):
 * at 10,000 rows a schema library's per-cell work costs more than the scoring itself.
 */
export interface ScoreRowDto {
  row: number;
  linearPredictor: number | null;
  /** Binomial only. */
  probability?: number | null;
  error: string | null;
}

export interface ScoreResponseDto {
  modelId: string;
  releaseId: string;
  releaseNumber: number;
  fitId: string;
  lambda: number;
  family: 'gaussian' | 'binomial';
  rowErrors: number;
  rows: ScoreRowDto[];
  cautions: string[];
}
