/**
 * The reproducibility bundle of a fit: everything needed to run it again outside the app: the spec,
 * the dataset version and the SHA-256 of its uploaded file (compare it with the original download), the engine
 * version and seed, and the command line of Lariat's CLI (docs/cli.md) that re-runs the path and the
 * folds. Spec settings the CLI has no option for (holdout split, missing-value fill, a CV measure other
 * than the default) are listed under `notCoveredByCli`, so nobody mistakes the command for the whole
 * fit; group and penalty-weight settings travel as files written beside the data.
 */
import { CAUTION_LINES } from '../../shared/cautions';
import type { FitSpec } from '../../shared/fits';
import type { ChosenModel } from './chosen-model';

export interface ReproBundle {
  format: 'lariat-reproducibility-bundle';
  formatVersion: 1;
  fit: { id: string; version: number; modelId: string; modelName: string };
  spec: FitSpec;
  dataset: {
    id: string;
    name: string;
    version: number;
    versionId: string;
    /** SHA-256 of the file as uploaded (GET originalPath gives those bytes). */
    sha256: string;
    originalPath: string;
    /** The table as the fit read it (after the version's column settings): what the command reads. */
    downloadPath: string;
    fileName: string;
  };
  engineVersion: string;
  seed: number | null;
  chosen: { index: number; lambda: number; rule: string };
  /** Files to write beside the data before running the command. */
  files: Record<string, unknown>;
  command: string;
  notCoveredByCli: string[];
  cautions: readonly string[];
}

/** Single-quoted for a POSIX shell. */
function sh(arg: string): string {
  return /^[A-Za-z0-9_./,=:-]+$/.test(arg) ? arg : `'${arg.replace(/'/g, `'\\''`)}'`;
}

export function cliArguments(spec: FitSpec, dataFile: string): { args: string[]; files: Record<string, unknown>; notCovered: string[] } {
  const args = ['--data', dataFile, '--response', spec.outcome, '--predictors', spec.predictors.join(','), '--family', spec.family, '--penalty', spec.penalty];
  const files: Record<string, unknown> = {};
  const notCovered: string[] = [];
  if (spec.l1Share !== undefined) args.push('--l1-share', String(spec.l1Share));
  if (spec.groups) {
    files['groups.json'] = spec.groups;
    args.push('--groups', 'groups.json');
  }
  if (spec.penaltyWeights && Object.keys(spec.penaltyWeights).length > 0) {
    files['penalty-weights.json'] = spec.penaltyWeights;
    args.push('--penalty-weights', 'penalty-weights.json');
  }
  if (!spec.standardize) args.push('--no-standardize');
  if (spec.path.kind === 'explicit') args.push('--lambda', spec.path.lambdas.join(','));
  else {
    args.push('--path-length', String(spec.path.pathLength));
    if (spec.path.pathDecades !== undefined) args.push('--path-decades', String(spec.path.pathDecades));
    if (spec.path.maxTerms !== undefined) args.push('--max-terms', String(spec.path.maxTerms));
  }
  if (spec.tolerance !== undefined) args.push('--tolerance', String(spec.tolerance));
  if (spec.maxIterations !== undefined) args.push('--max-iterations', String(spec.maxIterations));
  if (spec.cv.kind === 'none') args.push('--folds', '0');
  else if (spec.cv.kind === 'folds') args.push('--folds', String(spec.cv.folds), '--seed', String(spec.cv.seed));
  else args.push('--fold-column', spec.cv.column);
  if (spec.holdout) notCovered.push(`holdout: ${spec.holdout.share * 100}% of the rows set aside with seed ${spec.holdout.seed} before fitting (remove those rows first to match)`);
  if (spec.missing === 'impute') notCovered.push('missing: gaps filled with the column mean or most common level (the CLI leaves out rows with a gap)');
  if (spec.metric !== undefined) notCovered.push(`metric: the lambda choice used ${spec.metric} (the CLI reports every measure; pick the same one)`);
  return { args, files, notCovered };
}

export function reproBundle(m: ChosenModel, modelName: string): ReproBundle {
  const { fit } = m;
  const fileName = `${fit.datasetName.replace(/[^A-Za-z0-9_.-]+/g, '-')}-v${fit.datasetVersionNumber}.csv`;
  const { args, files, notCovered } = cliArguments(fit.spec, fileName);
  return {
    format: 'lariat-reproducibility-bundle',
    formatVersion: 1,
    fit: { id: fit.id, version: fit.version, modelId: fit.modelId, modelName },
    spec: fit.spec,
    dataset: {
      id: fit.datasetId,
      name: fit.datasetName,
      version: fit.datasetVersionNumber,
      versionId: fit.datasetVersionId,
      sha256: fit.datasetSha256,
      originalPath: `/api/workspaces/${fit.workspaceId}/datasets/${fit.datasetId}/versions/${fit.datasetVersionNumber}/original`,
      downloadPath: `/api/workspaces/${fit.workspaceId}/datasets/${fit.datasetId}/versions/${fit.datasetVersionNumber}/cleaned.csv`,
      fileName,
    },
    engineVersion: fit.engineVersion,
    seed: fit.seed,
    chosen: { index: m.index, lambda: m.lambda, rule: m.rule },
    files,
    command: ['npm', 'run', '-s', 'cli', '--', 'fit', ...args].map(sh).join(' '),
    notCoveredByCli: notCovered,
    cautions: CAUTION_LINES,
  };
}
