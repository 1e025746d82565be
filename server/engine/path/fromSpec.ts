import type { BuiltDesign } from '../design/build';
import { EngineInputError, type FitSpec, type PathOptions } from '../types';

/**
 * Table-level spec -> PathOptions for the encoded design. Groups: each named group of columns is one
 * group; a categorical predictor's indicators always share a group; remaining columns are groups of
 * their own. Penalty weights may be given per predictor (applied to all its indicators) or per term.
 */
export function pathOptionsFromSpec(spec: FitSpec, built: BuiltDesign): PathOptions {
  const terms = built.design.terms;
  const p = terms.length;
  const columnOf = [...terms];
  for (const enc of built.encoding.columns) {
    if (enc.kind === 'numeric') columnOf[enc.term] = enc.column;
    else for (const term of enc.terms) columnOf[term] = enc.column;
  }
  const weights = new Float64Array(p).fill(1);
  for (const [key, value] of Object.entries(spec.penaltyWeights ?? {})) {
    let matched = false;
    for (let j = 0; j < p; j++) {
      if (terms[j] === key || columnOf[j] === key) {
        weights[j] = value;
        matched = true;
      }
    }
    if (!matched && !spec.predictors.includes(key)) {
      throw new EngineInputError(`penalty weight for unknown column "${key}"`, 'penaltyWeights');
    }
  }
  const options: PathOptions = {
    family: spec.family,
    penalty: spec.penalty,
    penaltyWeights: weights,
    standardize: spec.standardize,
    pathLength: spec.pathLength,
    tolerance: spec.tolerance,
    maxIterations: spec.maxIterations,
    screening: spec.screening,
  };
  if (spec.lambda) options.lambda = spec.lambda;
  if (spec.l1Share !== undefined) options.l1Share = spec.l1Share;
  if (spec.pathDecades !== undefined) options.pathDecades = spec.pathDecades;
  if (spec.maxTerms !== undefined) options.maxTerms = spec.maxTerms;
  if (spec.penalty === 'group-lasso') {
    const groupOf = new Int32Array(p).fill(-1);
    let next = 0;
    const groupOfColumn = new Map<string, number>();
    for (const columns of Object.values(spec.groups ?? {})) {
      const id = next++;
      for (const column of columns) groupOfColumn.set(column, id);
    }
    for (let j = 0; j < p; j++) groupOf[j] = groupOfColumn.get(columnOf[j]) ?? -1;
    const categoricalGroup = new Map<number, number>();
    for (let j = 0; j < p; j++) {
      if (groupOf[j] >= 0) continue;
      const cat = built.groupsOfTerms[j];
      if (cat >= 0) {
        if (!categoricalGroup.has(cat)) categoricalGroup.set(cat, next++);
        groupOf[j] = categoricalGroup.get(cat) as number;
      } else groupOf[j] = next++;
    }
    options.groupOfTerm = groupOf;
  }
  return options;
}
