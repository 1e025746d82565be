/**
 * Command-line options of `lariat fit` (docs/cli.md), parsed and
 * checked without touching any file. Every error names the option at fault.
 */
import { DEFAULT_MAX_ITERATIONS, DEFAULT_PATH_DECADES, DEFAULT_PATH_LENGTH, DEFAULT_TOLERANCE } from '../engine/defaults';
import type { Family, PenaltyKind } from '../engine/types';

export class UsageError extends Error {
  override name = 'UsageError';
}

export interface FitOptions {
  data: string;
  response: string;
  predictors?: string[];
  family: Family;
  penalty: PenaltyKind;
  /** Elastic net only, and required there. */
  l1Share?: number;
  groupsFile?: string;
  penaltyWeightsFile?: string;
  lambda?: number[];
  pathLength: number;
  pathDecades: number;
  maxTerms?: number;
  standardize: boolean;
  /** 0 = no cross-validation. Ignored when foldColumn is given. */
  folds: number;
  foldColumn?: string;
  seed: number;
  tolerance: number;
  maxIterations: number;
  workers: 'auto' | 'off' | 'on';
}

export const DEFAULTS = {
  family: 'gaussian' as Family,
  penalty: 'lasso' as PenaltyKind,
  pathLength: DEFAULT_PATH_LENGTH,
  pathDecades: DEFAULT_PATH_DECADES,
  folds: 10,
  seed: 1,
  tolerance: DEFAULT_TOLERANCE,
  maxIterations: DEFAULT_MAX_ITERATIONS,
};

export const VALUE_OPTIONS = new Set([
  'data', 'response', 'predictors', 'family', 'penalty', 'l1-share', 'groups', 'penalty-weights', 'lambda',
  'path-length', 'path-decades', 'max-terms', 'folds', 'fold-column', 'seed', 'tolerance', 'max-iterations', 'workers',
]);
export const FLAG_OPTIONS = new Set(['no-standardize', 'help']);

/** Splits argv into option -> raw value; accepts `--name value` and `--name=value`. */
export function tokenize(argv: string[]): Map<string, string | true> {
  const seen = new Map<string, string | true>();
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (!arg.startsWith('--')) throw new UsageError(`unexpected argument "${arg}" (options start with --)`);
    const eq = arg.indexOf('=');
    const name = eq < 0 ? arg.slice(2) : arg.slice(2, eq);
    if (seen.has(name)) throw new UsageError(`option --${name} is given twice`);
    if (FLAG_OPTIONS.has(name)) {
      if (eq >= 0) throw new UsageError(`option --${name} takes no value`);
      seen.set(name, true);
    } else if (VALUE_OPTIONS.has(name)) {
      const value = eq >= 0 ? arg.slice(eq + 1) : argv[++i];
      if (value === undefined || (eq < 0 && value.startsWith('--'))) {
        throw new UsageError(`option --${name} needs a value`);
      }
      seen.set(name, value);
    } else {
      throw new UsageError(`unknown option --${name} (see --help)`);
    }
  }
  return seen;
}

function number(option: string, raw: string): number {
  const v = Number(raw.trim());
  if (raw.trim() === '' || !Number.isFinite(v)) throw new UsageError(`--${option} must be a number (got "${raw}")`);
  return v;
}

function integer(option: string, raw: string, min: number): number {
  const v = number(option, raw);
  if (!Number.isInteger(v) || v < min) throw new UsageError(`--${option} must be an integer of at least ${min} (got "${raw}")`);
  return v;
}

function oneOf<T extends string>(option: string, raw: string, allowed: readonly T[]): T {
  if (!(allowed as readonly string[]).includes(raw)) {
    throw new UsageError(`--${option} must be one of ${allowed.join(', ')} (got "${raw}")`);
  }
  return raw as T;
}

function lambdaList(raw: string): number[] {
  const values = raw.split(',').map((s, k) => {
    const v = Number(s.trim());
    if (s.trim() === '' || !Number.isFinite(v) || v < 0) {
      throw new UsageError(`--lambda value ${k + 1} ("${s}") must be a number >= 0`);
    }
    return v;
  });
  for (let k = 1; k < values.length; k++) {
    if (!(values[k] < values[k - 1])) {
      throw new UsageError(`--lambda values must be strictly descending; value ${k + 1} (${values[k]}) is not below ${values[k - 1]}`);
    }
  }
  return values;
}

function nameList(option: string, raw: string): string[] {
  const names = raw.split(',').map((s) => s.trim());
  if (names.some((s) => s === '')) throw new UsageError(`--${option} has an empty name in "${raw}"`);
  const dup = names.find((s, k) => names.indexOf(s) !== k);
  if (dup !== undefined) throw new UsageError(`--${option} names "${dup}" twice`);
  return names;
}

export function parseFitOptions(argv: string[]): FitOptions {
  const t = tokenize(argv);
  const get = (name: string) => t.get(name) as string | undefined;
  const data = get('data');
  const response = get('response');
  if (data === undefined) throw new UsageError('option --data FILE.csv is required');
  if (response === undefined) throw new UsageError('option --response COLUMN is required');
  const penalty = oneOf('penalty', get('penalty') ?? DEFAULTS.penalty, ['lasso', 'elastic-net', 'group-lasso'] as const);
  const shareRaw = get('l1-share');
  const l1Share = shareRaw === undefined ? undefined : number('l1-share', shareRaw);
  if (l1Share !== undefined && penalty !== 'elastic-net') throw new UsageError('--l1-share applies only to --penalty elastic-net');
  if (penalty === 'elastic-net' && l1Share === undefined) {
    throw new UsageError('--penalty elastic-net needs --l1-share A, the share of the L1 part in (0, 1] (1 = lasso, towards 0 = ridge)');
  }
  if (l1Share !== undefined && !(l1Share > 0 && l1Share <= 1)) throw new UsageError(`--l1-share must be in (0, 1] (got "${shareRaw}")`);
  const lambdaRaw = get('lambda');
  if (lambdaRaw !== undefined && (t.has('path-length') || t.has('path-decades') || t.has('max-terms'))) {
    throw new UsageError('--lambda cannot be combined with --path-length, --path-decades or --max-terms (they shape the automatic path)');
  }
  const decadesRaw = get('path-decades');
  const pathDecades = decadesRaw === undefined ? DEFAULTS.pathDecades : number('path-decades', decadesRaw);
  if (!(pathDecades > 0)) throw new UsageError(`--path-decades must be a positive number (got "${decadesRaw}")`);
  const maxTerms = get('max-terms') === undefined ? undefined : integer('max-terms', get('max-terms') as string, 1);
  const tolerance = get('tolerance') === undefined ? DEFAULTS.tolerance : number('tolerance', get('tolerance') as string);
  if (!(tolerance > 0)) throw new UsageError(`--tolerance must be positive (got "${get('tolerance')}")`);
  if (get('groups') !== undefined && penalty !== 'group-lasso') throw new UsageError('--groups applies only to --penalty group-lasso');
  const foldColumn = get('fold-column');
  if (foldColumn !== undefined && t.has('folds')) throw new UsageError('--folds cannot be combined with --fold-column (the column sets the folds)');
  const folds = get('folds') === undefined ? DEFAULTS.folds : integer('folds', get('folds') as string, 0);
  if (folds === 1) throw new UsageError('--folds must be 0 (no cross-validation) or at least 2 (got "1")');
  return {
    data,
    response: response.trim(),
    predictors: get('predictors') === undefined ? undefined : nameList('predictors', get('predictors') as string),
    family: oneOf('family', get('family') ?? DEFAULTS.family, ['gaussian', 'binomial'] as const),
    penalty,
    l1Share,
    groupsFile: get('groups'),
    penaltyWeightsFile: get('penalty-weights'),
    lambda: lambdaRaw === undefined ? undefined : lambdaList(lambdaRaw),
    pathLength: get('path-length') === undefined ? DEFAULTS.pathLength : integer('path-length', get('path-length') as string, 1),
    pathDecades,
    maxTerms,
    standardize: !t.has('no-standardize'),
    folds,
    foldColumn: foldColumn?.trim(),
    seed: get('seed') === undefined ? DEFAULTS.seed : integer('seed', get('seed') as string, 0),
    tolerance,
    maxIterations: get('max-iterations') === undefined ? DEFAULTS.maxIterations : integer('max-iterations', get('max-iterations') as string, 1),
    workers: oneOf('workers', get('workers') ?? 'auto', ['auto', 'off', 'on'] as const),
  };
}
