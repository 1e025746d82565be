/**
 * Models and their fits. A fit is version 1, 2, ... of a model: its spec, dataset version, engine
 * version and seed never change; while it runs, its status and progress do; once it has ended, only
 * the chosen lambda may change (a trigger in the migration enforces that). Large numeric results are
 * stored as little-endian Float64Array / Uint8Array bytes (bytea), not one row per number
 * (docs/decisions/0004-fits-storage-and-queue.md).
 */
import { boolean, customType, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uuid } from 'drizzle-orm/pg-core';
import type { FitSpec } from '../../../shared/fits';
import type { FitKeyMetricsDto } from '../../../shared/models';
import type { FitStoredResults, FitStoredProgress, FitStoredTimings, FoldStoredLosses, StoredEvaluation } from '../../fits/stored-types';
import { users, workspaces } from './auth';
import { datasets, datasetVersions } from './datasets';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });
const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();

export const models = pgTable(
  'models',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    description: text('description').notNull().default(''),
    // RESTRICT: a dataset with models cannot be deleted (the datasets service explains which).
    datasetId: uuid('dataset_id')
      .notNull()
      .references(() => datasets.id, { onDelete: 'restrict' }),
    outcome: text('outcome').notNull(),
    family: text('family', { enum: ['gaussian', 'binomial'] }).notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [unique('models_name_unique').on(t.workspaceId, t.name), index('models_dataset_idx').on(t.datasetId)],
);

export const fits = pgTable(
  'fits',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    modelId: uuid('model_id')
      .notNull()
      .references(() => models.id, { onDelete: 'cascade' }),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    version: integer('version').notNull(),
    spec: jsonb('spec').$type<FitSpec>().notNull(),
    // RESTRICT: the real protection of a dataset version a fit was made from.
    datasetVersionId: uuid('dataset_version_id')
      .notNull()
      .references(() => datasetVersions.id, { onDelete: 'restrict' }),
    datasetSha256: text('dataset_sha256').notNull(),
    engineVersion: text('engine_version').notNull(),
    seed: integer('seed'),
    status: text('status', { enum: ['waiting', 'running', 'finished', 'failed', 'cancelled'] }).notNull(),
    unconverged: boolean('unconverged').notNull().default(false),
    message: text('message'),
    progress: jsonb('progress').$type<FitStoredProgress>().notNull(),
    timings: jsonb('timings').$type<FitStoredTimings>().notNull().default({}),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
    startedAt: timestamp('started_at', { withTimezone: true }),
    finishedAt: timestamp('finished_at', { withTimezone: true }),
    /** Small results (lambdas, certificates, CV curves, terms); null until finished. */
    results: jsonb('results').$type<FitStoredResults>(),
    /** Float64Array [lambda][term], original scale. */
    coefficients: bytea('coefficients'),
    standardizedCoefficients: bytea('standardized_coefficients'),
    /** Uint8Array [lambda][term]: how many CV folds kept the term at that lambda. */
    selectionCounts: bytea('selection_counts'),
    /** The one thing that may change after the fit ended. */
    chosenIndex: integer('chosen_index'),
    chosenRule: text('chosen_rule', { enum: ['minimum', 'one-standard-error', 'manual', 'last'] }),
    chosenBy: uuid('chosen_by').references(() => users.id, { onDelete: 'set null' }),
    chosenAt: timestamp('chosen_at', { withTimezone: true }),
    /** The numbers shown in version lists, at the chosen lambda (follow the choice). */
    keyMetrics: jsonb('key_metrics').$type<FitKeyMetricsDto>(),
  },
  (t) => [
    unique('fits_version_unique').on(t.modelId, t.version),
    index('fits_workspace_idx').on(t.workspaceId),
    index('fits_dataset_version_idx').on(t.datasetVersionId),
  ],
);

/** One cross-validation fold's result, written once by whichever worker finished it first. */
export const fitFolds = pgTable(
  'fit_folds',
  {
    fitId: uuid('fit_id')
      .notNull()
      .references(() => fits.id, { onDelete: 'cascade' }),
    fold: integer('fold').notNull(),
    /** Which worker process ran it (host:pid or LARIAT_WORKER_NAME). */
    worker: text('worker').notNull(),
    attempt: integer('attempt').notNull(),
    nTest: integer('n_test').notNull(),
    losses: jsonb('losses').$type<FoldStoredLosses>().notNull(),
    /** Uint8Array [lambda][term]: 1 where the fold's fit keeps the term. */
    support: bytea('support').notNull(),
    timeMs: integer('time_ms').notNull(),
    finishedAt: timestamp('finished_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.fitId, t.fold] })],
);

/** What depends on the chosen lambda and needs the data: refit, diagnostics, holdout metrics. */
export const fitEvaluations = pgTable(
  'fit_evaluations',
  {
    fitId: uuid('fit_id')
      .notNull()
      .references(() => fits.id, { onDelete: 'cascade' }),
    lambdaIndex: integer('lambda_index').notNull(),
    state: text('state', { enum: ['waiting', 'ready', 'failed'] }).notNull(),
    message: text('message'),
    result: jsonb('result').$type<StoredEvaluation>(),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.fitId, t.lambdaIndex] })],
);
