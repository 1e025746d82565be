/**
 * Datasets and their immutable versions (data intake). A dataset has versions 1, 2, ...; each version
 * points at an upload (the original file, stored in 1 MB chunks, and its parsed columns) and carries
 * its own column schema. A column-settings change is a new version sharing the same upload
 * (docs/decisions/0003-dataset-versions-and-column-settings.md). Rows are never updated: a trigger
 * in the migration refuses UPDATE on versions, uploads, chunks and columns.
 */
import { customType, index, integer, jsonb, pgTable, primaryKey, text, timestamp, unique, uuid, bigint } from 'drizzle-orm/pg-core';
import type { ColumnSchema, ParseReport } from '../../../shared/datasets';
import { users, workspaces } from './auth';

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => 'bytea' });
const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow();

export const datasets = pgTable(
  'datasets',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    workspaceId: uuid('workspace_id')
      .notNull()
      .references(() => workspaces.id, { onDelete: 'cascade' }),
    name: text('name').notNull(),
    description: text('description').notNull().default(''),
    /** Key of the bundled open dataset (datasets/open) it was imported from. */
    openKey: text('open_key'),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [index('datasets_workspace_idx').on(t.workspaceId)],
);

export const datasetUploads = pgTable(
  'dataset_uploads',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    datasetId: uuid('dataset_id')
      .notNull()
      .references(() => datasets.id, { onDelete: 'cascade' }),
    fileName: text('file_name').notNull(),
    sha256: text('sha256').notNull(),
    sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull(),
    rowCount: integer('row_count').notNull(),
    columnCount: integer('column_count').notNull(),
    report: jsonb('report').$type<ParseReport>().notNull(),
    createdAt: createdAt(),
  },
  (t) => [unique('dataset_uploads_checksum_unique').on(t.datasetId, t.sha256)],
);

/** The original file, in order; chunks keep every statement (and server memory) small. */
export const datasetFileChunks = pgTable(
  'dataset_file_chunks',
  {
    uploadId: uuid('upload_id')
      .notNull()
      .references(() => datasetUploads.id, { onDelete: 'cascade' }),
    seq: integer('seq').notNull(),
    data: bytea('data').notNull(),
  },
  (t) => [primaryKey({ columns: [t.uploadId, t.seq] })],
);

/** Parsed values of one column, in the storage format of server/datasets/storage/codec.ts. */
export const datasetColumns = pgTable(
  'dataset_columns',
  {
    uploadId: uuid('upload_id')
      .notNull()
      .references(() => datasetUploads.id, { onDelete: 'cascade' }),
    position: integer('position').notNull(),
    name: text('name').notNull(),
    storage: text('storage', { enum: ['float64', 'codes', 'text'] }).notNull(),
    levels: jsonb('levels').$type<string[]>(),
    data: bytea('data').notNull(),
  },
  (t) => [primaryKey({ columns: [t.uploadId, t.position] })],
);

export const datasetVersions = pgTable(
  'dataset_versions',
  {
    id: uuid('id').primaryKey().defaultRandom(),
    datasetId: uuid('dataset_id')
      .notNull()
      .references(() => datasets.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    uploadId: uuid('upload_id')
      .notNull()
      .references(() => datasetUploads.id, { onDelete: 'cascade' }),
    origin: text('origin', { enum: ['upload', 'column-settings', 'open-dataset'] }).notNull(),
    basedOn: integer('based_on'),
    columns: jsonb('columns').$type<ColumnSchema[]>().notNull(),
    createdBy: uuid('created_by').references(() => users.id, { onDelete: 'set null' }),
    createdAt: createdAt(),
  },
  (t) => [unique('dataset_versions_number_unique').on(t.datasetId, t.number), index('dataset_versions_upload_idx').on(t.uploadId)],
);
