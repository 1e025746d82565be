/**
 * The release document a consumer reads (GET /api/v1/models/:modelId/release): everything needed to
 * apply the released fit elsewhere and to judge it: coefficients on the original scale with the
 * intercept, how each column is encoded (numeric, or one indicator per level seen when fitting, with
 * the fill used for gaps when the fit imputed), the standardization the penalty worked on, the lambda,
 * CV and holdout metrics, the spec, dataset checksum and engine version, and the cautions.
 */
import { and, eq } from 'drizzle-orm';
import { CAUTION_LINES } from '../../../shared/cautions';
import type { FitSpec } from '../../../shared/fits';
import type { Database } from '../../db/client';
import { fitEvaluations, models } from '../../db/schema/index';
import { loadChosenModel, type ChosenModel } from '../../exports/chosen-model';
import { termLevels } from '../../exports/coefficients-csv';
import type { ReleaseRow } from '../../releases/index';

export type EncodedColumnDto =
  | { column: string; kind: 'numeric'; term: string; fillValue: number | null }
  | { column: string; kind: 'categorical'; levels: { level: string; term: string }[]; fillLevel: string | null };

export interface ReleaseDocumentDto {
  model: { id: string; name: string; description: string; outcome: string; family: 'gaussian' | 'binomial' };
  release: { id: string; number: number; notes: string; releasedAt: string; releasedBy: string | null; restoredFromReleaseId: string | null };
  fit: {
    id: string;
    version: number;
    engineVersion: string;
    datasetSha256: string;
    dataset: { id: string; name: string; version: number };
    seed: number | null;
    spec: FitSpec;
    rowsFitted: number;
    unconverged: boolean;
  };
  lambda: { value: number; index: number; rule: string };
  intercept: number;
  coefficients: { term: string; column: string; level: string | null; value: number; standardizedValue: number; selectionShare: number | null }[];
  encoding: { columns: EncodedColumnDto[]; responseLevels: [string, string] | null };
  standardization: { applied: boolean; terms: { term: string; center: number; scale: number }[] } | null;
  metrics: {
    cv: { folds: number; metric: string; value: number; standardError: number; all: { metric: string; value: number; standardError: number }[] } | null;
    holdout: { rowCount: number; metrics: { name: string; value: number }[] } | null;
  };
  cautions: string[];
}

function encodingDto(m: ChosenModel): ReleaseDocumentDto['encoding'] {
  const terms = m.results.terms;
  return {
    columns: m.results.encoding.columns.map((c) =>
      c.kind === 'numeric'
        ? { column: c.column, kind: 'numeric' as const, term: terms[c.term], fillValue: c.imputeValue ?? null }
        : { column: c.column, kind: 'categorical' as const, levels: c.levels.map((level, k) => ({ level, term: terms[c.terms[k]] })), fillLevel: c.imputeLevel ?? null },
    ),
    responseLevels: m.results.encoding.responseLevels ?? null,
  };
}

export async function releaseDocument(db: Database, release: ReleaseRow): Promise<ReleaseDocumentDto> {
  // The lambda that was approved and released, even if the fit's chosen lambda moved since.
  const m = await loadChosenModel(db, release.workspaceId, release.fitId, release.lambdaIndex);
  const { fit, results: r } = m;
  const [model] = await db.select().from(models).where(eq(models.id, release.modelId));
  const [evaluation] = await db
    .select({ result: fitEvaluations.result })
    .from(fitEvaluations)
    .where(and(eq(fitEvaluations.fitId, fit.id), eq(fitEvaluations.lambdaIndex, m.index), eq(fitEvaluations.state, 'ready')));
  const levels = termLevels(m);
  const i = m.index;
  return {
    model: { id: model.id, name: model.name, description: model.description, outcome: model.outcome, family: model.family },
    release: {
      id: release.id,
      number: release.number,
      notes: release.notes,
      releasedAt: release.releasedAt.toISOString(),
      releasedBy: release.releasedByName,
      restoredFromReleaseId: release.restoredFromReleaseId,
    },
    fit: {
      id: fit.id,
      version: fit.version,
      engineVersion: fit.engineVersion,
      datasetSha256: fit.datasetSha256,
      dataset: { id: fit.datasetId, name: fit.datasetName, version: fit.datasetVersionNumber },
      seed: fit.seed,
      spec: fit.spec,
      rowsFitted: r.rowsFitted,
      unconverged: fit.unconverged,
    },
    lambda: { value: m.lambda, index: i, rule: m.rule },
    intercept: m.intercept,
    coefficients: r.terms.map((term, j) => ({
      term,
      column: r.termColumns[j],
      level: levels[j] === '' ? null : levels[j],
      value: m.coefficients[j],
      standardizedValue: m.standardizedCoefficients[j],
      selectionShare: m.stability ? m.stability[j] : null,
    })),
    encoding: encodingDto(m),
    standardization: r.standardization
      ? { applied: fit.spec.standardize, terms: r.terms.map((term, j) => ({ term, center: r.standardization!.centers[j], scale: r.standardization!.scales[j] })) }
      : null,
    metrics: {
      cv: r.cv
        ? {
            folds: r.cv.folds,
            metric: r.cv.metric,
            value: r.cv.mean[i],
            standardError: r.cv.standardError[i],
            all: r.cv.curves.map((c) => ({ metric: c.metric, value: c.mean[i], standardError: c.standardError[i] })),
          }
        : null,
      holdout: evaluation?.result?.holdout ?? null,
    },
    cautions: [...CAUTION_LINES],
  };
}
