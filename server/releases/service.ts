/**
 * Releases: an approved fit becomes its model's current release (number n+1) at the approved lambda,
 * with release notes; restoring an earlier release adds a new release pointing at that release's fit
 * and lambda, so the history is never rewritten. Admins and analysts release (the routes check the
 * role); the fit must carry an approved review whose lambda is still the fit's chosen one.
 */
import { and, desc, eq, sql } from 'drizzle-orm';
import { publishReleaseSchema, restoreReleaseSchema, type ReleaseDto } from '../../shared/reviews';
import { isUniqueViolation } from '../accounts/executor';
import { recordAudit } from '../audit';
import type { AppContext } from '../context';
import type { Executor } from '../datasets/data/executor';
import { fits, models, releases, reviews } from '../db/schema/index';
import { conflict, fromZod, notFound } from '../http/errors';
import { addNotices, membersToTell, queueNoticeMails } from '../notices/notify';
import type { Actor } from '../reviews/service';
import { currentRelease, findRelease, listModelReleases, listWorkspaceReleases, type ReleaseRow } from './data';
import { announceRelease } from './announce';

function releaseDto(r: ReleaseRow, currentIds: Set<string>, numbers: Map<string, number>): ReleaseDto {
  return {
    id: r.id,
    modelId: r.modelId,
    modelName: r.modelName,
    fitId: r.fitId,
    fitVersion: r.fitVersion,
    lambdaIndex: r.lambdaIndex,
    number: r.number,
    notes: r.notes,
    reviewId: r.reviewId,
    releasedBy: { id: r.releasedBy, name: r.releasedByName },
    releasedAt: r.releasedAt.toISOString(),
    restoredFrom: r.restoredFromReleaseId ? { id: r.restoredFromReleaseId, number: numbers.get(r.restoredFromReleaseId) ?? 0 } : null,
    current: currentIds.has(r.id),
  };
}

function toDtos(rows: ReleaseRow[]): ReleaseDto[] {
  const top = new Map<string, ReleaseRow>();
  for (const r of rows) if ((top.get(r.modelId)?.number ?? 0) < r.number) top.set(r.modelId, r);
  const current = new Set([...top.values()].map((r) => r.id));
  const numbers = new Map(rows.map((r) => [r.id, r.number]));
  return rows.map((r) => releaseDto(r, current, numbers));
}

export async function listReleases(ctx: AppContext, workspaceId: string): Promise<ReleaseDto[]> {
  return toDtos(await listWorkspaceReleases(ctx.db, workspaceId));
}

export async function listReleasesOfModel(ctx: AppContext, workspaceId: string, modelId: string): Promise<ReleaseDto[]> {
  const [model] = await ctx.db.select({ id: models.id }).from(models).where(and(eq(models.workspaceId, workspaceId), eq(models.id, modelId)));
  if (!model) throw notFound('No such model in this workspace.');
  return toDtos(await listModelReleases(ctx.db, workspaceId, modelId));
}

async function insertRelease(
  ctx: AppContext,
  tx: Executor,
  actor: Actor,
  r: { workspaceId: string; modelId: string; modelName: string; fitId: string; fitVersion: number; lambdaIndex: number; notes: string; reviewId: string | null; restoredFrom: ReleaseRow | null },
): Promise<{ releaseId: string; noticeIds: string[] }> {
  // Serializes releases of one model: the next number is read and written under the model's row lock.
  await tx.execute(sql`select 1 from ${models} where ${models.id} = ${r.modelId} for update`);
  const [last] = await tx.select({ number: releases.number }).from(releases).where(eq(releases.modelId, r.modelId)).orderBy(desc(releases.number)).limit(1);
  const number = (last?.number ?? 0) + 1;
  const [created] = await tx
    .insert(releases)
    .values({
      workspaceId: r.workspaceId,
      modelId: r.modelId,
      fitId: r.fitId,
      lambdaIndex: r.lambdaIndex,
      number,
      notes: r.notes,
      reviewId: r.reviewId,
      releasedBy: actor.user.id,
      restoredFromReleaseId: r.restoredFrom?.id ?? null,
    })
    .returning({ id: releases.id });
  await recordAudit(tx, {
    workspaceId: r.workspaceId,
    actorUserId: actor.user.id,
    actorLabel: actor.user.email,
    action: r.restoredFrom ? 'release.restored' : 'release.published',
    targetType: 'release',
    targetId: created.id,
    details: { modelId: r.modelId, number, fitId: r.fitId, fitVersion: r.fitVersion, lambdaIndex: r.lambdaIndex, reviewId: r.reviewId, restoredFromNumber: r.restoredFrom?.number ?? null },
    ip: actor.ip,
  });
  const userIds = await membersToTell(tx, r.workspaceId, { except: [actor.user.id] });
  const noticeIds = await addNotices(tx, {
    workspaceId: r.workspaceId,
    kind: 'release-published',
    title: r.restoredFrom
      ? `${r.modelName}: release ${number} restores release ${r.restoredFrom.number} (version ${r.fitVersion})`
      : `${r.modelName}: release ${number} (version ${r.fitVersion}) is out`,
    link: `/w/${r.workspaceId}/releases?model=${r.modelId}`,
    userIds,
  });
  return { releaseId: created.id, noticeIds };
}

async function finish(ctx: AppContext, workspaceId: string, done: { releaseId: string; noticeIds: string[] }): Promise<ReleaseDto> {
  await queueNoticeMails(ctx, done.noticeIds);
  const row = (await findRelease(ctx.db, workspaceId, done.releaseId))!;
  await announceRelease(ctx, row);
  const current = await currentRelease(ctx.db, workspaceId, row.modelId);
  return releaseDto(row, new Set(current ? [current.id] : []), new Map());
}

export async function publishRelease(ctx: AppContext, workspaceId: string, modelId: string, actor: Actor, body: unknown): Promise<ReleaseDto> {
  const [model] = await ctx.db.select({ id: models.id, name: models.name }).from(models).where(and(eq(models.workspaceId, workspaceId), eq(models.id, modelId)));
  if (!model) throw notFound('No such model in this workspace.');
  const parsed = publishReleaseSchema.safeParse(body ?? {});
  if (!parsed.success) throw fromZod(parsed.error);
  const { fitId, notes } = parsed.data;
  const [fit] = await ctx.db
    .select({ id: fits.id, version: fits.version, modelId: fits.modelId, chosenIndex: fits.chosenIndex })
    .from(fits)
    .where(and(eq(fits.workspaceId, workspaceId), eq(fits.id, fitId)));
  if (!fit || fit.modelId !== modelId) throw notFound('No such fit of this model.');
  const [approved] = await ctx.db
    .select({ id: reviews.id, lambdaIndex: reviews.lambdaIndex })
    .from(reviews)
    .where(and(eq(reviews.fitId, fitId), eq(reviews.state, 'approved'), eq(reviews.lambdaIndex, fit.chosenIndex ?? -1)))
    .orderBy(desc(reviews.decidedAt))
    .limit(1);
  if (!approved) {
    throw conflict(`Version ${fit.version} has no approved review at its chosen lambda: only an approved fit can be released. Ask for a review first.`, 'fitId');
  }
  try {
    const done = await ctx.db.transaction((tx) =>
      insertRelease(ctx, tx, actor, { workspaceId, modelId, modelName: model.name, fitId, fitVersion: fit.version, lambdaIndex: approved.lambdaIndex, notes, reviewId: approved.id, restoredFrom: null }),
    );
    return await finish(ctx, workspaceId, done);
  } catch (error) {
    if (isUniqueViolation(error)) throw conflict('Another release of this model was published at the same moment; reload and try again.', 'fitId');
    throw error;
  }
}

export async function restoreRelease(ctx: AppContext, workspaceId: string, releaseId: string, actor: Actor, body: unknown): Promise<ReleaseDto> {
  const old = await findRelease(ctx.db, workspaceId, releaseId);
  if (!old) throw notFound('No such release in this workspace.');
  const parsed = restoreReleaseSchema.safeParse(body ?? {});
  if (!parsed.success) throw fromZod(parsed.error);
  const current = await currentRelease(ctx.db, workspaceId, old.modelId);
  if (current?.id === old.id) throw conflict(`Release ${old.number} is already the current release of ${old.modelName}.`, 'releaseId');
  const done = await ctx.db.transaction((tx) =>
    insertRelease(ctx, tx, actor, {
      workspaceId,
      modelId: old.modelId,
      modelName: old.modelName,
      fitId: old.fitId,
      fitVersion: old.fitVersion,
      lambdaIndex: old.lambdaIndex,
      notes: parsed.data.notes,
      reviewId: old.reviewId,
      restoredFrom: old,
    }),
  );
  return finish(ctx, workspaceId, done);
}
