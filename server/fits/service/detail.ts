/** A fit's detail: summary, spec, progress, the change against the previous version, and results. */
import { and, eq } from 'drizzle-orm';
import type { ChoiceRule, EvaluationDto, FitDetailDto, FitProgressDto, FitResultsDto, SparseTerms } from '../../../shared/fits';
import type { Database } from '../../db/client';
import { fitEvaluations, fits, models, users } from '../../db/schema/index';
import { notFound } from '../../http/errors';
import { bytesToFloat64, bytesToUint8 } from '../codec';
import { findFitSummary, type FitSummaryRow } from '../data';
import { fitSummaryDto, progressDto } from './dto';
import { specChanges } from './spec-diff';

export async function requireFit(db: Database, workspaceId: string, fitId: string): Promise<FitSummaryRow> {
  const fit = await findFitSummary(db, workspaceId, fitId);
  if (!fit) throw notFound('No such fit in this workspace.');
  return fit;
}

export async function getProgress(db: Database, workspaceId: string, fitId: string): Promise<FitProgressDto> {
  return progressDto(await requireFit(db, workspaceId, fitId));
}

function sparseRows(values: Float64Array, rows: number, p: number): SparseTerms[] {
  const out: SparseTerms[] = [];
  for (let l = 0; l < rows; l++) {
    const terms: number[] = [];
    const vals: number[] = [];
    for (let j = 0; j < p; j++) {
      const v = values[l * p + j];
      if (v !== 0) {
        terms.push(j);
        vals.push(v);
      }
    }
    out.push({ terms, values: vals });
  }
  return out;
}

async function loadResults(db: Database, fit: FitSummaryRow): Promise<FitResultsDto | null> {
  if (fit.status !== 'finished') return null;
  const [row] = await db
    .select({
      results: fits.results,
      coefficients: fits.coefficients,
      standardizedCoefficients: fits.standardizedCoefficients,
      selectionCounts: fits.selectionCounts,
    })
    .from(fits)
    .where(eq(fits.id, fit.id));
  const r = row?.results;
  if (!r || !row.coefficients || !row.standardizedCoefficients) return null;
  const p = r.terms.length;
  const L = r.lambda.length;
  const index = fit.chosenIndex ?? L - 1;
  let stability: number[] | null = null;
  if (r.cv && row.selectionCounts) {
    const counts = bytesToUint8(row.selectionCounts).subarray(index * p, (index + 1) * p);
    stability = Array.from(counts, (c) => c / r.cv!.folds);
  }
  const [evaluation] = await db
    .select()
    .from(fitEvaluations)
    .where(and(eq(fitEvaluations.fitId, fit.id), eq(fitEvaluations.lambdaIndex, index)));
  const evaluationDto: EvaluationDto = evaluation
    ? { index, state: evaluation.state, message: evaluation.message, refit: evaluation.result?.refit ?? null, diagnostics: evaluation.result?.diagnostics ?? null, holdout: evaluation.result?.holdout ?? null }
    : { index, state: 'waiting', message: null, refit: null, diagnostics: null, holdout: null };
  const unconvergedLambdas = r.certificates.flatMap((c, l) => (c.status === 'converged' ? [] : [l]));
  return {
    terms: r.terms,
    termColumns: r.termColumns,
    termGroups: r.termGroups,
    lambda: r.lambda,
    lambdaMax: r.lambdaMax,
    intercept: r.intercept,
    coefficients: sparseRows(bytesToFloat64(row.coefficients), L, p),
    standardizedIntercept: r.standardizedIntercept,
    standardizedCoefficients: sparseRows(bytesToFloat64(row.standardizedCoefficients), L, p),
    nonzero: r.nonzero,
    devianceExplained: r.devianceExplained,
    certificates: r.certificates,
    unconvergedLambdas,
    cv: r.cv ? { ...r.cv, nonzero: r.nonzero } : null,
    chosen: {
      index,
      lambda: r.lambda[index],
      rule: (fit.chosenRule ?? 'last') as ChoiceRule,
      chosenBy: fit.chosenBy ? { id: fit.chosenBy, name: await userName(db, fit.chosenBy) } : null,
      chosenAt: fit.chosenAt?.toISOString() ?? null,
    },
    stability,
    evaluation: evaluationDto,
    rowsFitted: r.rowsFitted,
    rowsDropped: r.rowsDropped,
    notes: r.notes,
  };
}

async function userName(db: Database, id: string): Promise<string> {
  const [user] = await db.select({ name: users.name }).from(users).where(eq(users.id, id));
  return user?.name ?? 'a former member';
}

export async function getFitDetail(db: Database, workspaceId: string, fitId: string): Promise<FitDetailDto> {
  const fit = await requireFit(db, workspaceId, fitId);
  const [model] = await db.select({ name: models.name }).from(models).where(eq(models.id, fit.modelId));
  const [previous] = fit.version > 1
    ? await db.select({ id: fits.id, version: fits.version, spec: fits.spec }).from(fits).where(and(eq(fits.modelId, fit.modelId), eq(fits.version, fit.version - 1)))
    : [];
  const t = fit.timings;
  const totalMs = fit.startedAt && fit.finishedAt ? fit.finishedAt.getTime() - fit.startedAt.getTime() : null;
  return {
    ...fitSummaryDto(fit),
    modelName: model?.name ?? '',
    outcome: fit.spec.outcome,
    family: fit.spec.family,
    spec: fit.spec,
    engineVersion: fit.engineVersion,
    seed: fit.seed,
    timings: {
      waitingMs: fit.startedAt ? fit.startedAt.getTime() - fit.createdAt.getTime() : null,
      pathMs: t.pathMs ?? null,
      cvMs: t.cvMs ?? null,
      totalMs,
    },
    progress: progressDto(fit),
    specChanges: previous ? specChanges(previous.spec, fit.spec) : null,
    previousVersion: previous ? { id: previous.id, version: previous.version } : null,
    results: await loadResults(db, fit),
  };
}
