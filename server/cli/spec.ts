/**
 * FitOptions + the data table -> FitSpec, checking every named column against the file so errors
 * can name the option, the file and the column.
 */
import { readFileSync } from 'node:fs';
import type { EngineTable, FitSpec } from '../engine/types';
import { UsageError, type FitOptions } from './args';

/** `names`: the table's column names as a set (a scan of the columns per predictor is quadratic: 5000 on wide files). */
function requireColumn(table: EngineTable, names: Set<string>, file: string, option: string, name: string): void {
  if (!names.has(name)) {
    const known = table.columns.map((c) => c.name);
    const shown = known.length > 12 ? `${known.slice(0, 12).join(', ')}, ...` : known.join(', ');
    throw new UsageError(`${option}: column "${name}" is not in ${file} (columns: ${shown})`);
  }
}

/** `{"group name": ["column", ...]}` from a JSON file; every column must be a predictor. */
export function readGroups(file: string, predictors: string[]): Record<string, string[]> {
  let parsed: unknown;
  try {
    parsed = JSON.parse(readFileSync(file, 'utf8'));
  } catch (error) {
    throw new UsageError(`--groups: cannot read ${file}: ${(error as Error).message}`);
  }
  if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed)) {
    throw new UsageError(`--groups: ${file} must hold a JSON object {"group name": ["column", ...]}`);
  }
  const groups: Record<string, string[]> = {};
  const owner = new Map<string, string>();
  for (const [name, columns] of Object.entries(parsed)) {
    if (!Array.isArray(columns) || columns.length === 0 || !columns.every((c) => typeof c === 'string')) {
      throw new UsageError(`--groups: group "${name}" in ${file} must be a non-empty list of column names`);
    }
    for (const column of columns as string[]) {
      if (!predictors.includes(column)) {
        throw new UsageError(`--groups: group "${name}" in ${file} names "${column}", which is not a predictor`);
      }
      const previous = owner.get(column);
      if (previous !== undefined) {
        throw new UsageError(`--groups: column "${column}" is in both group "${previous}" and group "${name}" in ${file}`);
      }
      owner.set(column, name);
    }
    groups[name] = columns as string[];
  }
  return groups;
}

/**
 * `{"column or column=level": weight, ...}` from a JSON file; weights are finite and >= 0 (the
 * engine checks each name against the predictors and their levels).
 */
export function readPenaltyWeights(file: string): Record<string, number> {
  let parsed: unknown;
  try {
    parsed = JSON.parse(readFileSync(file, 'utf8'));
  } catch (error) {
    throw new UsageError(`--penalty-weights: cannot read ${file}: ${(error as Error).message}`);
  }
  if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed)) {
    throw new UsageError(`--penalty-weights: ${file} must hold a JSON object {"column": weight, ...}`);
  }
  const weights: Record<string, number> = {};
  for (const [name, value] of Object.entries(parsed)) {
    if (typeof value !== 'number' || !Number.isFinite(value) || value < 0) {
      throw new UsageError(`--penalty-weights: the weight of "${name}" in ${file} must be a number >= 0 (got ${JSON.stringify(value)})`);
    }
    weights[name] = value;
  }
  return weights;
}

export function buildFitSpec(options: FitOptions, table: EngineTable): FitSpec {
  const file = options.data;
  const names = new Set(table.columns.map((c) => c.name));
  requireColumn(table, names, file, '--response', options.response);
  if (options.foldColumn !== undefined) requireColumn(table, names, file, '--fold-column', options.foldColumn);
  const excluded = new Set([options.response, ...(options.foldColumn ? [options.foldColumn] : [])]);
  const predictors = options.predictors ?? table.columns.map((c) => c.name).filter((name) => !excluded.has(name));
  for (const name of predictors) {
    requireColumn(table, names, file, '--predictors', name);
    if (name === options.response) throw new UsageError(`--predictors: "${name}" is the response`);
    if (name === options.foldColumn) throw new UsageError(`--predictors: "${name}" is the fold column`);
  }
  if (predictors.length === 0) throw new UsageError(`no predictors: ${file} has no columns besides the response`);
  return {
    family: options.family,
    response: options.response,
    predictors,
    penalty: options.penalty,
    ...(options.l1Share !== undefined ? { l1Share: options.l1Share } : {}),
    groups: options.groupsFile ? readGroups(options.groupsFile, predictors) : undefined,
    penaltyWeights: options.penaltyWeightsFile ? readPenaltyWeights(options.penaltyWeightsFile) : undefined,
    standardize: options.standardize,
    lambda: options.lambda,
    pathLength: options.lambda ? options.lambda.length : options.pathLength,
    pathDecades: options.pathDecades,
    ...(options.maxTerms !== undefined ? { maxTerms: options.maxTerms } : {}),
    tolerance: options.tolerance,
    maxIterations: options.maxIterations,
    screening: 'strong',
    missing: 'drop',
    cv:
      options.foldColumn !== undefined
        ? { folds: 0, seed: options.seed, foldColumn: options.foldColumn }
        : options.folds >= 2
          ? { folds: options.folds, seed: options.seed }
          : null,
  };
}
