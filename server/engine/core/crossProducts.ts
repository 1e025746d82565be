import { EngineInputError, type CrossProducts, type DesignMatrix } from '../types';
import { dotBlock3 } from './dotBlock';
import type { GramCache } from './gram';

/**
 * Rows per chunk of the centred copy the kernel reads: chunk x (p + 1) doubles of about 512 KiB stay
 * in a core's L2 cache while the kernel passes over them p / 4 times, instead of streaming every
 * column from memory on each pass (the whole centred design of a tall fit is tens of MB). Also bounds
 * the copy's memory. A fixed number, so the sums (and every result built on them) never depend on
 * the machine or on how many threads run.
 */
const CHUNK_DOUBLES = 65536;

/** The centre of a set of rows (column means) and the mean response. */
function rowMeans(design: DesignMatrix, rows: Int32Array | null, y?: Float64Array): { center: Float64Array; yCenter: number } {
  const { n, p, x } = design;
  const count = rows ? rows.length : n;
  const center = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const off = j * n;
    let s = 0;
    if (rows) for (let i = 0; i < count; i++) s += x[off + rows[i]];
    else for (let i = 0; i < count; i++) s += x[off + i];
    center[j] = count > 0 ? s / count : 0;
  }
  let yCenter = 0;
  if (y) {
    if (rows) for (let i = 0; i < count; i++) yCenter += y[rows[i]];
    else for (let i = 0; i < count; i++) yCenter += y[i];
    yCenter = count > 0 ? yCenter / count : 0;
  }
  return { center, yCenter };
}

/**
 * Over all rows, one plain left-to-right sum each: the diagonal of S, the column sums, and the
 * response's sums. These alone set the centres, scales, X'y and so lambda_max and the grid; taking
 * them from here whether or not the off-diagonal sums come from fold blocks keeps a path's grid
 * identical with and without cross-validation (the off-diagonal sums differ in rounding only).
 */
function overrideMoments(out: CrossProducts, design: DesignMatrix, y: Float64Array | undefined): void {
  const { n, p, x } = design;
  const { center, sums } = out;
  const colSums = out.colSums as Float64Array;
  const response = out.response;
  let yc: Float64Array | null = null;
  if (y && response) {
    yc = new Float64Array(n);
    let sum = 0;
    let squares = 0;
    for (let i = 0; i < n; i++) {
      const v = y[i] - response.center;
      yc[i] = v;
      sum += v;
      squares += v * v;
    }
    response.sum = sum;
    response.squares = squares;
  }
  for (let j = 0; j < p; j++) {
    const off = j * n;
    const c = center[j];
    let sum = 0;
    let squares = 0;
    let cross = 0;
    for (let i = 0; i < n; i++) {
      const v = x[off + i] - c;
      sum += v;
      squares += v * v;
      if (yc) cross += v * yc[i];
    }
    colSums[j] = sum;
    sums[j * p + j] = squares;
    if (response) response.cross[j] = cross;
  }
}

/** Columns per panel of accumulateSymmetric: the width of dotBlock3's blocks. */
const PANEL = 3;

/**
 * acc[j][k] += sum_i b[j][i] b[k][i] over the m rows of the column-major chunk b (q columns), for
 * k >= the start of j's panel of PANEL (mirrorUpper fills the rest), a 3 x 3 block at a time
 * (dotBlock3; at the last panel and column a missing column repeats the first one, its sums
 * dropped). Every entry is one left-to-right sum over the chunk's rows, whatever the blocking, and
 * x_j x_k = x_k x_j exactly, so the result is symmetric.
 */
function accumulateSymmetric(b: Float64Array, m: number, q: number, acc: Float64Array): void {
  const block = new Float64Array(9);
  for (let j0 = 0; j0 < q; j0 += PANEL) {
    const rows = Math.min(PANEL, q - j0);
    const a0 = j0 * m;
    const a1 = rows > 1 ? a0 + m : a0;
    const a2 = rows > 2 ? a0 + 2 * m : a0;
    for (let k = j0; k < q; k += PANEL) {
      const cols = Math.min(PANEL, q - k);
      const b0 = k * m;
      dotBlock3(b, a0, a1, a2, b, b0, cols > 1 ? b0 + m : b0, cols > 2 ? b0 + 2 * m : b0, m, block);
      for (let r = 0; r < rows; r++) {
        const row = (j0 + r) * q + k;
        for (let c = 0; c < cols; c++) acc[row + c] += block[3 * r + c];
      }
    }
  }
}

/** Fills acc[j][k] for k below j's panel from acc[k][j] (see accumulateSymmetric). */
function mirrorUpper(acc: Float64Array, q: number): void {
  for (let j = 0; j < q; j++) {
    const panelStart = j - (j % PANEL);
    for (let k = 0; k < panelStart; k++) acc[j * q + k] = acc[k * q + j];
  }
}

/** Per-column minimum and maximum over some rows (cross products cannot tell a constant column exactly). */
export interface ColumnRange {
  min: Float64Array;
  max: Float64Array;
}

/** Running sums of one set of rows (sumRows, blockCrossProducts). */
interface RowSums {
  rows: Int32Array | null;
  /** With rows null: the first of `count` contiguous rows. */
  first: number;
  count: number;
  /** q x q, q = p (+ 1 with the response as its last column): upper part, see accumulateSymmetric. */
  acc: Float64Array;
  colSums: Float64Array;
  ySum: number;
  ySquares: number;
  range?: ColumnRange;
}

function startSums(rows: Int32Array | null, first: number, count: number, p: number, q: number, withRange: boolean): RowSums {
  const range = withRange ? { min: new Float64Array(p).fill(Infinity), max: new Float64Array(p).fill(-Infinity) } : undefined;
  return { rows, first, count, acc: new Float64Array(q * q), colSums: new Float64Array(p), ySum: 0, ySquares: 0, range };
}

/**
 * Adds rows start .. start + m - 1 of `into`'s rows (with `into.rows` null: rows into.first + start
 * on, contiguous): their centred copy into `buffer`, then the kernel. Each loop nest is its own
 * function: V8 optimizes a long loop in place (on-stack replacement) before the code after it has
 * ever run, and that code then had no type feedback and deoptimized, again and again (24-56
 * deoptimizations per tall run, mostly here and in subtractCrossProducts).
 */
function addChunk(design: DesignMatrix, into: RowSums, start: number, m: number, center: Float64Array, y: Float64Array | undefined, yCenter: number, buffer: Float64Array): void {
  const first = into.first + start;
  centreColumns(design, into, start, first, m, center, buffer);
  if (y) centreResponse(y, into, start, first, m, yCenter, buffer, design.p * m);
  accumulateSymmetric(buffer, m, y ? design.p + 1 : design.p, into.acc);
}

/** The design part of addChunk: each column's rows, centred, into `buffer` (m per column), with their sums and range. */
function centreColumns(design: DesignMatrix, into: RowSums, start: number, first: number, m: number, center: Float64Array, buffer: Float64Array): void {
  const { n, p, x } = design;
  const { rows, colSums, range } = into;
  for (let j = 0; j < p; j++) {
    const from = j * n;
    const to = j * m;
    const c = center[j];
    let sum = colSums[j];
    if (range) {
      let lo = range.min[j];
      let hi = range.max[j];
      for (let t = 0; t < m; t++) {
        const raw = rows ? x[from + rows[start + t]] : x[from + first + t];
        if (raw < lo) lo = raw;
        if (raw > hi) hi = raw;
        const v = raw - c;
        buffer[to + t] = v;
        sum += v;
      }
      range.min[j] = lo;
      range.max[j] = hi;
    } else if (rows) {
      for (let t = 0; t < m; t++) {
        const v = x[from + rows[start + t]] - c;
        buffer[to + t] = v;
        sum += v;
      }
    } else {
      for (let t = 0; t < m; t++) {
        const v = x[from + first + t] - c;
        buffer[to + t] = v;
        sum += v;
      }
    }
    colSums[j] = sum;
  }
}

/** The response part of addChunk: its rows centred into buffer[to ..], with their sum and sum of squares. */
function centreResponse(y: Float64Array, into: RowSums, start: number, first: number, m: number, yCenter: number, buffer: Float64Array, to: number): void {
  const { rows } = into;
  let ySum = into.ySum;
  let ySquares = into.ySquares;
  for (let t = 0; t < m; t++) {
    const v = y[rows ? rows[start + t] : first + t] - yCenter;
    buffer[to + t] = v;
    ySum += v;
    ySquares += v * v;
  }
  into.ySum = ySum;
  into.ySquares = ySquares;
}

/** The CrossProducts of finished running sums. */
function finishSums(into: RowSums, p: number, center: Float64Array, y: Float64Array | undefined, yCenter: number): CrossProducts {
  const q = y ? p + 1 : p;
  const { acc } = into;
  mirrorUpper(acc, q);
  const sums = new Float64Array(p * p);
  for (let j = 0; j < p; j++) sums.set(acc.subarray(j * q, j * q + p), j * p);
  let response: CrossProducts['response'];
  if (y) {
    const cross = new Float64Array(p);
    for (let j = 0; j < p; j++) cross[j] = acc[p * q + j];
    response = { center: yCenter, sum: into.ySum, cross, squares: into.ySquares };
  }
  return crossProductsOf(into.count, Float64Array.from(center), sums, into.colSums, response);
}

/**
 * Every CrossProducts is made here, with all its fields in one order (absent ones undefined): the
 * solver's optimized code then meets one object shape, where objects that gained colSums or response
 * afterwards had several and each new one cost a deoptimization and a recompilation (V8 "wrong map").
 */
function crossProductsOf(rows: number, center: Float64Array, sums: Float64Array, colSums: Float64Array | undefined, response: CrossProducts['response']): CrossProducts {
  return { rows, center, sums, colSums, response };
}

/**
 * The cross products of `rows` (all rows when null) about `center` (and the response about yCenter),
 * a chunk of rows at a time (CHUNK_DOUBLES): S = sum over chunks of the chunk's sums.
 */
function sumRows(design: DesignMatrix, rows: Int32Array | null, center: Float64Array, y: Float64Array | undefined, yCenter: number, buffer: Float64Array): CrossProducts {
  const { n, p } = design;
  const count = rows ? rows.length : n;
  const q = y ? p + 1 : p;
  const chunk = Math.max(1, Math.floor(buffer.length / q));
  const into = startSums(rows, 0, count, p, q, false);
  for (let start = 0; start < count; start += chunk) addChunk(design, into, start, Math.min(chunk, count - start), center, y, yCenter, buffer);
  return finishSums(into, p, center, y, yCenter);
}

function chunkBuffer(count: number, q: number): Float64Array {
  return new Float64Array(Math.max(1, Math.min(count, Math.max(1, Math.floor(CHUNK_DOUBLES / q)))) * q);
}

/**
 * Cross products S = sum_i (x_i - c)(x_i - c)' over some rows of a design, about a fixed centre c
 * (default: the column means of those rows). Sums over disjoint row sets add, so a cross-validation
 * fold's training rows get theirs as S(all rows) - S(held-out rows) (subtractCrossProducts,
 * blockCrossProducts); fitPathOnDesign turns them into the fold's Gram matrix (see
 * gramFromCrossProducts). Centring about c first keeps the sums free of the cancellation that raw
 * sums x_i x_i' suffer when means are large against spreads.
 */
export function crossProducts(
  design: DesignMatrix,
  rows?: ArrayLike<number>,
  center?: Float64Array,
  y?: Float64Array,
  yCenter?: number,
): CrossProducts {
  const list = rows ? Int32Array.from(rows) : null;
  const means = center && (!y || yCenter !== undefined) ? null : rowMeans(design, list, y);
  const c = center ?? (means as { center: Float64Array }).center;
  const cy = yCenter ?? means?.yCenter ?? 0;
  const count = list ? list.length : design.n;
  const out = sumRows(design, list, c, y, cy, chunkBuffer(count, y ? design.p + 1 : design.p));
  if (!list) overrideMoments(out, design, y);
  return out;
}

/** The cross products of each block of rows about one common centre, their sum, and each block's column ranges. */
export interface BlockCrossProducts {
  /** blocks[b]: the rows of block b (ascending), about the centre of all rows. */
  blocks: CrossProducts[];
  /** The sum of the blocks, in block order: the cross products of all rows. */
  all: CrossProducts;
  /** ranges[b]: the columns' minimum and maximum over block b's rows. */
  ranges: ColumnRange[];
}

/**
 * Cross products of the blocks of a partition of the rows (row i in block blockOf[i]), all about the
 * column means of all rows, and S(all) as their sum: one pass over the rows gives every fold's
 * held-out S and the full S, and a fold's training S is S(all) - S(its block). About the common
 * centre the sums subtract without cancellation as long as the centre is near every block's mean.
 * S(all)'s diagonal, column sums and response sums are those of crossProducts on all rows (see
 * overrideMoments), so the full path's grid does not depend on whether folds were planned.
 */
export function blockCrossProducts(design: DesignMatrix, blockOf: Int32Array, blockCount: number, y?: Float64Array, byBlock?: RowsByBlock): BlockCrossProducts {
  const every = Array.from({ length: blockCount }, (_, k) => k);
  const { blocks, ranges } = someBlockSums(design, blockOf, blockCount, y, every, byBlock);
  return joinBlocks(design, y, blocks, ranges);
}

/**
 * A design's rows regrouped by block (someBlockSums fills it, then sums the blocks there): block k's
 * rows, in ascending order, are rows start[k] .. start[k + 1] - 1 of every column of x (column-major,
 * n rows) and of y. Each block is then a contiguous stretch of every column: its sums read it in
 * order, and cross-validation scores a fold's held-out rows there. Gathering a block's rows from the
 * design instead reads every cache line of it when the folds are spread over the rows (tall
 * 20000 x 200: 32 MB per fold), which also made two threads doing so at once wait on memory.
 */
export interface RowsByBlock {
  x: Float64Array;
  y?: Float64Array;
  start: Int32Array;
}

/**
 * Room for RowsByBlock of a design (filled by someBlockSums), in shared memory when threads will
 * fill and read it (each thread writes its own blocks' rows).
 */
export function rowsByBlock(design: DesignMatrix, blockOf: Int32Array, blockCount: number, withY: boolean, sharedMemory: boolean): RowsByBlock {
  const { n, p } = design;
  const start = new Int32Array(blockCount + 1);
  for (let i = 0; i < blockOf.length; i++) start[blockOf[i] + 1]++;
  for (let k = 0; k < blockCount; k++) start[k + 1] += start[k];
  const doubles = (count: number) => (sharedMemory ? new Float64Array(new SharedArrayBuffer(count * 8)) : new Float64Array(count));
  return { x: doubles(n * p), y: withY ? doubles(n) : undefined, start };
}

/**
 * Copies the rows of the blocks listed in `which` (their row lists in `rowsOf`) to their places in
 * `byBlock`, column by column and block by block: each block's stretch is written in order while
 * its rows are read from the column, which stays in cache from one block to the next. About 30 ms
 * on 20000 x 200, much of it the first touch of the new array's pages.
 */
function regroup(design: DesignMatrix, rowsOf: Int32Array[], y: Float64Array | undefined, which: number[], byBlock: RowsByBlock): void {
  const { n, p, x } = design;
  const out = byBlock.x;
  for (let j = 0; j < p; j++) {
    const off = j * n;
    for (const k of which) {
      const rows = rowsOf[k];
      const to = off + byBlock.start[k];
      for (let t = 0; t < rows.length; t++) out[to + t] = x[off + rows[t]];
    }
  }
  const yOut = byBlock.y;
  if (!y || !yOut) return;
  for (const k of which) {
    const rows = rowsOf[k];
    const to = byBlock.start[k];
    for (let t = 0; t < rows.length; t++) yOut[to + t] = y[rows[t]];
  }
}

/**
 * The cross products and column ranges of the blocks listed in `which` (in that order), exactly as
 * blockCrossProducts computes them: threads can each take some blocks, and joinBlocks finishes.
 * With `byBlock` (rowsByBlock), the listed blocks' rows are first copied there and summed from
 * there (the same values in the same order, so the same sums).
 */
export function someBlockSums(
  design: DesignMatrix,
  blockOf: Int32Array,
  blockCount: number,
  y: Float64Array | undefined,
  which: number[],
  byBlock?: RowsByBlock,
): { blocks: CrossProducts[]; ranges: ColumnRange[] } {
  const { n, p } = design;
  if (blockOf.length !== n) throw new EngineInputError(`cross products: ${blockOf.length} block ids for ${n} rows`, 'crossProducts');
  const { center, yCenter } = rowMeans(design, null, y);
  const members: number[][] = Array.from({ length: blockCount }, () => []);
  for (let i = 0; i < n; i++) members[blockOf[i]].push(i);
  // The chunk size follows the largest block of all (not of `which`), so a block's sums are the same
  // whichever blocks are computed with it.
  const largest = members.reduce((m, rows) => Math.max(m, rows.length), 0);
  const q = y ? p + 1 : p;
  const buffer = chunkBuffer(largest, q);
  const chunk = Math.max(1, Math.floor(buffer.length / q));
  if (byBlock) {
    if (byBlock.x.length !== n * p || byBlock.start.length !== blockCount + 1 || (y && byBlock.y?.length !== n)) {
      throw new EngineInputError(`cross products: rows by block sized for ${byBlock.x.length} values, ${byBlock.start.length - 1} blocks`, 'crossProducts');
    }
    regroup(design, members.map((rows) => Int32Array.from(rows)), y, which, byBlock);
    const grouped: DesignMatrix = { n, p, x: byBlock.x, terms: design.terms };
    const groupedY = y ? byBlock.y : undefined;
    const running = which.map((k) => startSums(null, byBlock.start[k], members[k].length, p, q, true));
    for (const block of running) {
      for (let start = 0; start < block.count; start += chunk) addChunk(grouped, block, start, Math.min(chunk, block.count - start), center, groupedY, yCenter, buffer);
    }
    return { blocks: running.map((block) => finishSums(block, p, center, y, yCenter)), ranges: running.map((block) => block.range as ColumnRange) };
  }
  const running = which.map((k) => startSums(Int32Array.from(members[k]), 0, members[k].length, p, q, true));
  // Round r takes chunk r of every block: with folds spread over the rows, those chunks come from the
  // same stretch of rows, which stays in cache from one block to the next. Each block still adds its
  // chunks in order, so the sums are those of sumRows on the block alone.
  for (let start = 0; start < largest; start += chunk) {
    for (const block of running) {
      if (start < block.count) addChunk(design, block, start, Math.min(chunk, block.count - start), center, y, yCenter, buffer);
    }
  }
  return { blocks: running.map((block) => finishSums(block, p, center, y, yCenter)), ranges: running.map((block) => block.range as ColumnRange) };
}

/** Every block's sums (in block order) joined: S(all) as their sum, with overrideMoments. */
export function joinBlocks(design: DesignMatrix, y: Float64Array | undefined, blocks: CrossProducts[], ranges: ColumnRange[]): BlockCrossProducts {
  const { n, p } = design;
  const center = blocks.length > 0 ? blocks[0].center : rowMeans(design, null, y).center;
  const yCenter = blocks[0]?.response?.center ?? 0;
  const sums = new Float64Array(p * p);
  const colSums = new Float64Array(p);
  const cross = new Float64Array(p);
  let sum = 0;
  let squares = 0;
  for (const block of blocks) {
    for (let t = 0; t < sums.length; t++) sums[t] += block.sums[t];
    for (let j = 0; j < p; j++) colSums[j] += (block.colSums as Float64Array)[j];
    if (block.response) {
      for (let j = 0; j < p; j++) cross[j] += block.response.cross[j];
      sum += block.response.sum;
      squares += block.response.squares;
    }
  }
  const all = crossProductsOf(n, Float64Array.from(center), sums, colSums, y ? { center: yCenter, sum, cross, squares } : undefined);
  overrideMoments(all, design, y);
  return { blocks, all, ranges };
}

/** Columns constant over every block but `leftOut` (exactly: one minimum equals one maximum). */
export function constantOutside(ranges: ColumnRange[], leftOut: number, p: number): Uint8Array {
  const constant = new Uint8Array(p);
  for (let j = 0; j < p; j++) {
    let lo = Infinity;
    let hi = -Infinity;
    ranges.forEach((r, b) => {
      if (b === leftOut) return;
      if (r.min[j] < lo) lo = r.min[j];
      if (r.max[j] > hi) hi = r.max[j];
    });
    constant[j] = lo === hi ? 1 : 0;
  }
  return constant;
}

/** a - b, entry by entry (its own function: see addChunk on loops and deoptimization). */
function difference(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length);
  for (let t = 0; t < out.length; t++) out[t] = a[t] - b[t];
  return out;
}

/** S(all) - S(part): the cross products of the remaining rows (same centre required). */
export function subtractCrossProducts(all: CrossProducts, part: CrossProducts): CrossProducts {
  if (all.center.length !== part.center.length || all.center.some((v, j) => v !== part.center[j])) {
    throw new EngineInputError('cross products: both sets must use the same centre', 'crossProducts');
  }
  const sums = difference(all.sums, part.sums);
  const colSums = all.colSums && part.colSums ? difference(all.colSums, part.colSums) : undefined;
  const [a, b] = [all.response, part.response];
  const response = a && b && a.center === b.center ? { center: a.center, sum: a.sum - b.sum, cross: difference(a.cross, b.cross), squares: a.squares - b.squares } : undefined;
  return crossProductsOf(all.rows - part.rows, Float64Array.from(all.center), sums, colSums, response);
}

/**
 * Presets the Gram cache of the standardized columns from cross products of the same rows:
 * G_jk = (S_jk - n (m_j - c_j)(m_k - c_k)) / (n s_j s_k), m the rows' means and s the scales the
 * standardization learnt (constant columns, scale 0, get zero entries).
 */
export function gramFromCrossProducts(gram: GramCache, cp: CrossProducts, n: number, means: Float64Array, scales: Float64Array): void {
  const p = means.length;
  if (cp.rows !== n || cp.center.length !== p || cp.sums.length !== p * p) {
    throw new EngineInputError(`cross products: expected ${n} rows and ${p} x ${p} sums; got ${cp.rows} rows, ${cp.center.length} centres, ${cp.sums.length} sums`, 'crossProducts');
  }
  const shift = Float64Array.from(means, (m, j) => m - cp.center[j]);
  for (let j = 0; j < p; j++) {
    const col = new Float64Array(p);
    if (scales[j] > 0) {
      for (let k = 0; k < p; k++) {
        if (scales[k] > 0) col[k] = (cp.sums[j * p + k] - n * shift[j] * shift[k]) / (n * scales[j] * scales[k]);
      }
    }
    gram.preset(j, col);
  }
}
