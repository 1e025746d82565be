/** What changed in a version's spec against the previous version, field by field, in plain words. */
import type { FitSpec, SpecChangeDto } from '../../../shared/fits';

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
    out.push({ field, before: a ?? null, after: b ?? null, summary: `${LABELS[field]}: ${canonical(a)} → ${canonical(b)}.` });
  }
  return out;
}
