/**
 * Benchmark data written as CSV into bench/out/ (gitignored), with the fold id of each row as a
 * column so Lariat (--fold-column) and scikit-learn use the same folds.
 */
import { closeSync, mkdirSync, openSync, readFileSync, writeSync } from 'node:fs';
import { dirname } from 'node:path';
import { assignFolds } from '../../server/engine/cv/folds';
import { createRng, type Rng } from '../../server/engine/random';

export interface BenchData {
  path: string;
  n: number;
  p: number;
  /** Column-major predictors and the response, to compute the shared lambda grid. */
  x: Float64Array;
  y: Float64Array;
}

function writeCsv(path: string, names: string[], n: number, cell: (i: number, j: number) => string): void {
  mkdirSync(dirname(path), { recursive: true });
  const fd = openSync(path, 'w');
  try {
    writeSync(fd, `${names.join(',')}\n`);
    // In chunks of rows: one string for a 600 x 5000 table would be needlessly large.
    for (let from = 0; from < n; from += 1000) {
      const lines: string[] = [];
      for (let i = from; i < Math.min(n, from + 1000); i++) lines.push(names.map((_, j) => cell(i, j)).join(','));
      writeSync(fd, `${lines.join('\n')}\n`);
    }
  } finally {
    closeSync(fd);
  }
}

/**
 * Equicorrelated normal predictors (x_ij = z_ij + 0.5 w_i, pairwise correlation 0.2), `active`
 * non-zero coefficients of alternating sign and decreasing size, noise sd chosen for a signal-to-noise
 * variance ratio of about 3. Values are rounded to 7 significant digits, as the CSV holds them.
 */
export function gaussianBenchData(n: number, p: number, active: number, rng: Rng): { x: Float64Array; y: Float64Array } {
  const x = new Float64Array(n * p);
  const y = new Float64Array(n);
  const beta = Array.from({ length: p }, (_, j) => (j < active ? (j % 2 === 0 ? 1 : -1) * (1 - j / (2 * active)) : 0));
  const shared = Float64Array.from({ length: n }, () => rng.normal());
  for (let j = 0; j < p; j++) for (let i = 0; i < n; i++) x[j * n + i] = Number((rng.normal() + 0.5 * shared[i]).toPrecision(7));
  let signalVar = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let j = 0; j < active; j++) s += beta[j] * x[j * n + i];
    y[i] = s;
    signalVar += s * s;
  }
  const sigma = Math.sqrt(signalVar / n / 3);
  for (let i = 0; i < n; i++) y[i] = Number((y[i] + sigma * rng.normal()).toPrecision(7));
  return { x, y };
}

/**
 * Data as it comes in practice (issue 9's measurement): columns on very different scales (standard
 * deviations 10^-2 to 10^3) and offsets (means up to +-1000), neighbouring columns correlated about
 * 0.5 (an AR(1) chain along the columns, rho = 0.5), `active` true effects at spread-out positions,
 * signal-to-noise variance ratio about 3. Values are written with 7 significant digits (plain
 * decimals); x and y here hold exactly what the CSV holds.
 */
export function realisticBenchData(n: number, p: number, active: number, rng: Rng): { x: Float64Array; y: Float64Array } {
  const rho = 0.5;
  const x = new Float64Array(n * p);
  const y = new Float64Array(n);
  const scale = Float64Array.from({ length: p }, () => 10 ** (-2 + 5 * rng.next()));
  const offset = Float64Array.from({ length: p }, () => (rng.next() < 0.5 ? 0 : 2000 * (rng.next() - 0.5)));
  const z = new Float64Array(n);
  for (let j = 0; j < p; j++) {
    for (let i = 0; i < n; i++) {
      z[i] = j === 0 ? rng.normal() : rho * z[i] + Math.sqrt(1 - rho * rho) * rng.normal();
      x[j * n + i] = Number((offset[j] + scale[j] * z[i]).toPrecision(7));
    }
  }
  // Effects on the standardized scale of +-1 down to +-0.5, spread over the columns.
  const effects: [number, number][] = Array.from({ length: active }, (_, k) => [
    Math.floor(((k + 0.5) * p) / active),
    (k % 2 === 0 ? 1 : -1) * (1 - k / (2 * active)),
  ]);
  let signalVar = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (const [j, b] of effects) s += (b * (x[j * n + i] - offset[j])) / scale[j];
    y[i] = s;
    signalVar += s * s;
  }
  const sigma = Math.sqrt(signalVar / n / 3);
  for (let i = 0; i < n; i++) y[i] = Number((50 + y[i] + sigma * rng.normal()).toPrecision(7));
  return { x, y };
}

/** The realistic benchmark data (realisticBenchData) with seeded fold ids, written as CSV. */
export function writeRealistic(path: string, n: number, p: number, active: number, folds: number, seed: number): BenchData {
  const rng = createRng(seed);
  const { x, y } = realisticBenchData(n, p, active, rng);
  const foldIds = assignFolds(n, folds, () => rng.next());
  const names = ['y', ...Array.from({ length: p }, (_, j) => `x${j + 1}`), 'fold'];
  writeCsv(path, names, n, (i, j) => (j === 0 ? String(y[i]) : j <= p ? String(x[(j - 1) * n + i]) : String(foldIds[i])));
  return { path, n, p, x, y };
}

/** scikit-learn's copy of the Wisconsin Diagnostic Breast Cancer data (UCI), Debian python3-sklearn. */
export const BREAST_CANCER = '/usr/lib/python3/dist-packages/sklearn/datasets/data/breast_cancer.csv';

/** 569 x 30, target 0 = malignant, 1 = benign; class-stratified folds. */
export function writeBreastCancer(path: string, folds: number, seed: number): BenchData {
  const rows = readFileSync(BREAST_CANCER, 'utf8').trim().split('\n').slice(1).map((l) => l.split(',').map(Number));
  const n = rows.length;
  const p = rows[0].length - 1;
  const x = new Float64Array(n * p);
  const y = Float64Array.from(rows, (r) => r[p]);
  rows.forEach((r, i) => r.slice(0, p).forEach((v, j) => (x[j * n + i] = v)));
  const rng = createRng(seed);
  const foldIds = assignFolds(n, folds, () => rng.next(), y);
  const names = ['y', ...Array.from({ length: p }, (_, j) => `x${j + 1}`), 'fold'];
  writeCsv(path, names, n, (i, j) => (j === 0 ? String(y[i]) : j <= p ? String(x[(j - 1) * n + i]) : String(foldIds[i])));
  return { path, n, p, x, y };
}

/**
 * The shared grid: lambda_max = max_j |x_j'(y - mean y)| / (n sd_j) on standardized columns (sd_j = 1
 * unstandardized: centred columns on their own scale) (the gradient at the null model; the same
 * formula for gaussian and binomial, since the null model's fitted mean is mean y in both), then
 * `length` values log-spaced down to ratio * lambda_max.
 */
export function sharedGrid(data: BenchData, length: number, ratio: number, standardize = true): number[] {
  const { n, p, x, y } = data;
  const yMean = y.reduce((a, b) => a + b, 0) / n;
  let lambdaMax = 0;
  for (let j = 0; j < p; j++) {
    const col = x.subarray(j * n, (j + 1) * n);
    const mean = col.reduce((a, b) => a + b, 0) / n;
    let ss = 0;
    let cross = 0;
    for (let i = 0; i < n; i++) {
      ss += (col[i] - mean) ** 2;
      cross += (col[i] - mean) * (y[i] - yMean);
    }
    const sd = standardize ? Math.sqrt(ss / n) : 1;
    if (sd > 0) lambdaMax = Math.max(lambdaMax, Math.abs(cross) / (n * sd));
  }
  return Array.from({ length }, (_, k) => lambdaMax * ratio ** (k / (length - 1)));
}
