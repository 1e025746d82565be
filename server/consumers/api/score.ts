/**
 * Scoring rows against a release: rows sent as JSON objects or as CSV become an engine table, then
 * the fits' own row-wise prediction (server/fits/compute/predict-rows.ts) computes b0 + x'b and, for
 * binomial, the probability, with a plain error per row that cannot be scored (a missing value the
 * fit does not fill, an unseen category, text where the fit had numbers). In JSON a column absent
 * from a row is that row's error (never silently filled); in CSV a column absent from the header is
 * a 422 for the whole request, as in the fits' predictions upload.
 */
import { CAUTION_LINES } from '../../../shared/cautions';
import { MAX_SCORE_ROWS, type ScoreResponseDto, type ScoreRowDto } from '../../../shared/consumers';
import { EngineInputError, type EngineColumn, type EngineTable } from '../../engine/index';
import { parseCsvBytes } from '../../tabular/csv';
import type { ChosenModel } from '../../exports/chosen-model';
import { predictRowsWithErrors } from '../../fits/compute/predict-rows';
import { badRequest, HttpError } from '../../http/errors';
import type { ReleaseRow } from '../../releases/index';

type Cell = number | string | null;

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** The JSON body's rows, checked by hand (cheap at 10,000 rows), with what each row lacks. */
export function rowsFromJson(body: unknown, needed: string[]): { table: EngineTable; absent: (string | null)[] } {
  if (!isPlainObject(body)) throw badRequest('The body must be a JSON object {"rows": [...]}.', 'body');
  const extra = Object.keys(body).filter((k) => k !== 'rows');
  if (extra.length > 0) throw badRequest(`Unknown field${extra.length > 1 ? 's' : ''} in body: ${extra.join(', ')}`, extra[0]);
  const rows = body.rows;
  if (!Array.isArray(rows)) throw badRequest('rows: an array of objects (column name -> number, text or null).', 'rows');
  if (rows.length === 0) throw badRequest('rows: send at least one row.', 'rows');
  if (rows.length > MAX_SCORE_ROWS) throw new HttpError(413, `rows: at most ${MAX_SCORE_ROWS} rows per request (got ${rows.length}); send them in batches.`, 'rows');
  const n = rows.length;
  const absent: (string | null)[] = new Array<string | null>(n).fill(null);
  for (let i = 0; i < n; i++) if (!isPlainObject(rows[i])) throw badRequest(`rows[${i}]: each row must be an object (column name -> value).`, `rows.${i}`);
  const columns: EngineColumn[] = [];
  for (const name of needed) {
    let allNumeric = true;
    const cells: Cell[] = new Array<Cell>(n);
    for (let i = 0; i < n; i++) {
      const row = rows[i] as Record<string, unknown>;
      const v = Object.hasOwn(row, name) ? row[name] : undefined;
      if (v === undefined) {
        absent[i] ??= `column "${name}" is absent from this row`;
        cells[i] = null;
      } else if (v === null) cells[i] = null;
      else if (typeof v === 'number') {
        if (!Number.isFinite(v)) throw badRequest(`rows[${i}].${name}: not a finite number.`, `rows.${i}.${name}`);
        cells[i] = v;
      } else if (typeof v === 'string') {
        if (v.length > 1000) throw badRequest(`rows[${i}].${name}: text longer than 1000 characters.`, `rows.${i}.${name}`);
        allNumeric = false;
        cells[i] = v;
      } else throw badRequest(`rows[${i}].${name}: a value is a number, text or null (got ${Array.isArray(v) ? 'an array' : typeof v}).`, `rows.${i}.${name}`);
    }
    columns.push(allNumeric ? numericColumn(name, cells) : textColumn(name, cells));
  }
  return { table: { nRows: n, columns }, absent };
}

function numericColumn(name: string, cells: Cell[]): EngineColumn {
  const values = new Float64Array(cells.length);
  for (let i = 0; i < cells.length; i++) values[i] = cells[i] === null ? Number.NaN : (cells[i] as number);
  return { name, kind: 'numeric', values };
}

function textColumn(name: string, cells: Cell[]): EngineColumn {
  const levels: string[] = [];
  const index = new Map<string, number>();
  const codes = new Int32Array(cells.length);
  for (let i = 0; i < cells.length; i++) {
    const c = cells[i];
    if (c === null || c === '') {
      codes[i] = -1;
      continue;
    }
    const text = typeof c === 'number' ? String(c) : c;
    let k = index.get(text);
    if (k === undefined) {
      k = levels.length;
      levels.push(text);
      index.set(text, k);
    }
    codes[i] = k;
  }
  return { name, kind: 'categorical', codes, levels };
}

export function rowsFromCsv(bytes: Uint8Array, needed: string[]): EngineTable {
  let table: EngineTable;
  try {
    table = parseCsvBytes(bytes, 'the request body');
  } catch (error) {
    if (error instanceof EngineInputError) throw badRequest(error.message, 'body');
    throw error;
  }
  if (table.nRows > MAX_SCORE_ROWS) throw new HttpError(413, `At most ${MAX_SCORE_ROWS} rows per request (got ${table.nRows}); send them in batches.`, 'body');
  const present = new Set(table.columns.map((c) => c.name));
  const missing = needed.filter((c) => !present.has(c));
  if (missing.length > 0) throw new HttpError(422, `The CSV has no column "${missing[0]}", which the release uses${missing.length > 1 ? ` (nor ${missing.length - 1} more: ${missing.slice(1).join(', ')})` : ''}.`, missing[0]);
  return table;
}

export function neededColumns(m: ChosenModel): string[] {
  return [...new Set(m.results.encoding.columns.map((c) => c.column))];
}

export function scoreTable(m: ChosenModel, release: ReleaseRow, table: EngineTable, absent?: (string | null)[]): ScoreResponseDto {
  const predicted = predictRowsWithErrors(table, { family: m.fit.spec.family, encoding: m.results.encoding, intercept: m.intercept, coefficients: m.coefficients });
  const binomial = m.fit.spec.family === 'binomial';
  const rows: ScoreRowDto[] = new Array<ScoreRowDto>(table.nRows);
  let rowErrors = 0;
  for (let i = 0; i < table.nRows; i++) {
    const error = absent?.[i] ?? predicted.errors[i];
    if (error !== null) {
      rowErrors++;
      rows[i] = binomial ? { row: i + 1, linearPredictor: null, probability: null, error } : { row: i + 1, linearPredictor: null, error };
    } else {
      rows[i] = binomial
        ? { row: i + 1, linearPredictor: predicted.linearPredictor[i], probability: predicted.probability![i], error: null }
        : { row: i + 1, linearPredictor: predicted.linearPredictor[i], error: null };
    }
  }
  return {
    modelId: release.modelId,
    releaseId: release.id,
    releaseNumber: release.number,
    fitId: m.fit.id,
    lambda: m.lambda,
    family: m.fit.spec.family,
    rowErrors,
    rows,
    cautions: [...CAUTION_LINES],
  };
}
