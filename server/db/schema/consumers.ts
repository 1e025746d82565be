/**
 * Consumers of released fits (issue 11): API keys and webhooks, both managed by workspace admins.
 *
 * A key is shown once at creation; only its SHA-256 is stored (the key is 32 random bytes, so a fast
 * hash is enough: there is nothing to brute-force, unlike a password). A key is scoped to the whole
 * workspace or to the models listed in api_key_models. A webhook's secret signs its deliveries, so it
 * must be stored as is (it is shown once too, and never again by the API).
 */
import { index, integer, jsonb, pgTable, primaryKey, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { users, workspaces } from './auth';
import { models } from './fits';

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();

export const apiKeys = pgTable(
  'api_keys',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    /** The key's first characters (e.g. `lariat_AbCd12`), shown in lists so people can tell keys apart. */
    prefix: text('prefix').notNull(),
    keyHash: text('key_hash').notNull().unique(),
    scope: text('scope', { enum: ['workspace', 'models'] }).notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
    lastUsedAt: timestamp('last_used_at', { withTimezone: true }),
    revokedAt: timestamp('revoked_at', { withTimezone: true }),
    revokedBy: uuid('revoked_by').references(() => users.id, { onDelete: 'set null' }),
  },
  (t) => [index('api_keys_workspace_idx').on(t.workspaceId)],
);

/** The models a key with scope `models` may read and score. */
export const apiKeyModels = pgTable(
  'api_key_models',
  {
    keyId: uuid('key_id')
      .notNull()
      .references(() => apiKeys.id, { onDelete: 'cascade' }),
    modelId: uuid('model_id')
      .notNull()
      .references(() => models.id, { onDelete: 'cascade' }),
  },
  (t) => [primaryKey({ columns: [t.keyId, t.modelId] })],
);

export const webhooks = pgTable(
  'webhooks',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    url: text('url').notNull(),
    /** Null: every model of the workspace. */
    modelId: uuid('model_id').references(() => models.id, { onDelete: 'cascade' }),
    description: text('description').notNull().default(''),
    secret: text('secret').notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    /** Removed webhooks stay (their delivery history stays readable) but get nothing more. */
    removedAt: timestamp('removed_at', { withTimezone: true }),
  },
  (t) => [index('webhooks_workspace_idx').on(t.workspaceId)],
);

export interface DeliveryAttempt {
  at: string;
  /** HTTP status of the receiver's answer; null when no answer came (refused, timed out). */
  status: number | null;
  error: string | null;
  ms: number;
}

/** One release announced to one webhook; each try is appended to `attempts`. */
export const webhookDeliveries = pgTable(
  'webhook_deliveries',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    webhookId: uuid('webhook_id')
      .notNull()
      .references(() => webhooks.id, { onDelete: 'cascade' }),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    /** The release announced (no foreign key: the releases table belongs to the review half). */
    releaseId: uuid('release_id').notNull(),
    event: text('event').notNull(),
    payload: jsonb('payload').$type<Record<string, unknown>>().notNull(),
    state: text('state', { enum: ['pending', 'delivered', 'failed'] }).notNull().default('pending'),
    attemptCount: integer('attempt_count').notNull().default(0),
    attempts: jsonb('attempts').$type<DeliveryAttempt[]>().notNull().default([]),
    createdAt: createdAt(),
    deliveredAt: timestamp('delivered_at', { withTimezone: true }),
  },
  (t) => [index('webhook_deliveries_webhook_idx').on(t.webhookId, t.createdAt)],
);
