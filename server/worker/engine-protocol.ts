/** Messages between a fit worker's job loop and its engine thread (engine-thread-entry.ts). */
import type { FitSpec } from '../../shared/fits';
import type { EngineTable } from '../engine/index';
import type { EvaluateInput } from '../fits/compute/evaluate';

export type EngineTask =
  | { kind: 'path'; table: EngineTable; spec: FitSpec }
  | { kind: 'fold'; table: EngineTable; spec: FitSpec; lambda: number[]; fold: number; fitId: string }
  | { kind: 'evaluate'; input: EvaluateInput };

export type FromEngine =
  | { kind: 'progress'; done: number; total: number }
  | { kind: 'result'; value: unknown }
  | { kind: 'error'; name: string; message: string; field?: string };
