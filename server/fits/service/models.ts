/** Creating, listing and reading models (a named question: dataset, outcome, family). */
import { and, eq } from 'drizzle-orm';
import { createModelSchema, type ModelDetailDto, type ModelListItemDto } from '../../../shared/models';
import type { Database } from '../../db/client';
import { models } from '../../db/schema/index';
import { listVersionRows } from '../../datasets/data/versions';
import { requireDataset } from '../../datasets/service/datasets';
import { badRequest, conflict, fromZod, notFound } from '../../http/errors';
import { findModelRow, latestFits, listFitSummaries, listModelRows, type ModelRow } from '../data';
import { EMPTY_METRICS, fitSummaryDto, modelListItem } from './dto';
import { specChanges } from './spec-diff';

export async function requireModel(db: Database, workspaceId: string, modelId: string): Promise<ModelRow> {
  const model = await findModelRow(db, workspaceId, modelId);
  if (!model) throw notFound('No such model in this workspace.');
  return model;
}

export async function listModels(db: Database, workspaceId: string): Promise<ModelListItemDto[]> {
  const rows = await listModelRows(db, workspaceId);
  const latest = await latestFits(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((m) => modelListItem(m, latest.get(m.id)));
}

export async function getModel(db: Database, workspaceId: string, modelId: string): Promise<ModelDetailDto> {
  const model = await requireModel(db, workspaceId, modelId);
  const versions = await listFitSummaries(db, [model.id]);
  const latest = versions[0];
  return {
    ...modelListItem(model, latest ? { count: versions.length, latest } : undefined),
    versions: versions.map((f) => {
      const previous = versions.find((v) => v.version === f.version - 1);
      return { ...fitSummaryDto(f), metrics: f.keyMetrics ?? EMPTY_METRICS, spec: f.spec, specChanges: previous ? specChanges(previous.spec, f.spec) : null };
    }),
  };
}

export async function createModel(db: Database, workspaceId: string, userId: string, body: unknown): Promise<ModelListItemDto> {
  const parsed = createModelSchema.safeParse(body);
  if (!parsed.success) throw fromZod(parsed.error);
  const input = parsed.data;
  const dataset = await requireDataset(db, workspaceId, input.datasetId).catch(() => {
    throw badRequest('datasetId: no such dataset in this workspace.', 'datasetId');
  });
  const versions = await listVersionRows(db, [dataset.id]);
  const latest = versions[versions.length - 1];
  const outcome = latest?.columns.find((c) => c.name === input.outcome);
  if (!latest || !outcome) throw badRequest(`outcome: "${input.outcome}" is not a column of the latest version of "${dataset.name}".`, 'outcome');
  if (input.family === 'binomial' && outcome.summary.distinct !== null && outcome.summary.distinct > 2) {
    throw badRequest(`outcome: a yes/no (binomial) model needs an outcome with two values; "${input.outcome}" has ${outcome.summary.distinct}.`, 'outcome');
  }
  const existing = await db.select({ id: models.id }).from(models).where(and(eq(models.workspaceId, workspaceId), eq(models.name, input.name)));
  if (existing.length > 0) throw conflict(`name: a model called "${input.name}" already exists in this workspace.`, 'name');
  const [row] = await db
    .insert(models)
    .values({ workspaceId, name: input.name, description: input.description, datasetId: dataset.id, outcome: input.outcome, family: input.family, createdBy: userId })
    .returning({ id: models.id });
  return modelListItem(await requireModel(db, workspaceId, row.id), undefined);
}
