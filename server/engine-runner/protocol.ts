/** Messages between crossValidateInWorkers and its worker threads. */
import type { DesignMatrix, PathOptions } from '../engine/index';
import type { FoldLosses, FoldShared } from '../engine/cv';

/** What a worker receives once and keeps for every fold it runs. */
export interface WorkerPlan {
  design: DesignMatrix;
  y: Float64Array;
  options: PathOptions;
  foldIds: Int32Array;
  lambda: number[];
  shared: FoldShared;
}

export type WorkerRequest = ({ type: 'init' } & WorkerPlan) | { type: 'fold'; fold: number };

export type WorkerReply =
  | { fold: number; result: FoldLosses }
  | { fold: number; error: { name: string; message: string; field?: string } };
