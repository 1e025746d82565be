/**
 * Release data functions. A model's CURRENT release is its release with the highest number; restoring
 * an older release adds a new row, so "current" never needs a flag that could drift.
 * `currentRelease` and `listCurrentReleases` are also what the consumer API calls.
 */
import { and, desc, eq, sql } from 'drizzle-orm';
import type { Executor } from '../datasets/data/executor';
import { fits, models, releases, users } from '../db/schema/index';

export interface ReleaseRow {
  id: string;
  workspaceId: string;
  modelId: string;
  modelName: string;
  fitId: string;
  fitVersion: number;
  /** The released lambda's index on the fit's path (use this, not the fit's current choice). */
  lambdaIndex: number;
  number: number;
  notes: string;
  reviewId: string | null;
  releasedBy: string | null;
  releasedByName: string | null;
  releasedAt: Date;
  restoredFromReleaseId: string | null;
}

const releaseColumns = {
  id: releases.id,
  workspaceId: releases.workspaceId,
  modelId: releases.modelId,
  modelName: models.name,
  fitId: releases.fitId,
  fitVersion: fits.version,
  lambdaIndex: releases.lambdaIndex,
  number: releases.number,
  notes: releases.notes,
  reviewId: releases.reviewId,
  releasedBy: releases.releasedBy,
  releasedByName: users.name,
  releasedAt: releases.releasedAt,
  restoredFromReleaseId: releases.restoredFromReleaseId,
};

function selectReleases(db: Executor) {
  return db
    .select(releaseColumns)
    .from(releases)
    .innerJoin(models, eq(models.id, releases.modelId))
    .innerJoin(fits, eq(fits.id, releases.fitId))
    .leftJoin(users, eq(users.id, releases.releasedBy));
}

/** The model's current release (highest number), or null when it has never been released. */
export async function currentRelease(db: Executor, workspaceId: string, modelId: string): Promise<ReleaseRow | null> {
  const rows = await selectReleases(db)
    .where(and(eq(releases.workspaceId, workspaceId), eq(releases.modelId, modelId)))
    .orderBy(desc(releases.number))
    .limit(1);
  return rows[0] ?? null;
}

/** Every released model's current release in the workspace, by model name. */
export async function listCurrentReleases(db: Executor, workspaceId: string): Promise<ReleaseRow[]> {
  return selectReleases(db)
    .where(
      and(
        eq(releases.workspaceId, workspaceId),
        sql`${releases.number} = (select max(r2.number) from releases r2 where r2.model_id = ${releases.modelId})`,
      ),
    )
    .orderBy(models.name);
}

/** All releases of one model, newest first. */
export async function listModelReleases(db: Executor, workspaceId: string, modelId: string): Promise<ReleaseRow[]> {
  return selectReleases(db)
    .where(and(eq(releases.workspaceId, workspaceId), eq(releases.modelId, modelId)))
    .orderBy(desc(releases.number));
}

/** All releases in the workspace, newest first. */
export async function listWorkspaceReleases(db: Executor, workspaceId: string): Promise<ReleaseRow[]> {
  return selectReleases(db).where(eq(releases.workspaceId, workspaceId)).orderBy(desc(releases.releasedAt), desc(releases.number));
}

export async function findRelease(db: Executor, workspaceId: string, releaseId: string): Promise<ReleaseRow | null> {
  const rows = await selectReleases(db).where(and(eq(releases.workspaceId, workspaceId), eq(releases.id, releaseId)));
  return rows[0] ?? null;
}
