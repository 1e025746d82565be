/**
 * How deep must the automatic path go? (docs/decisions/0006-path-depth.md). For each case: fit a
 * deep path (DEEP decades, PER_DECADE lambdas per decade) with 10-fold CV, then report where the
 * CV minimum and the one-standard-error choice fall (in decades below lambda_max), and what a path
 * cut at D decades would lose: the CV error's excess over the deep path's minimum (in standard
 * errors), the share of the deep path's deviance explained, and the share of the fit time spent.
 * Wide data (more columns than rows) is fitted WIDE_DEEP decades deep only: below that its
 * models interpolate the training rows and each lambda costs the full iteration limit (a 6-decade
 * path with CV on 300 x 1500 did not finish in 10 minutes).
 * Solves stop at a relative gap of 1e-6 with at most 3000 iterations: CV errors compared in
 * standard errors do not need more, and the deepest, nearly interpolating lambdas of wide data
 * would otherwise dominate the run time.
 * Run: npx tsx bench/defaults/path-depth.ts [quick|all] [first case] [last case]
 * (writes bench/out/path-depth-FIRST-LAST.json)
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { crossValidate } from '../../server/engine/cv';
import { fitPathPrepared, prepareFit } from '../../server/engine/index';
import type { FitSpec } from '../../server/engine/types';
import { measureCases } from './cases';

const DEEP = 6;
const WIDE_DEEP = 4;
const PER_DECADE = 25;
const CUTS = [1.5, 2, 2.5, 3, 3.5, 4, 5];

interface Row {
  name: string;
  n: number;
  p: number;
  lambdaMax: number;
  minimumDecades: number;
  oneSeDecades: number;
  minimumAtDeepEnd: boolean;
  deep: number;
  cuts: { decades: number; excessSe: number; devianceShare: number; nonzero: number; timeShare: number }[];
  fitSeconds: number;
  cvSeconds: number;
  notConverged: number;
}

const rows: Row[] = [];
const first = Number(process.argv[3] ?? 0);
const lastCase = Number(process.argv[4] ?? 99);
for (const c of measureCases(process.argv[2] === 'quick').slice(first, lastCase + 1)) {
  const wide = c.table.nRows < c.spec.predictors.length;
  const deep = wide ? WIDE_DEEP : DEEP;
  const spec: FitSpec = { ...c.spec, pathLength: deep * PER_DECADE + 1, pathDecades: deep, tolerance: 1e-6, maxIterations: 3000 };
  const t0 = performance.now();
  const prepared = prepareFit(c.table, spec);
  const path = fitPathPrepared(prepared);
  const t1 = performance.now();
  const cv = crossValidate(c.table, spec, path, prepared);
  const t2 = performance.now();
  const depth = path.lambda.map((l) => Math.log10(path.lambdaMax / l));
  const min = cv.minimum.index;
  const se = cv.standardError[min];
  const totalTime = path.solves.reduce((s, x) => s + x.timeMs, 0);
  const lastDev = path.devianceExplained[path.devianceExplained.length - 1];
  const cuts = CUTS.filter((d) => d <= deep).map((d) => {
    const last = depth.findLastIndex((v) => v <= d + 1e-9);
    const best = Math.min(...cv.mean.slice(0, last + 1));
    return {
      decades: d,
      excessSe: (best - cv.mean[min]) / se,
      devianceShare: path.devianceExplained[last] / lastDev,
      nonzero: path.nonzero[last],
      timeShare: path.solves.slice(0, last + 1).reduce((s, x) => s + x.timeMs, 0) / totalTime,
    };
  });
  const row: Row = {
    name: c.name,
    n: prepared.built.design.n,
    p: prepared.built.design.p,
    lambdaMax: path.lambdaMax,
    minimumDecades: depth[min],
    oneSeDecades: depth[cv.oneStandardError.index],
    minimumAtDeepEnd: min === path.lambda.length - 1,
    deep,
    cuts,
    fitSeconds: (t1 - t0) / 1000,
    cvSeconds: (t2 - t1) / 1000,
    notConverged: path.solves.filter((s) => s.status !== 'converged').length,
  };
  rows.push(row);
  const f = (v: number, d = 2) => v.toFixed(d);
  console.log(
    `${row.name} [n=${row.n} p=${row.p}, ${deep} decades deep]: minimum at ${f(row.minimumDecades)} decades${row.minimumAtDeepEnd ? ' (deep end)' : ''}, one-SE at ${f(row.oneSeDecades)}; fit ${f(row.fitSeconds)} s, CV ${f(row.cvSeconds)} s, not converged ${row.notConverged}`,
  );
  for (const cut of cuts) {
    console.log(`   cut ${cut.decades}: CV excess ${f(cut.excessSe)} SE, deviance share ${f(cut.devianceShare, 4)}, nonzero ${cut.nonzero}, time share ${f(cut.timeShare)}`);
  }
}
const out = new URL('../out/', import.meta.url).pathname;
mkdirSync(out, { recursive: true });
writeFileSync(`${out}path-depth-${first}-${lastCase}.json`, JSON.stringify(rows, null, 1));
