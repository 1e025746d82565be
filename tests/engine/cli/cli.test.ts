import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, it, expect, beforeAll } from 'vitest';
import { crossValidate } from '../../../server/engine/cv';
import { parseCsvText } from '../../../server/tabular/csv';
import { fitPath } from '../../../server/engine/index';
import { createRng } from '../../../server/engine/random';
import type { FitSpec } from '../../../server/engine/types';
import { CAUTIONS } from '../../../shared/cautions';
import type { FitOutput } from '../../../server/cli/output';

const CLI = fileURLToPath(new URL('../../../server/cli/main.ts', import.meta.url));
const TSX = fileURLToPath(new URL('../../../node_modules/.bin/tsx', import.meta.url));
let dir = '';

function cli(...args: string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(TSX, [CLI, ...args], { encoding: 'utf8', cwd: dir });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

function fitJson(...args: string[]): FitOutput {
  const r = cli('fit', ...args);
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout) as FitOutput;
}

let gaussianCsv = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'lariat-cli-'));
  const rng = createRng(21);
  const lines = ['y,a,b,colour,fold,flag'];
  for (let i = 0; i < 60; i++) {
    const a = rng.normal();
    const b = rng.normal();
    const colour = ['red', 'green', 'blue'][i % 3];
    const y = 1.5 * a - 0.5 * b + (colour === 'red' ? 1 : 0) + 0.3 * rng.normal();
    lines.push([y.toFixed(5), a.toFixed(5), b.toFixed(5), colour, (i % 4) * 10, y > 0.5 ? 'yes' : 'no'].join(','));
  }
  gaussianCsv = `${lines.join('\n')}\n`;
  writeFileSync(join(dir, 'data.csv'), gaussianCsv);
  writeFileSync(join(dir, 'groups.json'), JSON.stringify({ ab: ['a', 'b'] }));
  writeFileSync(join(dir, 'bad-groups.json'), JSON.stringify({ ab: ['a', 'nope'] }));
  writeFileSync(join(dir, 'weights.json'), JSON.stringify({ b: 0 }));
  writeFileSync(join(dir, 'bad-weights.json'), JSON.stringify({ b: -1 }));
  writeFileSync(join(dir, 'ragged.csv'), 'y,a\n1,2\n3\n');
});

const baseSpec: FitSpec = {
  family: 'gaussian', response: 'y', predictors: ['a', 'b', 'colour'], penalty: 'lasso',
  standardize: true, pathLength: 8, tolerance: 1e-7, maxIterations: 10000, screening: 'strong',
  missing: 'drop', cv: { folds: 5, seed: 3 },
};

describe('lariat fit (spawned CLI)', () => {
  it('prints the contract keys and agrees with the in-process engine', () => {
    const out = fitJson('--data', 'data.csv', '--response', 'y', '--predictors', 'a,b,colour', '--path-length', '8', '--folds', '5', '--seed', '3');
    const L = out.lambda.length;
    expect(L).toBe(8);
    // The contract's keys, written out from docs/cli.md (not taken from the code under test).
    for (const key of ['lambda', 'intercept', 'coefficients', 'dualityGap', 'iterations', 'status', 'cv', 'devianceExplained', 'nonzero', 'lambdaMax']) expect(out).toHaveProperty(key);
    const documented = [
      'lambda', 'intercept', 'coefficients', 'dualityGap', 'iterations', 'status', 'cv', 'family', 'lambdaMax', 'standardizedIntercept',
      'standardizedCoefficients', 'nonzero', 'devianceExplained', 'notes', 'cautions', 'warnings', 'engineVersion', 'timing',
    ];
    expect(Object.keys(out).sort()).toEqual(documented.sort());
    for (const key of ['folds', 'metric', 'mean', 'standardError', 'minimum', 'oneStandardError']) expect(out.cv).toHaveProperty(key);
    for (const key of ['intercept', 'dualityGap', 'iterations', 'status'] as const) expect(out[key]).toHaveLength(L);
    expect(Object.keys(out.coefficients)).toEqual(['a', 'b', 'colour=blue', 'colour=green', 'colour=red']);
    const table = parseCsvText(gaussianCsv, 'data.csv');
    const path = fitPath(table, baseSpec);
    const cv = crossValidate(table, baseSpec, path);
    expect(out.lambda).toEqual(path.lambda);
    expect(out.intercept).toEqual(path.intercept);
    expect(out.coefficients.a).toEqual(path.coefficients.map((b) => b[0]));
    expect(out.status).toEqual(path.solves.map((s) => s.status));
    expect(out.cv).toMatchObject({ folds: 5, metric: 'mse', mean: cv.mean, standardError: cv.standardError, minimum: cv.minimum, oneStandardError: cv.oneStandardError });
  });

  it('runs 10-fold cross-validation by default and none with --folds 0', () => {
    const byDefault = fitJson('--data', 'data.csv', '--response', 'y', '--predictors', 'a,b', '--path-length', '4');
    expect(byDefault.cv?.folds).toBe(10);
    const none = fitJson('--data', 'data.csv', '--response', 'y', '--predictors', 'a,b', '--path-length', '4', '--folds', '0');
    expect(none.cv).toBeNull();
  });

  it('takes folds from --fold-column and leaves that column out of the predictors', () => {
    const out = fitJson('--data', 'data.csv', '--response', 'y', '--fold-column', 'fold', '--path-length', '4');
    expect(out.cv?.folds).toBe(4);
    expect(Object.keys(out.coefficients)).not.toContain('fold');
    expect(Object.keys(out.coefficients)).toContain('flag=yes');
  });

  it('fits a binomial model on a two-level text response with an explicit lambda list', () => {
    const out = fitJson('--data', 'data.csv', '--response', 'flag', '--predictors', 'a,b', '--family', 'binomial', '--lambda', '0.2,0.05,0.01', '--folds', '3');
    expect(out.lambda).toEqual([0.2, 0.05, 0.01]);
    expect(out.cv?.metric).toBe('deviance');
  });

  it('fits a group lasso from a groups file', () => {
    const out = fitJson('--data', 'data.csv', '--response', 'y', '--predictors', 'a,b,colour', '--penalty', 'group-lasso', '--groups', 'groups.json', '--path-length', '5', '--folds', '0');
    // a and b share one group, so they leave zero together along the path (group lasso property).
    out.lambda.forEach((_, l) => expect(out.coefficients.a[l] === 0).toBe(out.coefficients.b[l] === 0));
  });

  it('fits an elastic net with --l1-share and keeps a weight-0 column in at every lambda', () => {
    const out = fitJson('--data', 'data.csv', '--response', 'y', '--predictors', 'a,b', '--penalty', 'elastic-net', '--l1-share', '0.5', '--penalty-weights', 'weights.json', '--path-length', '5', '--folds', '0');
    expect(out.coefficients.b.every((v) => v !== 0)).toBe(true);
    expect(out.coefficients.a[0]).toBe(0);
    const table = parseCsvText(gaussianCsv, 'data.csv');
    const path = fitPath(table, { ...baseSpec, predictors: ['a', 'b'], penalty: 'elastic-net', l1Share: 0.5, penaltyWeights: { b: 0 }, pathLength: 5, cv: null });
    expect(out.coefficients.b).toEqual(path.coefficients.map((c) => c[1]));
  });

  it('goes --path-decades deep and ends after the first model over --max-terms terms', () => {
    const shallow = fitJson('--data', 'data.csv', '--response', 'y', '--predictors', 'a,b,colour', '--path-length', '11', '--path-decades', '2', '--folds', '0');
    const last = shallow.lambda[shallow.lambda.length - 1];
    expect(Math.abs(last / shallow.lambdaMax - 1e-2)).toBeLessThan(1e-12);
    const limited = fitJson('--data', 'data.csv', '--response', 'y', '--predictors', 'a,b,colour', '--path-length', '11', '--path-decades', '2', '--max-terms', '1', '--folds', '4');
    // Cross-validation refits every lambda of the shortened path in each fold.
    expect(limited.cv?.mean).toHaveLength(limited.lambda.length);
    expect(limited.cv?.mean.every((v) => Number.isFinite(v))).toBe(true);
    const k = limited.lambda.length - 1;
    expect(limited.nonzero[k]).toBeGreaterThan(1);
    expect(limited.nonzero.slice(0, k).every((count) => count <= 1)).toBe(true);
    expect(limited.lambda).toEqual(shallow.lambda.slice(0, k + 1));
  });

  it('notes when the cross-validation minimum sits at the end of the path, and only then', () => {
    const diabetes = fileURLToPath(new URL('../../../datasets/open/diabetes.csv', import.meta.url));
    const args = ['--data', diabetes, '--response', 'progression', '--path-length', '20', '--folds', '5'];
    const shallow = fitJson(...args, '--no-standardize', '--path-decades', '1');
    const last = shallow.lambda.length - 1;
    // Diabetes on the raw scale: the CV error still falls at 1 decade; standardized, its minimum is
    // near 2 decades, well inside a 6-decade path (docs/decisions/0011-path-depth.md).
    expect(shallow.cv?.minimum.index).toBe(last);
    expect(shallow.notes.join('\n')).toContain('cross-validation minimum is at the smallest lambda');
    const deep = fitJson(...args, '--path-decades', '6');
    expect(deep.cv?.minimum.index).toBeLessThan(deep.lambda.length - 1);
    expect(deep.notes.join('\n')).not.toContain('cross-validation minimum');
  });

  it('points to --max-terms, not --path-decades, when the term limit ended the path at the CV minimum', () => {
    const diabetes = fileURLToPath(new URL('../../../datasets/open/diabetes.csv', import.meta.url));
    const out = fitJson('--data', diabetes, '--response', 'progression', '--penalty', 'elastic-net', '--l1-share', '0.5', '--max-terms', '8', '--folds', '5', '--seed', '3');
    const notes = out.notes.join('\n');
    // The error still falls where the limit stops the path (diabetes has 10 predictors, the limit is 8).
    expect(notes).toContain('path ended after');
    expect(out.cv?.minimum.index).toBe(out.lambda.length - 1);
    expect(notes).toContain('where --max-terms ended it');
    expect(notes).not.toContain('--path-decades');
  });

  it('carries the statistical cautions, and names every solve that stopped at the iteration limit', () => {
    const ok = JSON.parse(cli('fit', '--data', 'data.csv', '--response', 'y', '--path-length', '4', '--folds', '0').stdout) as {
      cautions: string[];
      warnings: string[];
    };
    // Common practice: results leave the tool with their cautions (selection is not causation, etc.).
    for (const caution of CAUTIONS) expect(ok.cautions.some((line) => line.includes(caution.text)), caution.id).toBe(true);
    expect(ok.warnings).toEqual([]);
    const limited = JSON.parse(
      cli('fit', '--data', 'data.csv', '--response', 'y', '--path-length', '4', '--folds', '0', '--max-iterations', '1', '--tolerance', '1e-14').stdout,
    ) as { status: string[]; warnings: string[] };
    const stopped = limited.status.filter((s) => s !== 'converged').length;
    expect(stopped).toBeGreaterThan(0);
    expect(limited.warnings).toHaveLength(stopped);
    expect(limited.warnings[0]).toMatch(/iteration-limit, relative gap .* vs tolerance 1e-14/);
  });

  it('prints help on --help and exits 0', () => {
    const r = cli('fit', '--help');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/--folds K/);
  });

  const errors: [string, string[], RegExp][] = [
    ['a missing data file', ['--data', 'none.csv', '--response', 'y'], /cannot read data file none\.csv/],
    ['an unknown predictor, naming the file', ['--data', 'data.csv', '--response', 'y', '--predictors', 'a,zz'], /--predictors: column "zz" is not in data\.csv/],
    ['a ragged CSV, naming file and line', ['--data', 'ragged.csv', '--response', 'y'], /ragged\.csv: line 3 has 1 fields but the header has 2/],
    ['an ascending lambda list', ['--data', 'data.csv', '--response', 'y', '--lambda', '0.1,0.2'], /--lambda values must be strictly descending/],
    ['a groups file naming a non-predictor', ['--data', 'data.csv', '--response', 'y', '--predictors', 'a,b', '--penalty', 'group-lasso', '--groups', 'bad-groups.json'], /group "ab" in bad-groups\.json names "nope"/],
    ['a gaussian text response', ['--data', 'data.csv', '--response', 'flag', '--predictors', 'a'], /gaussian response "flag" must be numeric/],
    ['an elastic net without --l1-share', ['--data', 'data.csv', '--response', 'y', '--penalty', 'elastic-net'], /needs --l1-share/],
    ['a negative penalty weight, naming the file', ['--data', 'data.csv', '--response', 'y', '--penalty-weights', 'bad-weights.json'], /weight of "b" in bad-weights\.json must be a number >= 0/],
    ['too many folds', ['--data', 'data.csv', '--response', 'y', '--predictors', 'a', '--folds', '61'], /folds.*\b60\b.*61/],
  ];
  for (const [what, args, message] of errors) {
    it(`fails on ${what}: stderr message, non-zero exit, empty stdout`, () => {
      const r = cli('fit', ...args);
      expect(r.status).not.toBe(0);
      expect(r.stdout).toBe('');
      expect(r.stderr).toMatch(message);
    });
  }
});
