/**
 * Tells the datasets area what depends on a dataset, in words, so a delete is refused with a clear
 * message. The foreign keys (models.dataset_id, fits.dataset_version_id, ON DELETE RESTRICT) are the
 * real protection; this names the models for the person deleting.
 */
import { eq, sql } from 'drizzle-orm';
import { registerDatasetDependents } from '../datasets/service/dependents';
import { fits, models } from '../db/schema/index';

let registered = false;

export function registerFitDependents(): void {
  if (registered) return;
  registered = true;
  registerDatasetDependents(async (db, datasetId) => {
    const rows = await db
      .select({ name: models.name, versions: sql<number>`count(${fits.id})::int` })
      .from(models)
      .leftJoin(fits, eq(fits.modelId, models.id))
      .where(eq(models.datasetId, datasetId))
      .groupBy(models.id, models.name);
    return rows.map((r) => `model "${r.name}" (${r.versions} fit${r.versions === 1 ? '' : 's'})`);
  });
}
