import { RESPONSE_RULES } from '../core/loss/responses';
import { EngineInputError, type EngineColumn, type EngineTable, type FitSpec } from '../types';

const fail = (message: string, field: string): never => {
  throw new EngineInputError(message, field);
};

/**
 * Checks a table-level fit spec before any work: every problem is an EngineInputError whose message
 * names the column, row, option or value at fault (rows are 1-based data rows). Constant predictors
 * are not errors: they are reported and left out (docs/engine.md, "Data and encoding"); a constant response is.
 */
export function validateSpec(table: EngineTable, spec: FitSpec): void {
  if (table.nRows === 0 || table.columns.length === 0) fail('the data has no rows', 'data');
  if (table.nRows === 1) fail('the data has only one row: at least two are needed to fit', 'data');
  checkOptions(spec);
  const byName = new Map(table.columns.map((c) => [c.name, c]));
  const response = byName.get(spec.response) ?? fail(`unknown response column "${spec.response}"`, 'response');
  if (spec.predictors.length === 0) fail('no predictors given', 'predictors');
  const seen = new Set<string>();
  for (const name of spec.predictors) {
    if (!byName.has(name)) fail(`unknown predictor column "${name}"`, 'predictors');
    if (name === spec.response) fail(`the response "${name}" cannot also be a predictor`, 'predictors');
    if (seen.has(name)) fail(`predictor "${name}" is listed twice`, 'predictors');
    seen.add(name);
  }
  checkResponse(response, spec, table.nRows);
  for (const name of spec.predictors) checkPredictor(byName.get(name) as EngineColumn, table.nRows);
  checkGroups(spec, byName);
  checkPenaltyFactors(spec, byName);
  if (spec.cv) {
    const { folds, foldColumn } = spec.cv;
    if (foldColumn !== undefined) {
      const column = byName.get(foldColumn) ?? fail(`unknown fold column "${foldColumn}"`, 'foldColumn');
      if (foldColumn === spec.response || seen.has(foldColumn)) fail(`fold column "${foldColumn}" cannot be the response or a predictor`, 'foldColumn');
      if (column.kind !== 'numeric') fail(`fold column "${foldColumn}" must hold whole numbers`, 'foldColumn');
      else {
        for (let i = 0; i < table.nRows; i++) {
          const v = column.values[i];
          if (!Number.isNaN(v) && !Number.isInteger(v)) fail(`fold column "${foldColumn}" has ${v} in row ${i + 1}; fold ids are whole numbers`, 'foldColumn');
        }
      }
    } else if (!(Number.isInteger(folds) && folds >= 2 && folds <= table.nRows)) {
      fail(`folds must be a whole number from 2 to the number of rows (${table.nRows}); got ${folds}`, 'folds');
    }
  }
}

function checkOptions(spec: FitSpec): void {
  if (!Object.hasOwn(RESPONSE_RULES, spec.family)) fail(`family must be ${Object.keys(RESPONSE_RULES).join(' or ')}; got "${spec.family}"`, 'family');
  if (!['lasso', 'elastic-net', 'group-lasso'].includes(spec.penalty)) {
    fail(`penalty must be lasso, elastic-net or group-lasso; got "${spec.penalty}"`, 'penalty');
  }
  if (spec.penalty === 'elastic-net') {
    if (spec.l1Share === undefined) fail('the elastic-net penalty needs an L1 share in (0, 1] (1 = lasso, towards 0 = ridge)', 'l1Share');
    else if (!(spec.l1Share > 0 && spec.l1Share <= 1)) fail(`L1 share must be in (0, 1]; got ${spec.l1Share}`, 'l1Share');
  } else if (spec.l1Share !== undefined) fail(`L1 share applies only to the elastic-net penalty (this fit is ${spec.penalty})`, 'l1Share');
  if (spec.lambda) {
    if (spec.lambda.length === 0) fail('lambda: give at least one value', 'lambda');
    spec.lambda.forEach((l, k) => {
      if (!Number.isFinite(l) || l < 0) fail(`lambda values must be finite and >= 0; value ${k + 1} is ${l}`, 'lambda');
      if (k > 0 && !(l < spec.lambda![k - 1])) fail(`lambda values must be strictly descending; value ${k + 1} (${l}) follows ${spec.lambda![k - 1]}`, 'lambda');
    });
  }
  if (!(Number.isInteger(spec.pathLength) && spec.pathLength >= 1)) fail(`path length must be a whole number >= 1; got ${spec.pathLength}`, 'pathLength');
  if (spec.pathDecades !== undefined && !(spec.pathDecades > 0 && Number.isFinite(spec.pathDecades))) {
    fail(`path decades must be a positive number; got ${spec.pathDecades}`, 'pathDecades');
  }
  if (spec.maxTerms !== undefined && !(Number.isInteger(spec.maxTerms) && spec.maxTerms >= 1)) {
    fail(`max terms must be a whole number >= 1; got ${spec.maxTerms}`, 'maxTerms');
  }
  if (spec.maxTerms !== undefined && spec.lambda) fail('max terms ends the automatic path; it cannot be combined with explicit lambdas', 'maxTerms');
  if (!(spec.tolerance > 0 && Number.isFinite(spec.tolerance))) fail(`tolerance must be a positive number; got ${spec.tolerance}`, 'tolerance');
  if (!(Number.isInteger(spec.maxIterations) && spec.maxIterations >= 1)) {
    fail(`iteration limit must be a whole number >= 1; got ${spec.maxIterations}`, 'maxIterations');
  }
  if (!['strong', 'gap-safe', 'none'].includes(spec.screening)) fail(`screening must be strong, gap-safe or none; got "${spec.screening}"`, 'screening');
  if (spec.missing !== 'drop' && spec.missing !== 'impute') fail(`missing must be drop or impute; got "${spec.missing}"`, 'missing');
}

function checkResponse(column: EngineColumn, spec: FitSpec, nRows: number): void {
  const name = column.name;
  const rules = RESPONSE_RULES[spec.family];
  const present: number[] = [];
  for (let i = 0; i < nRows; i++) {
    if (column.kind === 'numeric') {
      const v = column.values[i];
      if (Number.isNaN(v)) continue;
      if (!Number.isFinite(v)) fail(`response "${name}" has a non-finite value ${v} in row ${i + 1}`, 'response');
      const invalid = rules.invalid(v, i + 1, name);
      if (invalid) fail(invalid, 'response');
      present.push(v);
    } else if (column.codes[i] >= 0) present.push(column.codes[i]);
  }
  if (present.length === 0) fail(`response "${name}" has no values`, 'response');
  if (present.length === 1) fail(`response "${name}" has only one value: at least two rows are needed`, 'response');
  const distinct = new Set(present);
  if (column.kind === 'categorical') {
    if (!rules.categorical) fail(`${spec.family} response "${name}" must be numeric, not categorical`, 'response');
    if (distinct.size !== 2) {
      const levels = [...distinct].map((k) => `"${column.levels[k]}"`).join(', ');
      fail(`binomial response "${name}" must have exactly two values; it has ${distinct.size} (${levels})`, 'response');
    }
  }
  if (distinct.size === 1) fail(`response "${name}" is constant (${column.kind === 'numeric' ? present[0] : column.levels[present[0]]}): there is nothing to fit`, 'response');
}

function checkPredictor(column: EngineColumn, nRows: number): void {
  let count = 0;
  // The kind tested once per column, not per cell: this runs over every cell of the table.
  if (column.kind === 'numeric') {
    const values = column.values;
    for (let i = 0; i < nRows; i++) {
      const v = values[i];
      if (Number.isNaN(v)) continue;
      if (!Number.isFinite(v)) fail(`column "${column.name}" has a non-finite value ${v} in row ${i + 1}`, column.name);
      count++;
    }
  } else {
    const codes = column.codes;
    for (let i = 0; i < nRows; i++) if (codes[i] >= 0) count++;
  }
  if (count === 0) fail(`column "${column.name}" has no values (all missing)`, column.name);
}

function checkGroups(spec: FitSpec, byName: Map<string, EngineColumn>): void {
  if (!spec.groups) return;
  if (spec.penalty !== 'group-lasso') fail('groups are only used by the group lasso (penalty group-lasso)', 'groups');
  const owner = new Map<string, string>();
  for (const [group, columns] of Object.entries(spec.groups)) {
    if (!Array.isArray(columns) || columns.length === 0) fail(`group "${group}" names no columns`, 'groups');
    for (const name of columns) {
      if (!byName.has(name)) fail(`group "${group}" names unknown column "${name}"`, 'groups');
      if (!spec.predictors.includes(name)) fail(`group "${group}" names "${name}", which is not a predictor`, 'groups');
      const other = owner.get(name);
      if (other !== undefined) fail(`column "${name}" is in two groups ("${other}" and "${group}"); groups must not overlap`, 'groups');
      owner.set(name, group);
    }
  }
  // The group lasso penalizes a group as a whole: its members must share one penalty weight.
  const weights = spec.penaltyWeights ?? {};
  for (const [group, columns] of Object.entries(spec.groups)) {
    const values = new Set(columns.map((c) => weights[c] ?? 1));
    if (values.size > 1) fail(`group "${group}" has different penalty weights; give its columns one weight`, 'penaltyWeights');
  }
}

function checkPenaltyFactors(spec: FitSpec, byName: Map<string, EngineColumn>): void {
  for (const [key, value] of Object.entries(spec.penaltyWeights ?? {})) {
    if (!(Number.isFinite(value) && value >= 0)) fail(`penalty weight of "${key}" must be finite and >= 0; got ${value}`, 'penaltyWeights');
    if (spec.predictors.includes(key)) continue;
    const cut = key.indexOf('=');
    const base = cut > 0 ? byName.get(key.slice(0, cut)) : undefined;
    const isLevel = base?.kind === 'categorical' && spec.predictors.includes(base.name) && base.levels.includes(key.slice(cut + 1));
    if (!isLevel) fail(`penalty weight for "${key}", which is not a predictor or a predictor's level`, 'penaltyWeights');
  }
}
