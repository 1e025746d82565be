/**
 * FitSpec -> PathOptions for a design built from the full data, so that every fold penalizes the
 * same design columns in the same way as the full-data fit.
 */
import type { BuiltDesign } from '../design/build';
import type { FitSpec, PathOptions } from '../types';

/** The predictor column behind each design column. */
function columnOfTerms(built: BuiltDesign): string[] {
  const owner: string[] = new Array(built.design.p);
  for (const enc of built.encoding.columns) {
    if (enc.kind === 'numeric') owner[enc.term] = enc.column;
    else for (const term of enc.terms) owner[term] = enc.column;
  }
  return owner;
}

/**
 * Group lasso groups: each named group of spec.groups joins its columns' design columns; a predictor
 * in no named group forms a group of its own (so a categorical predictor's indicators stay together).
 */
function groupOfTerms(spec: FitSpec, owner: string[]): Int32Array {
  const groupOfColumn = new Map<string, number>();
  let next = 0;
  for (const columns of Object.values(spec.groups ?? {})) {
    const id = next++;
    for (const column of columns) groupOfColumn.set(column, id);
  }
  const groups = new Int32Array(owner.length);
  owner.forEach((column, j) => {
    let id = groupOfColumn.get(column);
    if (id === undefined) {
      id = next++;
      groupOfColumn.set(column, id);
    }
    groups[j] = id;
  });
  // Renumber 0..G-1 in order of first appearance: named groups may have no design columns left.
  const renumber = new Map<number, number>();
  return groups.map((g) => {
    if (!renumber.has(g)) renumber.set(g, renumber.size);
    return renumber.get(g) as number;
  });
}

export function pathOptionsFor(spec: FitSpec, built: BuiltDesign, lambda?: number[]): PathOptions {
  const owner = columnOfTerms(built);
  const factors = spec.penaltyFactors;
  return {
    family: spec.family,
    penalty: spec.penalty,
    alpha: spec.penalty === 'lasso' ? 1 : spec.alpha,
    groupOfTerm: spec.penalty === 'group-lasso' ? groupOfTerms(spec, owner) : undefined,
    penaltyFactors: factors
      ? Float64Array.from(built.design.terms, (term, j) => factors[term] ?? factors[owner[j]] ?? 1)
      : undefined,
    standardize: spec.standardize,
    lambda: lambda ?? spec.lambda,
    pathLength: spec.pathLength,
    lambdaRatio: spec.lambdaRatio,
    tolerance: spec.tolerance,
    maxIterations: spec.maxIterations,
    screening: spec.screening,
  };
}
