/**
 * Engine benchmark: Lariat's CLI against scikit-learn's coordinate descent (Debian python3-sklearn,
 * one thread), both as whole processes reading the same CSV, with the same lambda grid (passed
 * explicitly to both), the same folds (a fold-id column) and matched tolerances.
 *
 * Matching tolerances: Lariat stops when the duality gap of the 1/(2n)-scaled objective, divided by
 * the null-model objective ||y - mean y||^2 / (2n), is <= T. scikit-learn's coordinate descent works
 * on the n-times larger objective 0.5||y - Xb||^2 + n a ||b||_1 and stops when its gap is below
 * tol * ||y||^2 (y centred here; scikit-learn 1.2 _cd_fast.pyx: `tol = tol * y_norm2` with
 * y_norm2 = y'y, in both the plain and the Gram kernel). Dividing both sides by n:
 * gap_Lariat < tol * 2 * nullObjective, so scikit-learn's tol = T / 2 asks for the same relative gap.
 * scikit-learn also checks the gap only once coefficient updates are small, so it may stop at a
 * smaller gap than asked.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { sharedGrid, writeBreastCancer, writeGaussian, type BenchData, BREAST_CANCER } from './engine/data';
import { measureProcess, singleThreadEnv, type Measured } from './lib/measure';

const root = fileURLToPath(new URL('..', import.meta.url));
const out = join(root, 'bench', 'out');
const PYTHON = '/usr/bin/python3';

interface Case {
  name: string;
  family: 'gaussian' | 'binomial';
  make: () => BenchData;
  ratio: number;
  tolerance: number;
  /** Target time ratio Lariat / scikit-learn, or an absolute target in seconds for Lariat. */
  target: { ratio: number } | { seconds: number };
}

const CASES: Case[] = [
  {
    name: 'gaussian n=20000 p=200, 10-fold CV, 100 lambdas to 1e-4 lambda_max, tol 1e-6',
    family: 'gaussian',
    make: () => writeGaussian(join(out, 'gaussian-20000x200.csv'), 20000, 200, 20, 10, 11),
    ratio: 1e-4,
    tolerance: 1e-6,
    target: { ratio: 1.0 },
  },
  {
    name: 'gaussian n=300 p=1500, 10-fold CV, 100 lambdas to 0.01 lambda_max, tol 1e-4',
    family: 'gaussian',
    make: () => writeGaussian(join(out, 'gaussian-300x1500.csv'), 300, 1500, 15, 10, 12),
    ratio: 0.01,
    tolerance: 1e-4,
    target: { ratio: 0.5 },
  },
  {
    name: 'binomial breast cancer n=569 p=30, 10-fold stratified CV, 100 lambdas to 1e-4 lambda_max, tol 1e-6',
    family: 'binomial',
    make: () => writeBreastCancer(join(out, 'breast-cancer.csv'), 10, 13),
    ratio: 1e-4,
    tolerance: 1e-6,
    target: { seconds: 1 },
  },
];

function sklearnAvailable(): boolean {
  return existsSync(PYTHON) && spawnSync(PYTHON, ['-c', 'import sklearn'], { stdio: 'ignore' }).status === 0;
}

/** What `npm run -s cli` runs (without npm's own start-up): the bundled CLI, built here before timing. */
const CLI_SCRIPT = join(root, 'scripts', 'cli.sh');

function buildCli(): void {
  const r = spawnSync('bash', [CLI_SCRIPT, '--help'], { stdio: ['ignore', 'ignore', 'pipe'], encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`building the CLI bundle failed: ${r.stderr}`);
}

function lariat(data: BenchData, c: Case, grid: number[], workers: 'auto' | 'off'): Promise<Measured> {
  return measureProcess('bash', [
    CLI_SCRIPT, 'fit',
    '--data', data.path, '--response', 'y', '--fold-column', 'fold', '--family', c.family,
    '--lambda', grid.map((v) => v.toPrecision(17)).join(','), '--tolerance', String(c.tolerance),
    '--workers', workers,
  ], singleThreadEnv());
}

function parseOrThrow(who: string, m: Measured): { mean: number[]; minimumIndex: number } {
  if (m.exitCode !== 0) throw new Error(`${who} exited with ${m.exitCode}: ${m.stderr.slice(-2000)}`);
  const parsed = JSON.parse(m.stdout) as { cv?: { mean: number[]; minimum: { index: number } }; mean?: number[]; minimumIndex?: number };
  if (parsed.cv) return { mean: parsed.cv.mean, minimumIndex: parsed.cv.minimum.index };
  return { mean: parsed.mean as number[], minimumIndex: parsed.minimumIndex as number };
}

function maxRelativeDifference(a: number[], b: number[]): number {
  return Math.max(...a.map((v, i) => Math.abs(v - b[i]) / Math.max(1e-12, Math.abs(b[i]))));
}

const fmt = (s: number) => `${s.toFixed(2)} s`;
const mib = (m: number) => (Number.isNaN(m) ? 'n/a' : `${m.toFixed(0)} MiB`);

async function runCase(c: Case, haveSklearn: boolean): Promise<void> {
  console.log(`\n-- ${c.name}`);
  const data = c.make();
  const grid = sharedGrid(data, 100, c.ratio);
  const gridFile = `${data.path}.grid.json`;
  writeFileSync(gridFile, JSON.stringify(grid));
  const runs: [string, Measured][] = [];
  for (const workers of ['off', 'auto'] as const) {
    const m = await lariat(data, c, grid, workers);
    runs.push([`Lariat (workers ${workers})`, m]);
  }
  const [lariatCv] = runs.map(([who, m]) => parseOrThrow(who, m));
  for (const [who, m] of runs) {
    const t = (JSON.parse(m.stdout) as { timing: { readSeconds: number; fitSeconds: number; cvSeconds: number; cvWorkers: number } }).timing;
    const split = `read ${fmt(t.readSeconds)}, full path ${fmt(t.fitSeconds)}, CV ${fmt(t.cvSeconds)} (${t.cvWorkers} workers)`;
    console.log(`${who.padEnd(26)} ${fmt(m.wallSeconds)}  peak ${mib(m.peakMiB)}  [${split}]`);
  }
  const best = Math.min(...runs.map(([, m]) => m.wallSeconds));
  if ('seconds' in c.target) {
    console.log(`target: Lariat < ${c.target.seconds} s -> ${best < c.target.seconds ? 'met' : 'MISSED'} (${fmt(best)})`);
  }
  // Binomial is timed alone: scikit-learn's logistic solvers (saga) stop on a different rule and took
  // ~100 s for this path, so they are no useful yardstick here.
  if (!haveSklearn || c.family !== 'gaussian') return;
  const sklearnTol = c.tolerance / 2;
  const sk = await measureProcess(PYTHON, [join(root, 'bench', 'engine', 'sklearn_cv.py'), data.path, 'y', 'fold', gridFile, String(sklearnTol)], singleThreadEnv());
  const skCv = parseOrThrow('scikit-learn', sk);
  console.log(`${`scikit-learn (tol ${sklearnTol})`.padEnd(26)} ${fmt(sk.wallSeconds)}  peak ${mib(sk.peakMiB)}`);
  for (const [who, m] of runs) console.log(`ratio ${who} / scikit-learn: ${(m.wallSeconds / sk.wallSeconds).toFixed(2)}`);
  if ('ratio' in c.target) {
    const ratio = best / sk.wallSeconds;
    console.log(`target: ratio <= ${c.target.ratio} -> ${ratio <= c.target.ratio ? 'met' : 'MISSED'} (${ratio.toFixed(2)})`);
  }
  console.log(
    `agreement: CV curve max relative difference ${maxRelativeDifference(lariatCv.mean, skCv.mean).toExponential(2)}, ` +
      `minimum index Lariat ${lariatCv.minimumIndex} vs scikit-learn ${skCv.minimumIndex}`,
  );
}

export async function run(): Promise<void> {
  const haveSklearn = sklearnAvailable();
  buildCli();
  console.log('Engine: Lariat CLI (the bundle `npm run -s cli` runs) vs scikit-learn coordinate descent, whole processes, one thread each');
  console.log('(Lariat "workers auto" may share the folds between its main thread and one worker thread; "workers off" is single-threaded.)');
  console.log('Tolerance: scikit-learn tol = Lariat tol / 2 gives the same relative duality gap (see bench/engine.bench.ts).');
  if (!haveSklearn) {
    console.log('scikit-learn not found: install it with `apt-get install python3-sklearn` (Debian); timing Lariat only.');
  }
  for (const c of CASES) {
    if (c.family === 'binomial' && !existsSync(BREAST_CANCER)) {
      console.log(`\n-- ${c.name}: skipped, ${BREAST_CANCER} missing (apt-get install python3-sklearn)`);
      continue;
    }
    await runCase(c, haveSklearn);
  }
}
