/**
 * A fit request checked against the model and the dataset version's column schema, before anything
 * is stored or queued: each problem is a 400 naming the spec field (DESIGN.md bad input).
 */
import type { ColumnSchema } from '../../../shared/datasets';
import { familyIssues, type FitRequest } from '../../../shared/fits';
import type { FitFamily } from '../../../shared/models';
import { badRequest } from '../../http/errors';

interface VersionFacts {
  number: number;
  rowCount: number;
  columns: ColumnSchema[];
}

function usable(columns: Map<string, ColumnSchema>, name: string, field: string, what: string): ColumnSchema {
  const column = columns.get(name);
  if (!column) throw badRequest(`${field}: ${what} "${name}" is not a column of this dataset version.`, field);
  if (column.excluded) throw badRequest(`${field}: ${what} "${name}" is excluded from modelling in this dataset version; include it in the column settings first.`, field);
  if (column.type === 'text' || column.type === 'identifier') {
    throw badRequest(`${field}: ${what} "${name}" is ${column.type === 'text' ? 'free text' : 'an identifier'}; change its type to use it in a model.`, field);
  }
  return column;
}

/** Distinct present values of a column, or null when more than were counted. */
function distinct(column: ColumnSchema): number | null {
  return column.summary.distinct;
}

export function checkSpecAgainstVersion(spec: FitRequest, model: { outcome: string; family: FitFamily }, version: VersionFacts): void {
  const columns = new Map(version.columns.map((c) => [c.name, c]));
  const outcome = usable(columns, model.outcome, 'outcome', 'the outcome');
  if (model.family === 'binomial') {
    const k = distinct(outcome);
    if (k === null || k > 2) {
      throw badRequest(`outcome: a yes/no (binomial) model needs an outcome with two values; "${model.outcome}" has ${k === null ? 'many' : k}.`, 'outcome');
    }
    if (k < 2) throw badRequest(`outcome: "${model.outcome}" has only one value in this dataset version; a yes/no model needs two.`, 'outcome');
  } else if (outcome.type !== 'numeric' && outcome.type !== 'binary') {
    throw badRequest(`outcome: a number (gaussian) model needs a numeric outcome; "${model.outcome}" holds ${outcome.type} values.`, 'outcome');
  } else if (outcome.summary.count - outcome.summary.missing < 2) {
    throw badRequest(`outcome: "${model.outcome}" has fewer than two values.`, 'outcome');
  }
  for (const name of spec.predictors) {
    if (name === model.outcome) throw badRequest(`predictors: "${name}" is the outcome and cannot also be a predictor.`, 'predictors');
    usable(columns, name, 'predictors', 'predictor');
  }
  const issue = familyIssues(spec, model.family)[0];
  if (issue) throw badRequest(`${issue.field}: ${issue.message}`, issue.field);
  const trainingRows = spec.holdout ? version.rowCount - Math.round(spec.holdout.share * version.rowCount) : version.rowCount;
  if (spec.cv.kind === 'folds' && spec.cv.folds > trainingRows) {
    throw badRequest(`cv.folds: ${spec.cv.folds} folds need at least ${spec.cv.folds} rows; the fit has ${trainingRows}.`, 'cv.folds');
  }
  if (spec.cv.kind === 'column') {
    const name = spec.cv.column;
    if (name === model.outcome) throw badRequest(`cv.column: the fold column cannot be the outcome "${name}".`, 'cv.column');
    const column = columns.get(name);
    if (!column) throw badRequest(`cv.column: fold column "${name}" is not a column of this dataset version.`, 'cv.column');
    if (column.excluded) throw badRequest(`cv.column: fold column "${name}" is excluded in this dataset version; include it first.`, 'cv.column');
    if (column.type !== 'numeric' && column.type !== 'binary') {
      throw badRequest(`cv.column: fold column "${name}" must hold whole-number fold ids (type Number); it is typed ${column.type}.`, 'cv.column');
    }
    const k = distinct(column);
    if (k !== null && k < 2) throw badRequest(`cv.column: fold column "${name}" has ${k === 1 ? 'one fold' : 'no values'}; cross-validation needs at least two folds.`, 'cv.column');
  }
  if (version.rowCount < 2) throw badRequest(`datasetVersionId: version ${version.number} has ${version.rowCount} row(s); a fit needs at least two.`, 'datasetVersionId');
}
