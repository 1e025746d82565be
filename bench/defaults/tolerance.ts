/**
 * Which relative duality gap makes the coefficients stable to the digits the screens show?
 * (docs/decisions/0007-default-tolerance.md). The results screens show 4 significant digits
 * (src/features/datasets/components/format.ts, formatNumber). For each case: a reference path at
 * tolerance 1e-12, then the same path at each candidate tolerance; per candidate:
 *  - flips: (lambda, term) cells whose 4-significant-digit display differs from the reference's
 *    (a zero shown where the reference has a value, or the reverse, counts), over all cells that are
 *    nonzero in either;
 *  - material flips: the same, only for coefficients at least 1e-3 of the largest at that lambda;
 *  - worst relative error |b - b*| / |b*| over the material coefficients;
 *  - deviance-explained flips (4 significant digits);
 *  - cost: total solve time and iterations, relative to tolerance 1e-7 (the old default); the
 *    iterations are the reliable measure on a shared machine.
 * Variants: `lasso` (the default solver: FISTA finished by the exact solve on the support), `fista`
 * (the same lasso without that finishing solve, so the gap alone decides the accuracy), `enet`
 * (elastic net, l1Share 0.5) and `group` (group lasso: categorical predictors' indicators together,
 * else consecutive triples of columns; no finishing solve exists for it).
 * `cost` as the 7th argument skips the reference (for wide data, where a 1e-12 reference without the
 * finishing solve takes too long): only iterations, time and non-converged solves are reported.
 * Run: npx tsx bench/defaults/tolerance.ts [quick|all] [decades] [first case] [last case] [variants,...]
 * (writes bench/out/tolerance-DECADES-FIRST-LAST.json)
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { fitPathPrepared, prepareFit } from '../../server/engine/index';
import type { EngineTable, FitSpec, PathResult } from '../../server/engine/types';
import { measureCases } from './cases';

const CANDIDATES = [1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9];
const DECADES = Number(process.argv[3] ?? 4);

const show = (v: number): string => (v === 0 ? '0' : String(Number(v.toPrecision(4))));

type Variant = 'lasso' | 'fista' | 'enet' | 'group';
const VARIANTS = (process.argv[6] ?? 'lasso').split(',') as Variant[];

function variantSpec(spec: FitSpec, variant: Variant): FitSpec {
  if (variant === 'enet') return { ...spec, penalty: 'elastic-net', l1Share: 0.5 };
  if (variant !== 'group') return spec;
  const groups: Record<string, string[]> = {};
  const numeric = spec.predictors.filter((name) => !name.includes('=')) ;
  numeric.forEach((name, k) => {
    const key = `g${Math.floor(k / 3)}`;
    (groups[key] ??= []).push(name);
  });
  return { ...spec, penalty: 'group-lasso', groups };
}

function run(table: EngineTable, spec: FitSpec, variant: Variant): { path: PathResult; ms: number; iterations: number } {
  const t0 = performance.now();
  const prepared = prepareFit(table, variantSpec(spec, variant));
  if (variant === 'fista') prepared.options.polish = false;
  const path = fitPathPrepared(prepared);
  const ms = performance.now() - t0;
  return { path, ms, iterations: path.solves.reduce((s, x) => s + x.iterations, 0) };
}

interface Result {
  tolerance: number;
  cells: number;
  flips: number;
  materialCells: number;
  materialFlips: number;
  worstMaterialRelative: number;
  devianceFlips: number;
  timeVsOld: number;
  iterationsVsOld: number;
  notConverged: number;
}

const all: { name: string; results: Result[] }[] = [];
const first = Number(process.argv[4] ?? 0);
const lastCase = Number(process.argv[5] ?? 99);
for (const c of measureCases(process.argv[2] === 'quick').slice(first, lastCase + 1)) for (const variant of VARIANTS) {
  const base: FitSpec = { ...c.spec, cv: null, pathLength: 100, pathDecades: DECADES, tolerance: 1e-12, maxIterations: 100_000 };
  const costOnly = process.argv[7] === 'cost';
  const runs0 = CANDIDATES.map((tolerance) => ({ tolerance, ...run(c.table, { ...base, tolerance, maxIterations: 10_000 }, variant) }));
  const ref = costOnly ? runs0[runs0.length - 1].path : run(c.table, base, variant).path;
  const runs = runs0;
  const old = runs[CANDIDATES.indexOf(1e-7)];
  const results: Result[] = runs.map(({ tolerance, path, ms, iterations }) => {
    let cells = 0;
    let flips = 0;
    let materialCells = 0;
    let materialFlips = 0;
    let worst = 0;
    let devianceFlips = 0;
    for (let k = 0; k < ref.lambda.length; k++) {
      const b = path.coefficients[k];
      const r = ref.coefficients[k];
      const largest = r.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
      for (let j = 0; j < r.length; j++) {
        if (r[j] === 0 && b[j] === 0) continue;
        cells++;
        const flipped = show(b[j]) !== show(r[j]);
        if (flipped) flips++;
        if (Math.abs(r[j]) >= 1e-3 * largest) {
          materialCells++;
          if (flipped) materialFlips++;
          worst = Math.max(worst, Math.abs(b[j] - r[j]) / Math.abs(r[j]));
        }
      }
      if (show(path.devianceExplained[k]) !== show(ref.devianceExplained[k])) devianceFlips++;
    }
    return {
      tolerance,
      cells,
      flips,
      materialCells,
      materialFlips,
      worstMaterialRelative: worst,
      devianceFlips,
      timeVsOld: ms / old.ms,
      iterationsVsOld: iterations / old.iterations,
      notConverged: path.solves.filter((s) => s.status !== 'converged').length,
    };
  });
  all.push({ name: `${c.name}, ${variant}`, results });
  console.log(`${c.name}, ${variant} (${DECADES} decades, 100 lambdas; reference gap 1e-12; old-default time ${old.ms.toFixed(0)} ms)`);
  for (const r of results) {
    console.log(
      `   tol ${r.tolerance.toExponential(0)}: flips ${r.flips}/${r.cells}, material ${r.materialFlips}/${r.materialCells}, worst rel ${r.worstMaterialRelative.toExponential(1)}, deviance flips ${r.devianceFlips}, time x${r.timeVsOld.toFixed(2)}, iterations x${r.iterationsVsOld.toFixed(2)}, not converged ${r.notConverged}`,
    );
  }
}
const out = new URL('../out/', import.meta.url).pathname;
mkdirSync(out, { recursive: true });
writeFileSync(`${out}tolerance-${DECADES}-${first}-${lastCase}-${VARIANTS.join('+')}.json`, JSON.stringify(all, null, 1));
