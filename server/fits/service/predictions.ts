/**
 * Applying a finished fit (at its chosen lambda) to a dataset version or an uploaded CSV: a CSV with
 * one line per row: the linear predictor, the probability for binomial, and what is wrong with the
 * row when it cannot be scored. The work is one pass of b0 + x'b over the rows (no solving), so it
 * runs in the API process.
 */
import { eq } from 'drizzle-orm';
import { CAUTION_LINES } from '../../../shared/cautions';
import { EngineInputError, type EngineTable } from '../../engine/index';
import { parseCsvBytes } from '../../tabular/csv';
import type { Database } from '../../db/client';
import { fits } from '../../db/schema/index';
import { findVersionRowById } from '../../datasets/data/versions';
import { loadEngineTable } from '../../datasets/load-engine-table';
import { conflict, HttpError, notFound } from '../../http/errors';
import { bytesToFloat64 } from '../codec';
import { predictRowsWithErrors } from '../compute/predict-rows';
import { requireFit } from './detail';

export interface PredictionsCsv {
  fileName: string;
  csv: string;
  rowErrors: number;
}

async function storedModel(db: Database, workspaceId: string, fitId: string) {
  const fit = await requireFit(db, workspaceId, fitId);
  if (fit.status !== 'finished') throw conflict(`This fit is ${fit.status}; predictions need a finished fit.`, 'status');
  const [row] = await db.select({ results: fits.results, coefficients: fits.coefficients }).from(fits).where(eq(fits.id, fit.id));
  if (!row?.results || !row.coefficients) throw conflict('This fit has no stored results.', 'status');
  const r = row.results;
  const p = r.terms.length;
  const index = fit.chosenIndex ?? r.lambda.length - 1;
  const coefficients = bytesToFloat64(row.coefficients).slice(index * p, (index + 1) * p);
  return { fit, family: fit.spec.family, encoding: r.encoding, intercept: r.intercept[index], coefficients, lambda: r.lambda[index] };
}

function csvCell(text: string): string {
  return /[",\n\r]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

function toCsv(table: EngineTable, model: Awaited<ReturnType<typeof storedModel>>, source: string): PredictionsCsv {
  let predicted;
  try {
    predicted = predictRowsWithErrors(table, model);
  } catch (error) {
    if (error instanceof EngineInputError) throw new HttpError(422, `${source}: ${error.message}`, error.field ?? 'columns');
    throw error;
  }
  const binomial = model.family === 'binomial';
  const lines = [binomial ? 'row,linear_predictor,probability,error' : 'row,linear_predictor,error'];
  let rowErrors = 0;
  for (let i = 0; i < table.nRows; i++) {
    const error = predicted.errors[i];
    if (error !== null) {
      rowErrors++;
      lines.push(binomial ? `${i + 1},,,${csvCell(error)}` : `${i + 1},,${csvCell(error)}`);
      continue;
    }
    const eta = String(predicted.linearPredictor[i]);
    lines.push(binomial ? `${i + 1},${eta},${String(predicted.probability![i])},` : `${i + 1},${eta},`);
  }
  const name = `fit-v${model.fit.version}-predictions.csv`;
  // The cautions travel with every export of results (as comment lines after the rows).
  const notes = [`# Predictions of version ${model.fit.version} at lambda ${model.lambda} for ${source}.`, ...CAUTION_LINES.map((c) => `# ${c}`)];
  return { fileName: name, csv: `${lines.join('\n')}\n${notes.join('\n')}\n`, rowErrors };
}

export async function predictDatasetVersion(db: Database, workspaceId: string, fitId: string, versionId: string): Promise<PredictionsCsv> {
  const model = await storedModel(db, workspaceId, fitId);
  const version = await findVersionRowById(db, versionId);
  if (!version || version.workspaceId !== workspaceId) throw notFound('No such dataset version in this workspace.');
  const present = new Set(version.columns.map((c) => c.name));
  const missing = model.encoding.columns.map((c) => c.column).filter((c) => !present.has(c));
  if (missing.length > 0) {
    throw new HttpError(422, `datasetVersionId: version ${version.number} has no column "${missing[0]}", which the fit uses${missing.length > 1 ? ` (nor ${missing.length - 1} more)` : ''}.`, missing[0]);
  }
  let table: EngineTable;
  try {
    table = await loadEngineTable(db, version.id, [...new Set(model.encoding.columns.map((c) => c.column))]);
  } catch (error) {
    if (error instanceof EngineInputError) throw new HttpError(422, `datasetVersionId: ${error.message}`, 'datasetVersionId');
    throw error;
  }
  return toCsv(table, model, `version ${version.number} of the dataset`);
}

export async function predictCsvFile(db: Database, workspaceId: string, fitId: string, bytes: Uint8Array, fileName: string): Promise<PredictionsCsv> {
  const model = await storedModel(db, workspaceId, fitId);
  let table: EngineTable;
  try {
    table = parseCsvBytes(bytes, fileName);
  } catch (error) {
    if (error instanceof EngineInputError) throw new HttpError(400, error.message, 'file');
    throw error;
  }
  return toCsv(table, model, fileName);
}
