/** Data access for models and fits (every lookup scoped to a workspace by the caller). */
import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import type { Executor } from '../datasets/data/executor';
import { datasets, datasetUploads, datasetVersions, fits, models, users } from '../db/schema/index';

export type ModelRow = typeof models.$inferSelect & { datasetName: string; createdByName: string | null };

export async function findModelRow(db: Executor, workspaceId: string, modelId: string): Promise<ModelRow | null> {
  const rows = await db
    .select({ model: models, datasetName: datasets.name, createdByName: users.name })
    .from(models)
    .innerJoin(datasets, eq(datasets.id, models.datasetId))
    .leftJoin(users, eq(users.id, models.createdBy))
    .where(and(eq(models.workspaceId, workspaceId), eq(models.id, modelId)));
  const r = rows[0];
  return r ? { ...r.model, datasetName: r.datasetName, createdByName: r.createdByName } : null;
}

export async function listModelRows(db: Executor, workspaceId: string): Promise<ModelRow[]> {
  const rows = await db
    .select({ model: models, datasetName: datasets.name, createdByName: users.name })
    .from(models)
    .innerJoin(datasets, eq(datasets.id, models.datasetId))
    .leftJoin(users, eq(users.id, models.createdBy))
    .where(eq(models.workspaceId, workspaceId))
    .orderBy(desc(models.createdAt));
  return rows.map((r) => ({ ...r.model, datasetName: r.datasetName, createdByName: r.createdByName }));
}

/** A fit's columns without the large byte arrays. */
export const fitSummaryColumns = {
  id: fits.id,
  modelId: fits.modelId,
  workspaceId: fits.workspaceId,
  version: fits.version,
  spec: fits.spec,
  datasetVersionId: fits.datasetVersionId,
  datasetSha256: fits.datasetSha256,
  engineVersion: fits.engineVersion,
  seed: fits.seed,
  status: fits.status,
  unconverged: fits.unconverged,
  message: fits.message,
  progress: fits.progress,
  timings: fits.timings,
  createdBy: fits.createdBy,
  createdAt: fits.createdAt,
  startedAt: fits.startedAt,
  finishedAt: fits.finishedAt,
  chosenIndex: fits.chosenIndex,
  chosenRule: fits.chosenRule,
  chosenBy: fits.chosenBy,
  chosenAt: fits.chosenAt,
  keyMetrics: fits.keyMetrics,
  createdByName: users.name,
  datasetId: datasetVersions.datasetId,
  datasetName: datasets.name,
  datasetVersionNumber: datasetVersions.number,
};

export type FitSummaryRow = Awaited<ReturnType<typeof selectFitSummaries>>[number];

function selectFitSummaries(db: Executor) {
  return db
    .select(fitSummaryColumns)
    .from(fits)
    .innerJoin(datasetVersions, eq(datasetVersions.id, fits.datasetVersionId))
    .innerJoin(datasets, eq(datasets.id, datasetVersions.datasetId))
    .leftJoin(users, eq(users.id, fits.createdBy));
}

export async function findFitSummary(db: Executor, workspaceId: string, fitId: string): Promise<FitSummaryRow | null> {
  const rows = await selectFitSummaries(db).where(and(eq(fits.workspaceId, workspaceId), eq(fits.id, fitId)));
  return rows[0] ?? null;
}

/** Unscoped: for workers, which get fit ids from the queue. */
export async function findFitSummaryById(db: Executor, fitId: string): Promise<FitSummaryRow | null> {
  const rows = await selectFitSummaries(db).where(eq(fits.id, fitId));
  return rows[0] ?? null;
}

export async function listFitSummaries(db: Executor, modelIds: string[]): Promise<FitSummaryRow[]> {
  if (modelIds.length === 0) return [];
  return selectFitSummaries(db).where(inArray(fits.modelId, modelIds)).orderBy(desc(fits.version));
}

/** Per model: version count and the latest version's summary columns. */
export async function latestFits(db: Executor, modelIds: string[]): Promise<Map<string, { count: number; latest: FitSummaryRow }>> {
  const out = new Map<string, { count: number; latest: FitSummaryRow }>();
  if (modelIds.length === 0) return out;
  const counts = await db
    .select({ modelId: fits.modelId, count: sql<number>`count(*)::int`, top: sql<number>`max(${fits.version})::int` })
    .from(fits)
    .where(inArray(fits.modelId, modelIds))
    .groupBy(fits.modelId);
  if (counts.length === 0) return out;
  const latest = await selectFitSummaries(db).where(
    sql`(${fits.modelId}, ${fits.version}) IN (${sql.join(
      counts.map((c) => sql`(${c.modelId}::uuid, ${c.top}::int)`),
      sql`, `,
    )})`,
  );
  for (const c of counts) {
    const row = latest.find((l) => l.modelId === c.modelId);
    if (row) out.set(c.modelId, { count: c.count, latest: row });
  }
  return out;
}

export async function datasetSha(db: Executor, versionId: string): Promise<string | null> {
  const rows = await db
    .select({ sha256: datasetUploads.sha256 })
    .from(datasetVersions)
    .innerJoin(datasetUploads, eq(datasetUploads.id, datasetVersions.uploadId))
    .where(eq(datasetVersions.id, versionId));
  return rows[0]?.sha256 ?? null;
}
