/** Data access: dataset versions with their upload's file facts and the creator's name. */
import { and, asc, eq, sql } from 'drizzle-orm';
import type { ColumnSchema, ParseReport } from '../../../shared/datasets';
import { datasets, datasetUploads, datasetVersions, users } from '../../db/schema/index';
import type { Executor } from './executor';

export interface VersionRow {
  id: string;
  datasetId: string;
  workspaceId: string;
  number: number;
  uploadId: string;
  origin: 'upload' | 'column-settings' | 'open-dataset';
  basedOn: number | null;
  columns: ColumnSchema[];
  createdBy: string | null;
  createdByName: string | null;
  createdAt: Date;
  fileName: string;
  sha256: string;
  sizeBytes: number;
  rowCount: number;
  columnCount: number;
  report: ParseReport;
}

function selectVersions(db: Executor) {
  return db
    .select({
      id: datasetVersions.id,
      datasetId: datasetVersions.datasetId,
      workspaceId: datasets.workspaceId,
      number: datasetVersions.number,
      uploadId: datasetVersions.uploadId,
      origin: datasetVersions.origin,
      basedOn: datasetVersions.basedOn,
      columns: datasetVersions.columns,
      createdBy: datasetVersions.createdBy,
      createdByName: users.name,
      createdAt: datasetVersions.createdAt,
      fileName: datasetUploads.fileName,
      sha256: datasetUploads.sha256,
      sizeBytes: datasetUploads.sizeBytes,
      rowCount: datasetUploads.rowCount,
      columnCount: datasetUploads.columnCount,
      report: datasetUploads.report,
    })
    .from(datasetVersions)
    .innerJoin(datasets, eq(datasets.id, datasetVersions.datasetId))
    .innerJoin(datasetUploads, eq(datasetUploads.id, datasetVersions.uploadId))
    .leftJoin(users, eq(users.id, datasetVersions.createdBy));
}

export async function listVersionRows(db: Executor, datasetIds: string[]): Promise<VersionRow[]> {
  if (datasetIds.length === 0) return [];
  const rows: VersionRow[] = [];
  for (const id of datasetIds) rows.push(...(await selectVersions(db).where(eq(datasetVersions.datasetId, id)).orderBy(asc(datasetVersions.number))));
  return rows;
}

export async function findVersionRow(db: Executor, datasetId: string, number: number): Promise<VersionRow | null> {
  const rows = await selectVersions(db).where(and(eq(datasetVersions.datasetId, datasetId), eq(datasetVersions.number, number)));
  return rows[0] ?? null;
}

export async function findVersionRowById(db: Executor, versionId: string): Promise<VersionRow | null> {
  const rows = await selectVersions(db).where(eq(datasetVersions.id, versionId));
  return rows[0] ?? null;
}

/** The first version of any dataset in the workspace whose upload has this checksum. */
export async function findVersionByChecksum(db: Executor, workspaceId: string, sha256: string, datasetId?: string): Promise<VersionRow | null> {
  const where = [eq(datasets.workspaceId, workspaceId), eq(datasetUploads.sha256, sha256)];
  if (datasetId) where.push(eq(datasets.id, datasetId));
  const rows = await selectVersions(db)
    .where(and(...where))
    .orderBy(asc(datasetVersions.number))
    .limit(1);
  return rows[0] ?? null;
}

/**
 * Serialises ingests of one file (by checksum) within a workspace until this transaction ends, so two
 * identical uploads at once cannot both pass the "already stored?" check.
 */
export async function lockChecksum(tx: Executor, workspaceId: string, sha256: string): Promise<void> {
  await tx.execute(sql`SELECT pg_advisory_xact_lock(hashtextextended(${`lariat-checksum:${workspaceId}:${sha256}`}, 0))`);
}

export async function insertVersion(
  db: Executor,
  row: { datasetId: string; number: number; uploadId: string; origin: VersionRow['origin']; basedOn: number | null; columns: ColumnSchema[]; createdBy: string },
): Promise<string> {
  const [created] = await db.insert(datasetVersions).values(row).returning({ id: datasetVersions.id });
  return created.id;
}
