/**
 * The fit form's starting values and the checks that need the dataset (the shared zod schema checks
 * everything else). Kept apart from the components so the rules read in one place.
 */
import type { ColumnSchema } from '@shared/datasets';
import { DEFAULT_FOLDS, DEFAULT_PATH_LENGTH, DEFAULT_SEED, type FitRequestInput, type FitSpec } from '@shared/fits';

/** Why a column cannot be a predictor, or null. */
export function unavailableReason(c: ColumnSchema, outcome: string, foldColumn: string | null): string | null {
  if (c.name === outcome) return 'This is the outcome.';
  if (c.name === foldColumn) return 'This is the fold column.';
  if (c.excluded) return 'Left out of models on the dataset page.';
  return null;
}

/**
 * A column with more than this share of blanks is not ticked by default: with the default
 * "leave out rows" policy it would silently cost the fit that share of the rows.
 */
export const DEFAULT_MAX_BLANK_SHARE = 0.2;

export interface LeftOutColumn {
  name: string;
  reason: string;
}

/**
 * Usable columns the default predictor set leaves out, and why: the outcome of another model on this
 * dataset (itself a result, so it would explain this outcome after the fact) and columns with many
 * blanks. The analyst can still tick them; the form lists them beside the predictors.
 */
export function defaultLeftOut(columns: ColumnSchema[], outcome: string, otherOutcomes: string[] = []): LeftOutColumn[] {
  const others = new Set(otherOutcomes.filter((o) => o !== outcome));
  const out: LeftOutColumn[] = [];
  for (const c of columns) {
    if (unavailableReason(c, outcome, null) !== null) continue;
    if (others.has(c.name)) out.push({ name: c.name, reason: 'the outcome of another model on this dataset' });
    else if (c.summary.count > 0 && c.summary.missing / c.summary.count > DEFAULT_MAX_BLANK_SHARE) {
      out.push({ name: c.name, reason: `${c.summary.missing} of ${c.summary.count} cells blank` });
    }
  }
  return out;
}

export function defaultsFromColumns(columns: ColumnSchema[], outcome: string, otherOutcomes: string[] = []): FitRequestInput {
  const leftOut = new Set(defaultLeftOut(columns, outcome, otherOutcomes).map((c) => c.name));
  return {
    predictors: columns.filter((c) => unavailableReason(c, outcome, null) === null && !leftOut.has(c.name)).map((c) => c.name),
    penalty: 'lasso',
    standardize: true,
    path: { kind: 'automatic', pathLength: DEFAULT_PATH_LENGTH },
    cv: { kind: 'folds', folds: DEFAULT_FOLDS, seed: DEFAULT_SEED },
    missing: 'drop',
  };
}

/**
 * How many rows a fit with these predictors and this missing-value policy keeps, from the column
 * summaries' blank counts: exact when only the outcome matters (gap filling) or one column has
 * blanks; otherwise a range (blanks in different columns may fall in the same rows or not).
 */
export function rowsKept(
  columns: ColumnSchema[],
  outcome: string,
  predictors: string[],
  missing: 'drop' | 'impute' | undefined,
  rowCount: number,
): { least: number; most: number } {
  const byName = new Map(columns.map((c) => [c.name, c]));
  const blanks = (name: string) => byName.get(name)?.summary.missing ?? 0;
  const names = missing === 'impute' ? [outcome] : [outcome, ...predictors];
  const counts = names.map(blanks).filter((m) => m > 0);
  const most = rowCount - Math.max(0, ...counts);
  const least = Math.max(0, rowCount - counts.reduce((a, b) => a + b, 0));
  return { least, most };
}

/** A previous version's spec as the form's values (what the analyst changes for the next version). */
export function defaultsFromSpec(spec: FitSpec, columns: ColumnSchema[]): FitRequestInput {
  const present = new Set(columns.map((c) => c.name));
  const { datasetVersionId: _v, outcome: _o, family: _f, ...rest } = spec;
  return { ...rest, predictors: spec.predictors.filter((p) => present.has(p)) };
}

/** Groups to start the group-lasso editor with: one per chosen categorical predictor (its levels together). */
export function categoricalGroups(columns: ColumnSchema[], predictors: string[]): Record<string, string[]> {
  const chosen = new Set(predictors);
  return Object.fromEntries(columns.filter((c) => c.type === 'categorical' && chosen.has(c.name)).map((c) => [c.name, [c.name]]));
}

/** Checks that need the dataset version: rows for the folds, a usable fold column. Field path -> message. */
export function datasetIssues(values: FitRequestInput, columns: ColumnSchema[], rowCount: number): Record<string, string> {
  const issues: Record<string, string> = {};
  const cv = values.cv;
  if (cv?.kind === 'folds' && typeof cv.folds === 'number' && cv.folds > rowCount) {
    issues['cv.folds'] = `${cv.folds} folds need at least ${cv.folds} rows; this version has ${rowCount}.`;
  }
  if (cv?.kind === 'column') {
    const c = columns.find((x) => x.name === cv.column);
    if (cv.column && !c) issues['cv.column'] = `There is no column "${cv.column}".`;
    else if (c && c.summary.distinct !== null && c.summary.distinct < 2) issues['cv.column'] = `"${c.name}" holds one fold only; a fold column needs at least two values.`;
  }
  return issues;
}

/** "0.5, 0.1, 0.02" -> numbers (NaN for anything that is not one, so the schema names it). */
export function parseLambdas(text: string): number[] {
  return text
    .split(/[\s,;]+/)
    .filter((t) => t !== '')
    .map((t) => (/^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t) ? Number(t) : Number.NaN));
}

/** Lines "column = weight" -> a record; returns the line of the first one that cannot be read. */
export function parseWeights(text: string): { weights: Record<string, number>; badLine: string | null } {
  const weights: Record<string, number> = {};
  for (const raw of text.split('\n')) {
    const line = raw.trim();
    if (!line) continue;
    const m = /^(.+?)\s*[=:]\s*(\S+)$/.exec(line);
    if (!m || !Number.isFinite(Number(m[2]))) return { weights, badLine: line };
    weights[m[1].trim()] = Number(m[2]);
  }
  return { weights, badLine: null };
}

export function formatWeights(weights: Record<string, number> | undefined): string {
  return Object.entries(weights ?? {})
    .map(([k, v]) => `${k} = ${v}`)
    .join('\n');
}
