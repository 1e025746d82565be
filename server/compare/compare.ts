/**
 * The comparison of finished fits (pure: FitDetailDto in, ComparisonDto out). The first fit is the
 * baseline. Coefficients are read at each fit's chosen lambda, on the original scale.
 */
import type { ComparedFitDto, ComparedTermDto, ComparisonDto, ComparisonPairDto, MetricDifferenceDto, SelectionChangeDto } from '../../shared/compare';
import type { FitDetailDto, FitResultsDto } from '../../shared/fits';
import { specChanges } from '../fits/service/spec-diff';

type Finished = FitDetailDto & { results: FitResultsDto };

/** term name -> coefficient at the chosen lambda (kept terms only). */
function chosenCoefficients(r: FitResultsDto): Map<string, number> {
  const sparse = r.coefficients[r.chosen.index];
  return new Map(sparse.terms.map((t, k) => [r.terms[t], sparse.values[k]]));
}

function stabilityOf(r: FitResultsDto, term: string): number | null {
  const j = r.terms.indexOf(term);
  return j < 0 || !r.stability ? null : r.stability[j];
}

function comparedFit(f: Finished): ComparedFitDto {
  const r = f.results;
  const i = r.chosen.index;
  return {
    id: f.id,
    modelId: f.modelId,
    modelName: f.modelName,
    version: f.version,
    outcome: f.outcome,
    family: f.family,
    unconverged: f.unconverged,
    datasetVersion: f.datasetVersion,
    engineVersion: f.engineVersion,
    chosen: { index: i, lambda: r.chosen.lambda, rule: r.chosen.rule },
    nonzero: r.nonzero[i],
    devianceExplained: r.devianceExplained[i],
    cv: r.cv ? { metric: r.cv.metric, mean: r.cv.mean[i], standardError: r.cv.standardError[i], folds: r.cv.folds } : null,
    holdout: r.evaluation.state === 'ready' && r.evaluation.holdout ? r.evaluation.holdout : null,
  };
}

const HIGHER_IS_BETTER = new Set(['auc', 'rSquared', 'deviance explained']);

function metricDifferences(a: ComparedFitDto, b: ComparedFitDto, notes: string[]): MetricDifferenceDto[] {
  const out: MetricDifferenceDto[] = [];
  if (a.cv && b.cv) {
    if (a.cv.metric === b.cv.metric) {
      out.push({
        name: `CV ${a.cv.metric}`,
        baseline: a.cv.mean,
        other: b.cv.mean,
        difference: b.cv.mean - a.cv.mean,
        standardError: Math.sqrt(a.cv.standardError ** 2 + b.cv.standardError ** 2),
        lowerIsBetter: !HIGHER_IS_BETTER.has(a.cv.metric),
      });
    } else {
      notes.push(`The fits chose lambda by different measures (${a.cv.metric} and ${b.cv.metric}); their CV errors are not compared.`);
    }
  } else if (a.cv || b.cv) {
    notes.push('Only one of the two fits was cross-validated; there is no CV error to compare.');
  }
  out.push({ name: 'deviance explained', baseline: a.devianceExplained, other: b.devianceExplained, difference: b.devianceExplained - a.devianceExplained, standardError: null, lowerIsBetter: false });
  if (a.holdout && b.holdout) {
    for (const m of a.holdout.metrics) {
      const o = b.holdout.metrics.find((x) => x.name === m.name);
      if (o) out.push({ name: `holdout ${m.name}`, baseline: m.value, other: o.value, difference: o.value - m.value, standardError: null, lowerIsBetter: !HIGHER_IS_BETTER.has(m.name) });
    }
    if (a.datasetVersion.id !== b.datasetVersion.id) notes.push('The holdout rows come from different dataset versions.');
  }
  return out;
}

function selectionChanges(a: Finished, b: Finished): SelectionChangeDto[] {
  const ca = chosenCoefficients(a.results);
  const cb = chosenCoefficients(b.results);
  const out: SelectionChangeDto[] = [];
  const row = (term: string, kind: SelectionChangeDto['kind']): SelectionChangeDto => ({
    term,
    kind,
    baseline: ca.get(term) ?? (a.results.terms.includes(term) ? 0 : null),
    other: cb.get(term) ?? (b.results.terms.includes(term) ? 0 : null),
    baselineStability: stabilityOf(a.results, term),
    otherStability: stabilityOf(b.results, term),
  });
  for (const term of cb.keys()) if (!ca.has(term)) out.push(row(term, 'entered'));
  for (const term of ca.keys()) if (!cb.has(term)) out.push(row(term, 'left'));
  for (const [term, v] of ca) {
    const w = cb.get(term);
    if (w !== undefined && Math.sign(v) !== Math.sign(w)) out.push(row(term, 'changed-sign'));
  }
  return out;
}

export function compareFits(list: Finished[]): ComparisonDto {
  const fits = list.map(comparedFit);
  const names: string[] = [];
  const seen = new Set<string>();
  for (const f of list) {
    for (const t of f.results.terms) {
      if (seen.has(t)) continue;
      seen.add(t);
      names.push(t);
    }
  }
  const coefs = list.map((f) => chosenCoefficients(f.results));
  const terms: ComparedTermDto[] = names.map((term) => ({
    term,
    values: list.map((f, k) => coefs[k].get(term) ?? (f.results.terms.includes(term) ? 0 : null)),
    stability: list.map((f) => stabilityOf(f.results, term)),
  }));
  const pairs: ComparisonPairDto[] = list.slice(1).map((f, k) => {
    const notes: string[] = [];
    const a = fits[0];
    const b = fits[k + 1];
    if (a.datasetVersion.id !== b.datasetVersion.id) notes.push(`Different data: ${a.datasetVersion.datasetName} v${a.datasetVersion.number} against ${b.datasetVersion.datasetName} v${b.datasetVersion.number}.`);
    if (a.engineVersion !== b.engineVersion) notes.push(`Different engine versions (${a.engineVersion}, ${b.engineVersion}).`);
    if (a.unconverged || b.unconverged) notes.push('At least one fit did not converge at every lambda; its numbers are less certain.');
    return { other: k + 1, specChanges: specChanges(list[0].spec, f.spec), selection: selectionChanges(list[0], f), metrics: metricDifferences(a, b, notes), notes };
  });
  return { fits, terms, pairs };
}
