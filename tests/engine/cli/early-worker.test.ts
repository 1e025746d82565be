/**
 * `--workers auto` starts its worker before reading only when the file's shape, estimated from its
 * first megabyte, reaches the thread work threshold, or the scoring threshold on a tall table
 * (server/cli/early-worker.ts): the 300 x 1500 bench shape is measured slower with a worker started
 * and left unused.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseFitOptions } from '../../../server/cli/args';
import { earlyWorkerMayPay } from '../../../server/cli/early-worker';

const dir = mkdtempSync(join(tmpdir(), 'lariat-early-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** rows x cols cells of "0.5" (4 bytes with the comma), a response column y. */
function file(name: string, rows: number, cols: number): string {
  const path = join(dir, name);
  const header = ['y', ...Array.from({ length: cols }, (_, j) => `x${j}`)].join(',');
  const row = Array.from({ length: cols + 1 }, () => '0.5').join(',');
  writeFileSync(path, `${header}\n${Array.from({ length: rows }, () => row).join('\n')}\n`);
  return path;
}

const lambdas = (k: number) => Array.from({ length: k }, (_, i) => String(k - i)).join(',');

describe('earlyWorkerMayPay', () => {
  const wide = file('wide.csv', 100, 1000);
  it('compares folds x lambdas x p x min(n, p) with the threshold (1e9)', () => {
    // 10 folds x 100 lambdas x 1001 columns x ~100 rows = ~1e8: no worker.
    expect(earlyWorkerMayPay(parseFitOptions(['--data', wide, '--response', 'y']))).toBe(false);
    // 1000 lambdas: ~1e9, a worker may pay.
    expect(earlyWorkerMayPay(parseFitOptions(['--data', wide, '--response', 'y', '--lambda', lambdas(1000)]))).toBe(true);
  });

  it('also for a tall table whose scoring work (rows x columns x lambdas) reaches 1e8, below the fold threshold', () => {
    // 20000 rows x 51 columns: fold work 10 x 100 x 51 x 51 = 2.6e6, scoring 20000 x 51 x 100 = 1e8.
    const tall = file('tall.csv', 20000, 50);
    expect(earlyWorkerMayPay(parseFitOptions(['--data', tall, '--response', 'y', '--lambda', lambdas(100)]))).toBe(true);
    expect(earlyWorkerMayPay(parseFitOptions(['--data', tall, '--response', 'y', '--lambda', lambdas(10)]))).toBe(false);
  });

  it('never without cross-validation, and leaves a missing file to the reader', () => {
    expect(earlyWorkerMayPay(parseFitOptions(['--data', wide, '--response', 'y', '--lambda', lambdas(1000), '--folds', '0']))).toBe(false);
    expect(earlyWorkerMayPay(parseFitOptions(['--data', join(dir, 'missing.csv'), '--response', 'y']))).toBe(false);
  });

  it('takes a file whose first row does not fit in the first megabyte as very wide', () => {
    const huge = join(dir, 'huge.csv');
    writeFileSync(huge, `${Array.from({ length: 300_000 }, (_, j) => `x${j}`).join(',')}\n0\n`);
    expect(earlyWorkerMayPay(parseFitOptions(['--data', huge, '--response', 'x0']))).toBe(true);
  });
});
