/** Messages between the ingest (main thread) and its parse worker (parse-worker.ts). */
import type { ColumnSchema, ParseReport } from '../../../shared/datasets';
import type { Inference } from '../parse/infer';
import type { Reader } from '../parse/parse-file';

export interface ParseJob {
  filePath: string;
  fileName: string;
  missingMarkers: string[];
  columnLimit: number;
  spillPath: string;
  /** False: the uploader says the first row is data, not column names. */
  headerRow?: boolean;
}

export type ToWorker = { type: 'parse'; job: ParseJob } | { type: 'column'; j: number } | { type: 'close' };

/** What the ingest needs of a parsed file before it stores the columns. */
export interface ParseOutcome {
  header: string[];
  rowCount: number;
  inferences: Inference[];
  report: ParseReport;
  reader: Reader;
}

/** A stored column, its bytes moved (not copied) across threads. */
export interface ColumnMessage {
  name: string;
  storage: 'float64' | 'codes' | 'text';
  data: ArrayBuffer;
  levels: string[] | null;
  schema: ColumnSchema;
}

export interface WorkerError {
  name: string;
  message: string;
  status?: number;
  field?: string;
}

export type FromWorker =
  | { type: 'progress'; bytes: number; rows: number }
  | { type: 'parsed'; outcome: ParseOutcome }
  | { type: 'column'; j: number; column: ColumnMessage }
  | { type: 'error'; error: WorkerError };
