/** `--workers auto`: whether to start the fold worker before the data are read (server/cli/main.ts). */
import { closeSync, openSync, readSync, statSync } from 'node:fs';
import { foldWork, SCORING_WORK_THRESHOLD, THREAD_WORK_THRESHOLD } from '../engine-runner';
import { DEFAULTS, type FitOptions } from './args';

/** Bytes read from the file's start to estimate its shape before it is read (earlyWorkerMayPay). */
const HEAD_BYTES = 1 << 20;

/**
 * Whether a worker started before the reading could be used: the work estimate (foldWork) from the
 * file's shape seen in its first HEAD_BYTES (columns from the header line, rows from the file size
 * over the mean length of the lines seen; 10 folds assumed with a fold column) reaches
 * THREAD_WORK_THRESHOLD, or the table is tall and its scoring work reaches SCORING_WORK_THRESHOLD. A worker started and then left unused costs its start-up on the other core
 * while this one reads (the bench's tall and 300 x 1500 runs were 0.04-0.11 s slower with it); the
 * estimate only needs to tell those apart from the shapes where a worker pays, and threadsPay
 * decides on the real shape after reading.
 */
export function earlyWorkerMayPay(options: FitOptions): boolean {
  const folds = options.foldColumn !== undefined ? DEFAULTS.folds : options.folds;
  if (folds < 2) return false;
  let size = 0;
  let head: Buffer;
  try {
    size = statSync(options.data).size;
    head = Buffer.alloc(Math.min(size, HEAD_BYTES));
    const fd = openSync(options.data, 'r');
    try {
      readSync(fd, head, 0, head.length, 0);
    } finally {
      closeSync(fd);
    }
  } catch {
    // A missing or unreadable file: the reader reports it, naming the file.
    return false;
  }
  if (size === 0) return false;
  const lines = head.toString('latin1').split('\n');
  // Not one whole data line in the first megabyte: rows of that size mean a very wide table.
  if (lines.length < 3) return size > head.length;
  const header = lines[0];
  const columns = header.split(header.includes(',') ? ',' : header.includes('\t') ? '\t' : /\s+/).length;
  const seen = lines.slice(1, -1);
  const meanLine = seen.reduce((sum, l) => sum + l.length + 1, 0) / seen.length;
  const rows = (size - header.length - 1) / meanLine;
  const lambdas = options.lambda?.length ?? options.pathLength;
  // Folds on the worker (THREAD_WORK_THRESHOLD), or only their scoring on a tall table, where the
  // folds use the Gram form and share rows regrouped by fold (SCORING_WORK_THRESHOLD).
  return foldWork(rows, columns, folds, lambdas) >= THREAD_WORK_THRESHOLD || (rows >= 2 * columns && rows * columns * lambdas >= SCORING_WORK_THRESHOLD);
}
