/**
 * Profile of single path fits on the two gaussian benchmark shapes (no CSV, no CLI, no CV): the time
 * per fitPathOnDesign and the FISTA iterations it took, to see where the engine spends its time.
 * Data as bench/engine/data.ts makes it (equicorrelated normal columns, a few active coefficients).
 * 'tall-folds': the ten training-fold fits of 10-fold CV on the tall shape, each Gram built from its
 * rows, then from S(all) - S(held out) (PathOptions.crossProducts).
 * Run: npx tsx bench/engine-profile.ts [wide|wide-enet|wide-enet-fista|tall|tall-folds|all] [repeats]
 */
import { crossProducts, fitPathOnDesign, selectRows, subtractCrossProducts } from '../server/engine';
import type { DesignMatrix, PathOptions } from '../server/engine/types';
import { createRng } from '../server/engine/random';
import { gaussianBenchData } from './engine/data';

function gaussianData(n: number, p: number, active: number, seed: number): { design: DesignMatrix; y: Float64Array } {
  const { x, y } = gaussianBenchData(n, p, active, createRng(seed));
  return { design: { n, p, x, terms: Array.from({ length: p }, (_, j) => `x${j + 1}`) }, y };
}

interface Case {
  name: string;
  n: number;
  p: number;
  active: number;
  options: PathOptions;
}

const cases: Record<string, Case> = {
  wide: {
    name: 'gaussian n=300 p=1500, 100 lambdas to 0.01, tol 1e-4',
    n: 300,
    p: 1500,
    active: 15,
    options: { family: 'gaussian', penalty: 'lasso', standardize: true, pathLength: 100, pathDecades: 2, tolerance: 1e-4 },
  },
  'wide-enet': {
    name: 'gaussian n=300 p=1500 elastic net 0.5, 100 lambdas to 0.01, tol 1e-4',
    n: 300,
    p: 1500,
    active: 15,
    options: { family: 'gaussian', penalty: 'elastic-net', l1Share: 0.5, standardize: true, pathLength: 100, pathDecades: 2, tolerance: 1e-4 },
  },
  'wide-enet-fista': {
    name: 'the same elastic net with FISTA alone (polish off), for comparison',
    n: 300,
    p: 1500,
    active: 15,
    options: { family: 'gaussian', penalty: 'elastic-net', l1Share: 0.5, standardize: true, pathLength: 100, pathDecades: 2, tolerance: 1e-4, polish: false },
  },
  tall: {
    name: 'gaussian n=20000 p=200, 100 lambdas to 1e-4, tol 1e-6',
    n: 20000,
    p: 200,
    active: 20,
    options: { family: 'gaussian', penalty: 'lasso', standardize: true, pathLength: 100, pathDecades: 4, tolerance: 1e-6 },
  },
};

const which = process.argv[2] ?? 'all';
const repeats = Number(process.argv[3] ?? 3);
for (const [key, c] of Object.entries(cases)) {
  if (which !== 'all' && which !== key) continue;
  const { design, y } = gaussianData(c.n, c.p, c.active, 12);
  const times: number[] = [];
  let iterations = 0;
  let statuses = '';
  for (let r = 0; r < repeats; r++) {
    const started = performance.now();
    const result = fitPathOnDesign(design, y, c.options);
    times.push(performance.now() - started);
    iterations = result.solves.reduce((s, v) => s + v.iterations, 0);
    const bad = result.solves.filter((s) => s.status !== 'converged').length;
    statuses = bad === 0 ? 'all converged' : `${bad} not converged`;
  }
  times.sort((a, b) => a - b);
  console.log(`${c.name}: best ${times[0].toFixed(0)} ms, median ${times[Math.floor(times.length / 2)].toFixed(0)} ms, ${iterations} iterations, ${statuses}`);
}

if (which === 'all' || which === 'tall-folds') {
  const c = cases.tall;
  const { design, y } = gaussianData(c.n, c.p, c.active, 12);
  const folds = Array.from({ length: 10 }, (_, f) => Array.from({ length: c.n / 10 }, (_, i) => i * 10 + f));
  const time = (useSums: boolean): number => {
    const started = performance.now();
    const all = useSums ? crossProducts(design) : null;
    for (const heldOut of folds) {
      const out = new Set(heldOut);
      const train = Array.from({ length: c.n }, (_, i) => i).filter((i) => !out.has(i));
      const rows = selectRows(design, y, train);
      const options = all ? { ...c.options, crossProducts: subtractCrossProducts(all, crossProducts(design, heldOut, all.center)) } : c.options;
      fitPathOnDesign(rows.design, rows.y, options);
    }
    return performance.now() - started;
  };
  for (let r = 0; r < repeats; r++) {
    console.log(`tall, 10 training folds: Gram per fold ${time(false).toFixed(0)} ms, from S(all) - S(held out) ${time(true).toFixed(0)} ms`);
  }
}
