/**
 * A stored column read in the type its version gives it. Numbers, codes and text convert into each
 * other where the values allow; where they don't, the ConversionProblem names the column and value.
 */
import { CATEGORICAL_OVERRIDE_LIMIT, type ColumnType } from '../../../shared/datasets';
import { DECIMAL } from '../parse/missing';
import { bytesToFloat64, bytesToInt32, compareLevels, decodeText, encodeCodes } from './codec';

export type StoredColumn =
  | { name: string; storage: 'float64'; data: Buffer; levels: null }
  | { name: string; storage: 'codes'; data: Buffer; levels: string[] }
  | { name: string; storage: 'text'; data: Buffer; levels: null };

export type LoadedColumn =
  | { name: string; kind: 'numeric'; values: Float64Array }
  | { name: string; kind: 'categorical'; codes: Int32Array; levels: string[] }
  | { name: string; kind: 'text'; values: (string | null)[] };

export class ConversionProblem extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ConversionProblem';
  }
}

/** The stored column as text cells (null = missing): the common ground of every conversion. */
export function asText(c: StoredColumn): (string | null)[] {
  if (c.storage === 'text') return decodeText(c.data);
  if (c.storage === 'codes') return Array.from(bytesToInt32(c.data), (k) => (k < 0 ? null : c.levels[k]));
  return Array.from(bytesToFloat64(c.data), (x) => (Number.isNaN(x) ? null : String(x)));
}

function toNumbers(name: string, cells: (string | null)[]): Float64Array {
  const out = new Float64Array(cells.length);
  cells.forEach((cell, i) => {
    if (cell === null) out[i] = Number.NaN;
    else if (DECIMAL.test(cell)) out[i] = Number(cell);
    else throw new ConversionProblem(`Column "${name}" cannot be numbers: "${cell}" in data row ${i + 1} is not a number.`);
  });
  return out;
}

function toCategories(name: string, cells: (string | null)[], limit: number) {
  const { codes, levels } = encodeCodes(cells);
  if (levels.length > limit) {
    throw new ConversionProblem(`Column "${name}" has ${levels.length} distinct values, more than the ${limit} allowed for this type.`);
  }
  return { name, kind: 'categorical' as const, codes, levels: levels.sort(compareLevels) };
}

export function loadAs(c: StoredColumn, type: ColumnType): LoadedColumn {
  const { name } = c;
  switch (type) {
    case 'numeric':
      return { name, kind: 'numeric', values: c.storage === 'float64' ? bytesToFloat64(c.data) : toNumbers(name, asText(c)) };
    case 'binary': {
      if (c.storage === 'float64') {
        const values = bytesToFloat64(c.data);
        const distinct = new Set(Array.from(values).filter((x) => !Number.isNaN(x)));
        if (distinct.size === 2 && distinct.has(0) && distinct.has(1)) return { name, kind: 'numeric', values };
      }
      const col = toCategories(name, asText(c), Number.POSITIVE_INFINITY);
      if (col.levels.length !== 2) {
        throw new ConversionProblem(`Column "${name}" has ${col.levels.length} distinct value(s); a yes/no column needs exactly two.`);
      }
      return col;
    }
    case 'categorical':
      return c.storage === 'codes' ? { name, kind: 'categorical', codes: bytesToInt32(c.data), levels: c.levels } : toCategories(name, asText(c), CATEGORICAL_OVERRIDE_LIMIT);
    case 'identifier':
    case 'text':
      return { name, kind: 'text', values: asText(c) };
  }
}
