/**
 * Running a fit: the request is checked against the model and the dataset version (a 400 naming the
 * field, nothing stored), the next version is stored as waiting, and its first job is queued.
 */
import { eq, sql } from 'drizzle-orm';
import { fitRequestSchema, type FitSpec, type FitSummaryDto } from '../../../shared/fits';
import type { AppContext } from '../../context';
import { listVersionRows } from '../../datasets/data/versions';
import { fits, models } from '../../db/schema/index';
import { badRequest, fromZod } from '../../http/errors';
import { findFitSummary } from '../data';
import { engineVersion } from '../engine-version';
import { jobId } from '../jobs';
import type { FitStoredProgress } from '../stored-types';
import { checkSpecAgainstVersion } from './check-spec';
import { fitSummaryDto } from './dto';
import { requireModel } from './models';

export function seedOf(spec: FitSpec): number | null {
  if (spec.cv.kind === 'folds') return spec.cv.seed;
  return spec.holdout?.seed ?? null;
}

export async function runFit(ctx: AppContext, workspaceId: string, userId: string, modelId: string, body: unknown): Promise<FitSummaryDto> {
  const parsed = fitRequestSchema.safeParse(body);
  if (!parsed.success) throw fromZod(parsed.error);
  const request = parsed.data;
  const model = await requireModel(ctx.db, workspaceId, modelId);
  const versions = await listVersionRows(ctx.db, [model.datasetId]);
  const latest = versions[versions.length - 1];
  if (!latest) throw badRequest(`datasetVersionId: dataset "${model.datasetName}" has no versions.`, 'datasetVersionId');
  const version = request.datasetVersionId ? versions.find((v) => v.id === request.datasetVersionId) : latest;
  if (!version) throw badRequest(`datasetVersionId: not a version of "${model.datasetName}", the model's dataset.`, 'datasetVersionId');
  if (version.id !== latest.id) {
    throw badRequest(
      `datasetVersionId: version ${version.number} of "${model.datasetName}" was replaced by version ${latest.number}; fit the latest version.`,
      'datasetVersionId',
    );
  }
  checkSpecAgainstVersion(request, model, version);
  const spec: FitSpec = { ...request, datasetVersionId: version.id, outcome: model.outcome, family: model.family };
  const progress: FitStoredProgress = { stage: 'waiting', lambdaIndex: 0, lambdaCount: null, foldsDone: 0, foldsTotal: spec.cv.kind === 'folds' ? spec.cv.folds : 0 };
  const fitId = await ctx.db.transaction(async (tx) => {
    // The model row's lock serializes version numbers of concurrent runs.
    await tx.execute(sql`SELECT 1 FROM ${models} WHERE ${models.id} = ${model.id} FOR UPDATE`);
    const [{ next }] = await tx.select({ next: sql<number>`coalesce(max(${fits.version}), 0)::int + 1` }).from(fits).where(eq(fits.modelId, model.id));
    const [row] = await tx
      .insert(fits)
      .values({
        modelId: model.id,
        workspaceId,
        version: next,
        spec,
        datasetVersionId: version.id,
        datasetSha256: version.sha256,
        engineVersion: engineVersion(),
        seed: seedOf(spec),
        status: 'waiting',
        progress,
        createdBy: userId,
      })
      .returning({ id: fits.id });
    return row.id;
  });
  try {
    await ctx.queue.send('fit-path', { fitId }, { id: jobId('path', fitId) });
  } catch (error) {
    await ctx.db
      .update(fits)
      .set({ status: 'failed', message: `The fit could not be queued: ${(error as Error).message}`, finishedAt: new Date() })
      .where(eq(fits.id, fitId));
  }
  const row = await findFitSummary(ctx.db, workspaceId, fitId);
  if (!row) throw new Error(`fit ${fitId} vanished after it was stored`);
  return fitSummaryDto(row);
}
