/** What changed in a version's spec against the previous version, field by field, in plain words. */
import { CV_METRIC_LABELS, MISSING_POLICY_LABELS, PENALTY_LABELS, type FitSpec, type SpecChangeDto } from '../../../shared/fits';

const FIELDS = [
  'datasetVersionId',
  'predictors',
  'penalty',
  'l1Share',
  'groups',
  'standardize',
  'path',
  'penaltyWeights',
  'cv',
  'metric',
  'missing',
  'holdout',
  'tolerance',
  'maxIterations',
] as const satisfies readonly (keyof FitSpec)[];

/** The words the fit page's settings use for each field (src/features/fits/components/SpecSummary.tsx), not the spec's keys. */
const LABELS: Record<(typeof FIELDS)[number], string> = {
  datasetVersionId: 'Dataset version',
  predictors: 'Predictors',
  penalty: 'Penalty',
  l1Share: 'L1 share',
  groups: 'Groups',
  standardize: 'Standardized',
  path: 'Path',
  penaltyWeights: 'Penalty weights',
  cv: 'Cross-validation',
  metric: 'Measure',
  missing: 'Missing values',
  holdout: 'Holdout',
  tolerance: 'Tolerance',
  maxIterations: 'Iteration limit',
};

/** JSON with object keys sorted, so key order never counts as a change. */
function canonical(value: unknown): string {
  if (value === undefined) return 'null';
  if (Array.isArray(value)) return `[${value.map(canonical).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>).filter(([, v]) => v !== undefined).sort(([a], [b]) => (a < b ? -1 : 1));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonical(v)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

function shortList(items: string[]): string {
  return items.length > 8 ? `${items.slice(0, 8).join(', ')} and ${items.length - 8} more` : items.join(', ');
}

type Field = (typeof FIELDS)[number];

/** One field's value in the fit page's words ("5 folds, seed 1"), never raw JSON. */
function describe(field: Field, spec: FitSpec): string {
  switch (field) {
    case 'penalty':
      return PENALTY_LABELS[spec.penalty];
    case 'metric':
      return spec.metric ? CV_METRIC_LABELS[spec.metric] : 'the default';
    case 'missing':
      return MISSING_POLICY_LABELS[spec.missing].toLowerCase();
    case 'standardize':
      return spec.standardize ? 'yes' : 'no';
    case 'cv': {
      const cv = spec.cv;
      if (cv.kind === 'none') return 'none';
      return cv.kind === 'folds' ? `${cv.folds} folds, seed ${cv.seed}` : `fold column "${cv.column}"`;
    }
    case 'path': {
      const path = spec.path;
      if (path.kind === 'explicit') return `${path.lambdas.length} listed lambdas (${shortList(path.lambdas.map(String))})`;
      const parts = [`${path.pathLength} lambdas`, path.pathDecades !== undefined ? `${path.pathDecades} decades` : 'default decades'];
      if (path.maxTerms !== undefined) parts.push(`stop after ${path.maxTerms} terms`);
      return parts.join(', ');
    }
    case 'holdout':
      return spec.holdout ? `${Math.round(spec.holdout.share * 1000) / 10}% of the rows, seed ${spec.holdout.seed}` : 'none';
    case 'groups': {
      const groups = Object.entries(spec.groups ?? {});
      return groups.length ? shortList(groups.map(([name, cols]) => `${name} (${cols.join(', ')})`)) : 'none';
    }
    case 'penaltyWeights': {
      const weights = Object.entries(spec.penaltyWeights ?? {});
      return weights.length ? shortList(weights.map(([name, w]) => `${name} = ${w}`)) : 'none';
    }
    default: {
      const value = spec[field];
      return value === undefined || value === null ? 'the default' : String(value);
    }
  }
}

export function specChanges(before: FitSpec, after: FitSpec): SpecChangeDto[] {
  const out: SpecChangeDto[] = [];
  for (const field of FIELDS) {
    const a = before[field];
    const b = after[field];
    if (canonical(a) === canonical(b)) continue;
    if (field === 'predictors') {
      const added = after.predictors.filter((p) => !before.predictors.includes(p));
      const removed = before.predictors.filter((p) => !after.predictors.includes(p));
      const parts = [added.length ? `added ${shortList(added)}` : '', removed.length ? `removed ${shortList(removed)}` : ''].filter(Boolean);
      out.push({ field, before: a, after: b, summary: `Predictors: ${parts.join('; ') || 'reordered'}.` });
      continue;
    }
    if (field === 'datasetVersionId') {
      out.push({ field, before: a, after: b, summary: 'A newer version of the dataset.' });
      continue;
    }
    out.push({ field, before: a ?? null, after: b ?? null, summary: `${LABELS[field]}: ${describe(field, before)} → ${describe(field, after)}.` });
  }
  return out;
}
