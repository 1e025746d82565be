/**
 * The data behind the default path depth and tolerance (docs/decisions/0011, 0012): the bundled open
 * and demo data, the engine benchmark's generator (bench/engine/data.ts), and a mixed-scale,
 * correlated, unstandardized generator that looks more like measurements than the benchmark's
 * unit-variance columns. Each case is a table and a spec without path options; the scripts add
 * pathDecades / tolerance.
 */
import { readCsvFile } from '../../server/tabular/csv';
import { createRng, type Rng } from '../../server/engine/random';
import type { EngineColumn, EngineTable, Family, FitSpec } from '../../server/engine/types';
import { gaussianBenchData } from '../engine/data';

export interface MeasureCase {
  name: string;
  table: EngineTable;
  spec: Omit<FitSpec, 'pathLength' | 'tolerance' | 'maxIterations'>;
}

function numericTable(n: number, p: number, x: Float64Array, y: Float64Array): EngineTable {
  const columns: EngineColumn[] = [{ name: 'y', kind: 'numeric', values: y }];
  for (let j = 0; j < p; j++) columns.push({ name: `x${j + 1}`, kind: 'numeric', values: x.slice(j * n, (j + 1) * n) });
  return { nRows: n, columns };
}

function spec(family: Family, table: EngineTable, response: string, exclude: string[] = [], standardize = true): MeasureCase['spec'] {
  return {
    family,
    response,
    predictors: table.columns.map((c) => c.name).filter((name) => name !== response && !exclude.includes(name)),
    penalty: 'lasso',
    standardize,
    screening: 'strong',
    missing: 'drop',
    cv: { folds: 10, seed: 1 },
  };
}

/** The benchmark generator's gaussian data; binomial: y = 1 when the gaussian outcome is above its median. */
function benchCase(family: Family, n: number, p: number, active: number, seed: number): MeasureCase {
  const { x, y } = gaussianBenchData(n, p, active, createRng(seed));
  let out = y;
  if (family === 'binomial') {
    const median = Float64Array.from(y).sort()[Math.floor(n / 2)];
    out = Float64Array.from(y, (v) => (v > median ? 1 : 0));
  }
  const table = numericTable(n, p, x, out);
  return { name: `bench ${family} n=${n} p=${p} (${active} active, seed ${seed})`, table, spec: spec(family, table, 'y') };
}

/**
 * Mixed-scale, correlated, unstandardized measurements: columns in blocks of 6 with AR(1)
 * correlation 0.8 inside a block, each column then given its own scale 10^U(-3, 4) and offset
 * (mean up to 100 times its sd), as raw instrument readings are. `active` columns spread over the
 * blocks carry effects of equal standardized size with alternating sign; noise for a
 * signal-to-noise variance ratio of about 2. Rounded to 6 significant digits as a CSV would hold.
 */
export function mixedScaleData(n: number, p: number, active: number, rng: Rng): { x: Float64Array; y: Float64Array } {
  const x = new Float64Array(n * p);
  const z = new Float64Array(n);
  for (let j = 0; j < p; j++) {
    const fresh = j % 6 === 0;
    for (let i = 0; i < n; i++) z[i] = fresh ? rng.normal() : 0.8 * z[i] + 0.6 * rng.normal();
    const scale = 10 ** (-3 + 7 * rng.next());
    const offset = scale * 100 * (rng.next() - 0.3);
    for (let i = 0; i < n; i++) x[j * n + i] = Number((offset + scale * z[i]).toPrecision(6));
  }
  const y = new Float64Array(n);
  const step = Math.max(1, Math.floor(p / active));
  for (let a = 0; a < active; a++) {
    const j = (a * step + (a % 3)) % p;
    const col = x.subarray(j * n, (j + 1) * n);
    const mean = col.reduce((s, v) => s + v, 0) / n;
    const sd = Math.sqrt(col.reduce((s, v) => s + (v - mean) ** 2, 0) / n);
    const effect = (a % 2 === 0 ? 1 : -1) / sd;
    for (let i = 0; i < n; i++) y[i] += effect * (col[i] - mean);
  }
  const signalVar = y.reduce((s, v) => s + v * v, 0) / n;
  const sigma = Math.sqrt(signalVar / 2);
  for (let i = 0; i < n; i++) y[i] = Number((250 + 40 * (y[i] + sigma * rng.normal())).toPrecision(6));
  return { x, y };
}

function mixedCase(family: Family, n: number, p: number, active: number, seed: number, standardize: boolean): MeasureCase {
  const { x, y } = mixedScaleData(n, p, active, createRng(seed));
  let out = y;
  if (family === 'binomial') {
    const median = Float64Array.from(y).sort()[Math.floor(n / 2)];
    out = Float64Array.from(y, (v) => (v > median ? 1 : 0));
  }
  const table = numericTable(n, p, x, out);
  const how = standardize ? 'standardized' : 'raw scale';
  return { name: `mixed-scale ${family} n=${n} p=${p} (${active} active, seed ${seed}), ${how}`, table, spec: spec(family, table, 'y', [], standardize) };
}

const root = new URL('../../', import.meta.url).pathname;

function fileCase(name: string, file: string, family: Family, response: string, exclude: string[] = [], standardize = true): MeasureCase {
  const table = readCsvFile(`${root}${file}`);
  return { name, table, spec: spec(family, table, response, exclude, standardize) };
}

/** Every case; `quick` drops the slowest (for a first look). */
export function measureCases(quick = false): MeasureCase[] {
  const demoExclude = ['vat_id', 'notes'];
  const cases: MeasureCase[] = [
    fileCase('open diabetes, gaussian', 'datasets/open/diabetes.csv', 'gaussian', 'progression'),
    fileCase('open diabetes, gaussian, raw scale', 'datasets/open/diabetes.csv', 'gaussian', 'progression', [], false),
    fileCase('open breast cancer, binomial', 'datasets/open/breast_cancer.csv', 'binomial', 'diagnosis'),
    fileCase('demo creamery yield, gaussian', 'datasets/demo/harbour-creamery-vats.csv', 'gaussian', 'yield_kg_per_100l', [...demoExclude, 'top_grade']),
    fileCase('demo creamery top grade, binomial', 'datasets/demo/harbour-creamery-vats.csv', 'binomial', 'top_grade', [...demoExclude, 'yield_kg_per_100l']),
    benchCase('gaussian', 2000, 200, 20, 11),
    benchCase('gaussian', 300, 1500, 15, 12),
    benchCase('binomial', 1000, 100, 10, 13),
    benchCase('binomial', 200, 600, 10, 14),
    mixedCase('gaussian', 1000, 60, 8, 21, true),
    mixedCase('gaussian', 1000, 60, 8, 21, false),
    mixedCase('gaussian', 150, 400, 8, 22, true),
    mixedCase('binomial', 800, 60, 8, 23, true),
  ];
  if (!quick) {
    cases.push(benchCase('gaussian', 100, 1000, 5, 15), benchCase('gaussian', 5000, 50, 40, 16), mixedCase('gaussian', 400, 120, 30, 24, true));
  }
  return cases;
}
