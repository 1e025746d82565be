/**
 * A finished fit at one lambda (its chosen one unless asked otherwise), as every export and the
 * consumer API need it: the stored results, the original-scale and standardized coefficients of that
 * lambda, and the share of CV folds keeping each term. One loader so the CSV, JSON, PMML, the bundle
 * and the release document cannot disagree about which numbers belong to a fit.
 */
import { eq } from 'drizzle-orm';
import type { Database } from '../db/client';
import { fits } from '../db/schema/index';
import { badRequest, conflict } from '../http/errors';
import { bytesToFloat64, bytesToUint8 } from '../fits/codec';
import type { FitSummaryRow } from '../fits/data';
import { requireFit } from '../fits/service/detail';
import type { FitStoredResults } from '../fits/stored-types';

export interface ChosenModel {
  fit: FitSummaryRow;
  results: FitStoredResults;
  index: number;
  lambda: number;
  rule: string;
  intercept: number;
  standardizedIntercept: number;
  /** Original scale, one per term. */
  coefficients: Float64Array;
  standardizedCoefficients: Float64Array;
  /** Share of CV folds keeping each term at this lambda; null without CV. */
  stability: number[] | null;
}

export async function loadChosenModel(db: Database, workspaceId: string, fitId: string, at?: number): Promise<ChosenModel> {
  const fit = await requireFit(db, workspaceId, fitId);
  if (fit.status !== 'finished') throw conflict(`This fit is ${fit.status}; exports need a finished fit.`, 'status');
  const [row] = await db
    .select({ results: fits.results, coefficients: fits.coefficients, standardized: fits.standardizedCoefficients, counts: fits.selectionCounts })
    .from(fits)
    .where(eq(fits.id, fit.id));
  if (!row?.results || !row.coefficients || !row.standardized) throw conflict('This fit has no stored results.', 'status');
  const r = row.results;
  const p = r.terms.length;
  const L = r.lambda.length;
  const index = at ?? fit.chosenIndex ?? L - 1;
  if (!Number.isInteger(index) || index < 0 || index >= L) throw badRequest(`index: choose a lambda position from 0 to ${L - 1}.`, 'index');
  const stability = r.cv && row.counts ? Array.from(bytesToUint8(row.counts).subarray(index * p, (index + 1) * p), (c) => c / r.cv!.folds) : null;
  return {
    fit,
    results: r,
    index,
    lambda: r.lambda[index],
    rule: at === undefined || at === fit.chosenIndex ? (fit.chosenRule ?? 'last') : 'manual',
    intercept: r.intercept[index],
    standardizedIntercept: r.standardizedIntercept[index],
    coefficients: bytesToFloat64(row.coefficients).slice(index * p, (index + 1) * p),
    standardizedCoefficients: bytesToFloat64(row.standardized).slice(index * p, (index + 1) * p),
    stability,
  };
}
