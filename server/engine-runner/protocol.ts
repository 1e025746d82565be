/** Messages between the runner (parallel.ts) and its worker threads (worker.ts). */
import type { ColumnRange, CrossProducts, DesignMatrix, PathOptions, RowsByBlock } from '../engine/index';
import type { FoldFit, FoldLosses, FoldShared, HeldOutRows } from '../engine/cv';
import type { Family } from '../engine/index';

/**
 * What a worker receives once per cross-validation. The large arrays (design.x, the cross products'
 * sums) live in SharedArrayBuffers: posting them shares the memory instead of copying it.
 */
export interface WorkerPlan {
  design: DesignMatrix;
  y: Float64Array;
  options: PathOptions;
  foldIds: Int32Array;
  lambda: number[];
  shared: FoldShared;
  /**
   * One Int32 in a SharedArrayBuffer: the next fold to run. Every thread (workers and, when it
   * joins, the main thread) claims folds with Atomics.add, so no thread waits for a message to get
   * work and each fold runs exactly once.
   */
  next: Int32Array;
  folds: number;
}

/** Cross products of some fold blocks (someBlockSums), while this thread computes the others. */
export interface BlockRequest {
  type: 'blocks';
  design: DesignMatrix;
  y: Float64Array;
  foldIds: Int32Array;
  folds: number;
  which: number[];
  /** Where the worker copies its blocks' rows (shared memory; someBlockSums). */
  byFold?: RowsByBlock;
}

/** Score a fold fitted on another thread on its held-out rows (held.x in shared memory). */
export interface ScoreRequest {
  type: 'score';
  family: Family;
  fitted: FoldFit;
  held: HeldOutRows;
}

export type WorkerRequest = ({ type: 'plan' } & WorkerPlan) | BlockRequest | ScoreRequest;

export type WorkerReply =
  | { type: 'result'; fold: number; result: FoldLosses }
  | { type: 'error'; fold: number; error: { name: string; message: string; field?: string } }
  /** The worker found no fold left to claim. */
  | { type: 'done' }
  /** The worker has loaded and waits for a plan. */
  | { type: 'ready' }
  | { type: 'blocks'; blocks: CrossProducts[]; ranges: ColumnRange[] }
  | { type: 'blocks-error'; error: { name: string; message: string; field?: string } }
  | { type: 'scored'; fold: number; result: FoldLosses }
  | { type: 'score-error'; fold: number; error: { name: string; message: string; field?: string } };
