/**
 * Reviews, releases, the audit log and notices (issue 11, review and release half).
 *
 * A review is one request to check one fit; it is `waiting` until a reviewer approves it or sends it
 * back (or the requester withdraws it). A model's CURRENT release is its release with the highest
 * number; restoring an older release adds a new row pointing at the older fit, so the history is never
 * rewritten. `audit_events` is append-only: a trigger (custom migration) refuses UPDATE and DELETE, and
 * the table has no foreign keys on purpose — deleting a user or workspace must not rewrite the log.
 */
import { boolean, index, integer, jsonb, pgTable, text, timestamp, unique, uniqueIndex, uuid } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { REVIEW_STATES, NOTICE_KINDS } from '../../../shared/reviews';
import { users, workspaces } from './auth';
import { fits, models } from './fits';

const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();

export const reviews = pgTable(
  'reviews',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    modelId: uuid('model_id')
      .notNull()
      .references(() => models.id, { onDelete: 'cascade' }),
    fitId: uuid('fit_id')
      .notNull()
      .references(() => fits.id, { onDelete: 'cascade' }),
    state: text('state', { enum: REVIEW_STATES }).notNull().default('waiting'),
    /** The fit's chosen lambda when the review was asked for: an approval covers that lambda only. */
    lambdaIndex: integer('lambda_index').notNull(),
    /** What the requester asks the reviewers to look at. */
    note: text('note').notNull().default(''),
    requestedBy: uuid('requested_by').references(() => users.id, { onDelete: 'set null' }),
    requestedAt: timestamp('requested_at', { withTimezone: true }).notNull().defaultNow(),
    decidedBy: uuid('decided_by').references(() => users.id, { onDelete: 'set null' }),
    decidedAt: timestamp('decided_at', { withTimezone: true }),
    /** The reviewer's reasons (required when sending back). */
    reasons: text('reasons'),
  },
  (t) => [
    index('reviews_workspace_idx').on(t.workspaceId, t.requestedAt),
    index('reviews_fit_idx').on(t.fitId),
    // At most one open review per fit.
    uniqueIndex('reviews_one_waiting_per_fit').on(t.fitId).where(sql`state = 'waiting'`),
  ],
);

/** A comment on a review: on the fit as a whole (term null) or on one coefficient (term = its name). */
export const reviewComments = pgTable(
  'review_comments',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    reviewId: uuid('review_id')
      .notNull()
      .references(() => reviews.id, { onDelete: 'cascade' }),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    authorId: uuid('author_id').references(() => users.id, { onDelete: 'set null' }),
    term: text('term'),
    body: text('body').notNull(),
    createdAt: createdAt(),
  },
  (t) => [index('review_comments_review_idx').on(t.reviewId, t.createdAt)],
);

export const releases = pgTable(
  'releases',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    modelId: uuid('model_id')
      .notNull()
      .references(() => models.id, { onDelete: 'cascade' }),
    // NO ACTION (checked at the end of the statement): a released fit cannot be deleted on its own,
    // yet deleting the whole model removes its releases and fits together.
    fitId: uuid('fit_id')
      .notNull()
      .references(() => fits.id, { onDelete: 'no action' }),
    /** The lambda released (the approved one); later choices on the fit do not change a release. */
    lambdaIndex: integer('lambda_index').notNull(),
    /** 1, 2, ... per model; the highest is the current release. */
    number: integer('number').notNull(),
    notes: text('notes').notNull(),
    /** The approved review this release rests on (the restored release's review for a restore). */
    reviewId: uuid('review_id').references(() => reviews.id, { onDelete: 'set null' }),
    releasedBy: uuid('released_by').references(() => users.id, { onDelete: 'set null' }),
    releasedAt: timestamp('released_at', { withTimezone: true }).notNull().defaultNow(),
    restoredFromReleaseId: uuid('restored_from_release_id'),
  },
  (t) => [unique('releases_number_unique').on(t.modelId, t.number), index('releases_workspace_idx').on(t.workspaceId)],
);

/**
 * Append-only log of every change of state: who (user or API key), what, when, from where.
 * No foreign keys: the log outlives the users, keys and workspaces it names.
 */
export const auditEvents = pgTable(
  'audit_events',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id'),
    actorUserId: uuid('actor_user_id'),
    actorApiKeyId: uuid('actor_api_key_id'),
    /** A readable label of the actor at the time (e-mail address or key name). */
    actorLabel: text('actor_label').notNull().default(''),
    /** Dotted plain words, e.g. `review.requested`, `release.published`, `key.revoked`. */
    action: text('action').notNull(),
    targetType: text('target_type').notNull(),
    targetId: text('target_id'),
    details: jsonb('details').$type<Record<string, unknown>>().notNull().default({}),
    ip: text('ip'),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('audit_events_workspace_idx').on(t.workspaceId, t.at)],
);

/** In-app notices (the bell); e-mail goes separately through the queue. */
export const notices = pgTable(
  'notices',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    userId: uuid('user_id')
      .notNull()
      .references(() => users.id, { onDelete: 'cascade' }),
    kind: text('kind', { enum: NOTICE_KINDS }).notNull(),
    title: text('title').notNull(),
    /** Client path the notice links to, e.g. /w/:ws/reviews/:id. */
    link: text('link').notNull(),
    createdAt: createdAt(),
    readAt: timestamp('read_at', { withTimezone: true }),
    /** When its e-mail went out (or was skipped by the person's opt-out): a retried job skips it. */
    mailedAt: timestamp('mailed_at', { withTimezone: true }),
  },
  (t) => [index('notices_user_idx').on(t.userId, t.createdAt)],
);

/** Per-user e-mail opt-out; no row means every e-mail is wanted. */
export const mailPreferences = pgTable('mail_preferences', {
  userId: uuid('user_id')
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  reviewRequested: boolean('review_requested').notNull().default(true),
  reviewDecided: boolean('review_decided').notNull().default(true),
  releasePublished: boolean('release_published').notNull().default(true),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});
