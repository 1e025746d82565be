/** Data access: the datasets table (one row per named dataset in a workspace). */
import { and, asc, eq, sql } from 'drizzle-orm';
import { datasets, datasetVersions, users } from '../../db/schema/index';
import type { Executor } from './executor';

export interface DatasetRow {
  id: string;
  workspaceId: string;
  name: string;
  description: string;
  openKey: string | null;
  createdBy: string | null;
  createdByName: string | null;
  createdAt: Date;
}

const columns = {
  id: datasets.id,
  workspaceId: datasets.workspaceId,
  name: datasets.name,
  description: datasets.description,
  openKey: datasets.openKey,
  createdBy: datasets.createdBy,
  createdByName: users.name,
  createdAt: datasets.createdAt,
};

export async function findDataset(db: Executor, workspaceId: string, datasetId: string): Promise<DatasetRow | null> {
  const rows = await db
    .select(columns)
    .from(datasets)
    .leftJoin(users, eq(users.id, datasets.createdBy))
    .where(and(eq(datasets.workspaceId, workspaceId), eq(datasets.id, datasetId)));
  return rows[0] ?? null;
}

export async function listDatasetRows(db: Executor, workspaceId: string): Promise<DatasetRow[]> {
  return db.select(columns).from(datasets).leftJoin(users, eq(users.id, datasets.createdBy)).where(eq(datasets.workspaceId, workspaceId)).orderBy(asc(datasets.name));
}

export async function insertDataset(
  db: Executor,
  row: { workspaceId: string; name: string; description: string; openKey: string | null; createdBy: string },
): Promise<string> {
  const [created] = await db.insert(datasets).values(row).returning({ id: datasets.id });
  return created.id;
}

/** Locks the dataset row for this transaction: version numbers are handed out one at a time. */
export async function nextVersionNumber(tx: Executor, datasetId: string): Promise<number> {
  await tx.execute(sql`SELECT 1 FROM ${datasets} WHERE ${datasets.id} = ${datasetId} FOR UPDATE`);
  const [row] = await tx
    .select({ max: sql<number>`coalesce(max(${datasetVersions.number}), 0)::int` })
    .from(datasetVersions)
    .where(eq(datasetVersions.datasetId, datasetId));
  return row.max + 1;
}

export async function deleteDatasetRow(db: Executor, datasetId: string): Promise<void> {
  await db.delete(datasets).where(eq(datasets.id, datasetId));
}

export async function findOpenImport(db: Executor, workspaceId: string, openKey: string): Promise<string | null> {
  const rows = await db.select({ id: datasets.id }).from(datasets).where(and(eq(datasets.workspaceId, workspaceId), eq(datasets.openKey, openKey)));
  return rows[0]?.id ?? null;
}
