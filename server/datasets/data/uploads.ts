/** Data access: an upload's original file (in chunks) and its stored columns. */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { ParseReport } from '../../../shared/datasets';
import { datasetColumns, datasetFileChunks, datasetUploads } from '../../db/schema/index';
import type { StoredColumn } from '../storage/convert';
import type { Executor } from './executor';

export async function insertUpload(
  db: Executor,
  row: { id?: string; datasetId: string; fileName: string; sha256: string; sizeBytes: number; rowCount: number; columnCount: number; report: ParseReport },
): Promise<string> {
  const [created] = await db.insert(datasetUploads).values(row).returning({ id: datasetUploads.id });
  return created.id;
}

export async function insertFileChunk(db: Executor, uploadId: string, seq: number, data: Buffer): Promise<void> {
  await db.insert(datasetFileChunks).values({ uploadId, seq, data });
}

export async function insertColumn(db: Executor, uploadId: string, position: number, column: StoredColumn): Promise<void> {
  await db.insert(datasetColumns).values({ uploadId, position, name: column.name, storage: column.storage, levels: column.levels, data: column.data });
}

/** Columns by position (all when `positions` is absent), in the order asked for. */
export async function loadStoredColumns(db: Executor, uploadId: string, positions?: number[]): Promise<StoredColumn[]> {
  const where = positions ? and(eq(datasetColumns.uploadId, uploadId), inArray(datasetColumns.position, positions)) : eq(datasetColumns.uploadId, uploadId);
  const rows = await db.select().from(datasetColumns).where(where).orderBy(asc(datasetColumns.position));
  const byPosition = new Map(rows.map((r) => [r.position, { name: r.name, storage: r.storage, levels: r.levels, data: r.data } as StoredColumn]));
  return (positions ?? rows.map((r) => r.position)).map((p) => byPosition.get(p)!);
}

export async function countFileChunks(db: Executor, uploadId: string): Promise<number> {
  const rows = await db.select({ seq: datasetFileChunks.seq }).from(datasetFileChunks).where(eq(datasetFileChunks.uploadId, uploadId));
  return rows.length;
}

/** A column's storage facts without its data: the cleaned CSV reads the data a slice at a time. */
export async function listColumnStorage(db: Executor, uploadId: string): Promise<{ position: number; storage: StoredColumn['storage']; levels: string[] | null; bytes: number }[]> {
  return db
    .select({ position: datasetColumns.position, storage: datasetColumns.storage, levels: datasetColumns.levels, bytes: sql<number>`octet_length(${datasetColumns.data})::int` })
    .from(datasetColumns)
    .where(eq(datasetColumns.uploadId, uploadId))
    .orderBy(asc(datasetColumns.position));
}

/** Bytes [from, from + length) of one stored column (PostgreSQL slices the bytea). */
export async function readColumnBytes(db: Executor, uploadId: string, position: number, from: number, length: number): Promise<Buffer> {
  const rows = await db
    .select({ data: sql<Buffer>`substring(${datasetColumns.data} FROM ${from + 1} FOR ${length})` })
    .from(datasetColumns)
    .where(and(eq(datasetColumns.uploadId, uploadId), eq(datasetColumns.position, position)));
  const data = rows[0]?.data;
  return data === undefined ? Buffer.alloc(0) : Buffer.isBuffer(data) ? data : Buffer.from(data);
}

/** One chunk at a time, so a download never holds the whole file in memory. */
export async function readFileChunk(db: Executor, uploadId: string, seq: number): Promise<Buffer | null> {
  const rows = await db
    .select({ data: datasetFileChunks.data })
    .from(datasetFileChunks)
    .where(and(eq(datasetFileChunks.uploadId, uploadId), eq(datasetFileChunks.seq, seq)));
  return rows[0]?.data ?? null;
}

/**
 * Rows [offset, offset + limit) of every column, sliced inside PostgreSQL for fixed-width storage
 * (8 bytes a number, 4 a code) so a preview never loads whole columns; text columns come whole.
 */
export async function loadColumnSlices(db: Executor, uploadId: string, offset: number, limit: number): Promise<StoredColumn[]> {
  const data = sql<Buffer>`CASE ${datasetColumns.storage}
    WHEN 'float64' THEN substring(${datasetColumns.data} FROM ${offset * 8 + 1} FOR ${limit * 8})
    WHEN 'codes' THEN substring(${datasetColumns.data} FROM ${offset * 4 + 1} FOR ${limit * 4})
    ELSE ${datasetColumns.data} END`;
  const rows = await db
    .select({ name: datasetColumns.name, storage: datasetColumns.storage, levels: datasetColumns.levels, data })
    .from(datasetColumns)
    .where(eq(datasetColumns.uploadId, uploadId))
    .orderBy(asc(datasetColumns.position));
  return rows.map((r) => ({ ...r, data: Buffer.isBuffer(r.data) ? r.data : Buffer.from(r.data) }) as StoredColumn);
}
