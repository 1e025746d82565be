/**
 * Datasets and their immutable versions: column types, the parse report, summaries, and the request
 * bodies of the datasets API. One source for the client's forms and the Express handlers.
 */
import { z } from 'zod';
import { multiLine, singleLine } from './text';

/** Missing-value markers used when an upload names none (compared trimmed, case-insensitively). */
export const DEFAULT_MISSING_MARKERS = ['', 'NA', 'N/A', 'NaN', 'null', '?'] as const;

/** A text column with more distinct values than this is not offered as categorical by default. */
export const CATEGORICAL_LEVEL_LIMIT = 200;
/** The most levels an analyst may force onto a categorical column. */
export const CATEGORICAL_OVERRIDE_LIMIT = 2000;
/** Rows the preview endpoint returns at most per request. */
export const PREVIEW_ROW_LIMIT = 2000;

/**
 * numeric: real numbers. binary: exactly two distinct values. categorical: a few levels.
 * identifier: distinct keys or row numbers. text: free text. The last two are left out of modelling
 * by default; every column may be excluded.
 */
export const COLUMN_TYPES = ['numeric', 'binary', 'categorical', 'identifier', 'text'] as const;
export type ColumnType = (typeof COLUMN_TYPES)[number];

export const COLUMN_TYPE_LABELS: Record<ColumnType, string> = {
  numeric: 'Number',
  binary: 'Yes/no (two values)',
  categorical: 'Categories',
  identifier: 'Identifier',
  text: 'Free text',
};

export interface LevelCount {
  level: string;
  count: number;
}

export interface HistogramBin {
  from: number;
  to: number;
  count: number;
}

/** Per-column summary (numbers computed with simple-statistics). */
export interface ColumnSummary {
  count: number;
  missing: number;
  /** null when more distinct values than were tracked. */
  distinct: number | null;
  mean?: number;
  sd?: number;
  min?: number;
  q1?: number;
  median?: number;
  q3?: number;
  max?: number;
  histogram?: HistogramBin[];
  /** Most frequent first; at most 50 levels. */
  levels?: LevelCount[];
}

export interface ColumnSchema {
  name: string;
  /** 0-based position in the file. */
  position: number;
  type: ColumnType;
  /** What the upload's inference chose, and why. */
  inferredType: ColumnType;
  reason: string;
  /** Left out of modelling (default for identifier and text). */
  excluded: boolean;
  /** True when the analyst changed type or exclusion from what was inferred. */
  overridden: boolean;
  summary: ColumnSummary;
}

export interface ParseReport {
  fileName: string;
  /** The delimiter character, or "whitespace" when columns are separated by runs of spaces or tabs. */
  delimiter: string;
  /**
   * Whether the first row held the column names (false: the uploader said it is data, and columns
   * are named column_1, column_2, ...). Absent in reports stored before the choice existed: true.
   */
  headerRow?: boolean;
  encoding: 'utf-8';
  byteOrderMark: boolean;
  lineEndings: 'LF' | 'CRLF' | 'CR' | 'none';
  missingMarkers: string[];
  rowCount: number;
  columnCount: number;
  /** Blank lines skipped (not counted as rows). */
  blankLinesSkipped: number;
  /** Plain sentences: what was inferred, excluded, and why. */
  notes: string[];
}

export interface UserRef {
  id: string | null;
  name: string;
}

export interface VersionSummaryDto {
  id: string;
  number: number;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  rowCount: number;
  columnCount: number;
  /** Why this version exists: a new upload, or changed column settings of version `basedOn`. */
  origin: 'upload' | 'column-settings' | 'open-dataset';
  basedOn: number | null;
  createdBy: UserRef;
  createdAt: string;
}

export interface VersionDetailDto extends VersionSummaryDto {
  datasetId: string;
  datasetName: string;
  columns: ColumnSchema[];
  report: ParseReport;
}

export interface DatasetDto {
  id: string;
  name: string;
  description: string;
  /** Key of the bundled open dataset it came from, if any. */
  openKey: string | null;
  createdBy: UserRef;
  createdAt: string;
  versionCount: number;
  latest: VersionSummaryDto;
}

export interface DatasetDetailDto extends Omit<DatasetDto, 'latest'> {
  versions: VersionSummaryDto[];
}

export interface UploadResultDto {
  datasetId: string;
  version: VersionSummaryDto;
  /** True when the file was already stored (same SHA-256): nothing new was stored. */
  duplicate: boolean;
  message: string;
}

/** queued: received, waiting for one of the server's ingest slots. */
export type IngestPhase = 'receiving' | 'queued' | 'parsing' | 'storing' | 'done' | 'failed';

/** GET /api/workspaces/:workspaceId/ingests/:ingestId */
export interface IngestProgressDto {
  id: string;
  phase: IngestPhase;
  bytesReceived: number;
  /** Parsing and storing: fraction in [0, 1] of the current phase. */
  fraction: number;
  rowsParsed: number;
  message: string | null;
}

export interface PreviewDto {
  columns: string[];
  offset: number;
  totalRows: number;
  /** Row-major cells; null = missing; numbers for numeric and numeric-binary columns. */
  rows: (string | number | null)[][];
}

export interface OpenDatasetDto {
  key: string;
  title: string;
  fileName: string;
  description: string;
  citation: string;
  licence: string;
  /** Dataset id in this workspace when already imported. */
  importedAs: string | null;
}

const name = singleLine(z.string().trim().min(1, 'Give the dataset a name.').max(200, 'At most 200 characters.'));
const description = multiLine(z.string().trim().max(2000, 'At most 2000 characters.'));

/** An uploaded file's name (from the multipart Content-Disposition), as stored and shown. */
export const fileNameSchema = singleLine(z.string().min(1, 'The file has no name.').max(200, 'A file name has at most 200 characters.'));

/** Multipart text fields of POST .../datasets/uploads (sent before the file part). */
export const uploadFieldsSchema = z.strictObject({
  name: name.optional(),
  description: description.optional(),
  /** Add a version to this dataset instead of creating one. */
  datasetId: z.uuid('datasetId must be a dataset id').optional(),
  /** Comma-separated markers; absent: DEFAULT_MISSING_MARKERS. */
  missing: singleLine(z.string().max(500, 'At most 500 characters of markers.')).optional(),
  /** "no": the file's first row is data, not column names (columns become column_1, column_2, ...). */
  headerRow: z.enum(['yes', 'no'], { error: () => 'headerRow must be "yes" or "no".' }).optional(),
});
export type UploadFields = z.infer<typeof uploadFieldsSchema>;

export function parseMissingMarkers(text: string | undefined): string[] {
  if (text === undefined) return [...DEFAULT_MISSING_MARKERS];
  return [...new Set(text.split(',').map((m) => m.trim()))];
}

/** POST .../datasets/:datasetId/versions/:number/column-settings: creates the next version. */
export const columnSettingsSchema = z.strictObject({
  columns: z
    .array(
      z.strictObject({
        name: singleLine(z.string().min(1)),
        type: z.enum(COLUMN_TYPES, { error: () => `Choose one of: ${COLUMN_TYPES.join(', ')}.` }),
        excluded: z.boolean(),
      }),
    )
    .min(1, 'Change at least one column.'),
});
export type ColumnSettingsInput = z.infer<typeof columnSettingsSchema>;

export const ingestIdSchema = z.uuid('ingest must be a UUID chosen by the client');
