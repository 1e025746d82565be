/**
 * The full-data path of a fit (runs on an engine thread): the engine's path through the spec adapter,
 * flattened for storage, with the number of cross-validation folds the plan makes.
 */
import type { FitSpec, LambdaCertificateDto } from '../../../shared/fits';
import { fitPathPrepared, planCrossValidation, prepareFit, type DesignEncoding, type EngineTable } from '../../engine/index';
import { engineSpec } from '../engine-spec';

export interface PathOutput {
  terms: string[];
  termColumns: string[];
  termGroups: (string | null)[];
  lambda: number[];
  lambdaMax: number;
  intercept: number[];
  standardizedIntercept: number[];
  /** [lambda][term], row-major. */
  coefficients: Float64Array;
  standardizedCoefficients: Float64Array;
  nonzero: number[];
  devianceExplained: number[];
  certificates: LambdaCertificateDto[];
  encoding: DesignEncoding;
  rowsFitted: number;
  rowsDropped: number;
  notes: string[];
  /** Standardization learnt from the rows fitted, per term (scale 1 without standardization). */
  standardization: { centers: number[]; scales: number[] } | null;
  /** Cross-validation folds the plan makes (0 without CV). */
  folds: number;
}

function flatten(rows: Float64Array[], p: number): Float64Array {
  const out = new Float64Array(rows.length * p);
  rows.forEach((row, l) => out.set(row, l * p));
  return out;
}

export function stoppingReason(status: string, message: string): string {
  if (message) return message;
  return status === 'converged' ? 'duality gap below the tolerance' : status === 'iteration-limit' ? 'stopped at the iteration limit' : 'numerical failure';
}

export function runPath(table: EngineTable, spec: FitSpec, onLambda?: (done: number, total: number) => void): PathOutput {
  const es = engineSpec(spec);
  const prepared = prepareFit(table, es);
  if (onLambda) prepared.options = { ...prepared.options, onLambda };
  const path = fitPathPrepared(prepared);
  const p = path.terms.length;
  const encoding = path.encoding ?? prepared.built.encoding;
  const termColumns = [...path.terms];
  for (const enc of encoding.columns) {
    if (enc.kind === 'numeric') termColumns[enc.term] = enc.column;
    else for (const t of enc.terms) termColumns[t] = enc.column;
  }
  const groupOf = new Map<string, string>();
  for (const [group, columns] of Object.entries(spec.groups ?? {})) for (const c of columns) groupOf.set(c, group);
  const termGroups = termColumns.map((c) => groupOf.get(c) ?? (spec.penalty === 'group-lasso' ? c : null));
  const folds = es.cv ? planCrossValidation(table, es, path, prepared).folds : 0;
  return {
    terms: path.terms,
    termColumns,
    termGroups,
    lambda: path.lambda,
    lambdaMax: path.lambdaMax,
    intercept: path.intercept,
    standardizedIntercept: path.standardizedIntercept,
    coefficients: flatten(path.coefficients, p),
    standardizedCoefficients: flatten(path.standardizedCoefficients, p),
    nonzero: path.nonzero,
    devianceExplained: path.devianceExplained,
    certificates: path.solves.map((s) => ({
      gap: s.gap,
      tolerance: s.tolerance,
      iterations: s.iterations,
      status: s.status,
      stoppingReason: stoppingReason(s.status, s.message),
      timeMs: s.timeMs,
    })),
    encoding,
    rowsFitted: prepared.built.rows.length,
    rowsDropped: table.nRows - prepared.built.rows.length,
    notes: path.notes,
    standardization: path.centers && path.scales ? { centers: Array.from(path.centers), scales: Array.from(path.scales) } : null,
    folds,
  };
}
