/** Database rows -> the fits API's response shapes. */
import type { FitProgressDto, FitSummaryDto } from '../../../shared/fits';
import type { FitKeyMetricsDto, ModelListItemDto } from '../../../shared/models';
import type { FitSummaryRow, ModelRow } from '../data';

const FORMER_MEMBER = 'a former member';

export function fitSummaryDto(f: FitSummaryRow): FitSummaryDto {
  return {
    id: f.id,
    modelId: f.modelId,
    version: f.version,
    status: f.status,
    unconverged: f.unconverged,
    message: f.message,
    datasetVersion: { id: f.datasetVersionId, datasetId: f.datasetId, datasetName: f.datasetName, number: f.datasetVersionNumber, sha256: f.datasetSha256 },
    createdBy: { id: f.createdBy, name: f.createdByName ?? FORMER_MEMBER },
    createdAt: f.createdAt.toISOString(),
    startedAt: f.startedAt?.toISOString() ?? null,
    finishedAt: f.finishedAt?.toISOString() ?? null,
  };
}

export const EMPTY_METRICS: FitKeyMetricsDto = {
  lambda: null,
  chosenRule: null,
  nonzero: null,
  devianceExplained: null,
  cvError: null,
  cvMetric: null,
  holdout: null,
};

export function modelListItem(m: ModelRow, versions: { count: number; latest: FitSummaryRow } | undefined): ModelListItemDto {
  const latest = versions?.latest;
  return {
    id: m.id,
    name: m.name,
    description: m.description,
    datasetId: m.datasetId,
    datasetName: m.datasetName,
    outcome: m.outcome,
    family: m.family,
    createdBy: { id: m.createdBy, name: m.createdByName ?? FORMER_MEMBER },
    createdAt: m.createdAt.toISOString(),
    versionCount: versions?.count ?? 0,
    latest: latest
      ? { id: latest.id, version: latest.version, status: latest.status, createdAt: latest.createdAt.toISOString(), unconverged: latest.unconverged }
      : null,
  };
}

/**
 * Progress for a progress bar. The path counts as one share of the work and each fold as one more
 * (a fold refits the path on most of the rows); the time left is the elapsed time scaled by the
 * share still to do, once some work is done.
 */
export function progressDto(f: FitSummaryRow, now = Date.now()): FitProgressDto {
  const p = f.progress;
  const ended = f.status === 'finished' || f.status === 'failed' || f.status === 'cancelled';
  const elapsedMs = f.startedAt ? (f.finishedAt?.getTime() ?? now) - f.startedAt.getTime() : 0;
  const pathShare = p.lambdaCount ? p.lambdaIndex / p.lambdaCount : 0;
  const units = 1 + p.foldsTotal;
  let fraction = f.status === 'finished' ? 1 : p.stage === 'path' || p.stage === 'waiting' ? pathShare / units : (1 + p.foldsDone) / units;
  if (p.stage === 'combining') fraction = Math.max(fraction, 0.99);
  fraction = Math.min(1, Math.max(0, fraction));
  const remainingMs = ended ? 0 : fraction > 0.02 && elapsedMs > 0 ? Math.round((elapsedMs * (1 - fraction)) / fraction) : null;
  return {
    id: f.id,
    status: f.status,
    stage: f.status === 'finished' ? 'done' : p.stage,
    lambdaIndex: p.lambdaIndex,
    lambdaCount: p.lambdaCount,
    foldsDone: p.foldsDone,
    foldsTotal: p.foldsTotal,
    elapsedMs: Math.max(0, elapsedMs),
    remainingMs,
    fraction,
    message: f.message,
  };
}
