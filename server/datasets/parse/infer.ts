/**
 * Type inference for one column from its profile, with the reason in plain words. Order of tests:
 * nothing present -> text (excluded); all numbers -> binary (two values), identifier (a row
 * counter, or an id-like name with all values distinct) or numeric; otherwise binary (two values),
 * identifier or free text (every value distinct, or too many to be categories), or categorical.
 */
import { CATEGORICAL_LEVEL_LIMIT, type ColumnType } from '../../../shared/datasets';
import { ColumnProfile } from './profile';

export type Storage = 'float64' | 'codes' | 'text';

export interface Inference {
  type: ColumnType;
  reason: string;
  excluded: boolean;
  /** How the values are stored: numbers, dictionary codes, or raw strings. */
  storage: Storage;
}

const ID_NAME = /^(id|key|row|index|uuid)$|[_\s.-](id|key|uuid)$|[a-z]Id$/i;

function examples(p: ColumnProfile, k = 3): string {
  return [...p.distinctValues.keys()].slice(0, k).map((v) => `"${v}"`).join(', ');
}

export function inferColumn(p: ColumnProfile): Inference {
  const n = p.present;
  const distinct = p.overflow ? null : p.distinctCount;
  const allDistinct = distinct !== null && distinct === n && n > 1;
  if (n === 0) return { type: 'text', storage: 'text', excluded: true, reason: 'Every value is missing.' };
  if (p.allNumeric) {
    if (distinct === 2) {
      return { type: 'binary', storage: 'float64', excluded: false, reason: `Numbers with exactly two distinct values (${examples(p)}).` };
    }
    if (p.integers && p.rowCounter && n >= 3 && p.missing === 0) {
      return { type: 'identifier', storage: 'float64', excluded: true, reason: 'Whole numbers that count the rows (1, 2, 3, ...): looks like a row number.' };
    }
    if (p.integers && (allDistinct || distinct === null) && ID_NAME.test(p.name)) {
      return { type: 'identifier', storage: 'float64', excluded: true, reason: `The name looks like a key and every value is a distinct whole number.` };
    }
    const few = distinct !== null && distinct <= 5 && n > 20 ? ` Only ${distinct} distinct values: you may prefer to treat them as categories.` : '';
    return { type: 'numeric', storage: 'float64', excluded: false, reason: `Every value is a number.${few}` };
  }
  const note = p.lineOffset === 1 ? '(the header is row 1)' : '(the first line is row 1)';
  const text = p.firstText ? `"${p.firstText.value}" in row ${p.firstText.row + p.lineOffset} ${note} is not a number` : 'not all values are numbers';
  if (distinct === 2) {
    return { type: 'binary', storage: 'codes', excluded: false, reason: `Exactly two distinct values (${examples(p)}).` };
  }
  const freeText = p.hasWhitespace && p.totalLength / n > 20;
  if (freeText && (distinct === null || distinct > CATEGORICAL_LEVEL_LIMIT || allDistinct)) {
    return { type: 'text', storage: 'text', excluded: true, reason: `Long values with spaces, ${distinct === null ? 'thousands of' : distinct} distinct: looks like free text (${text}).` };
  }
  if (allDistinct && n >= 5) {
    return { type: 'identifier', storage: 'text', excluded: true, reason: `Every value is different (${n} values): looks like an identifier (${text}).` };
  }
  if (distinct === null || distinct > CATEGORICAL_LEVEL_LIMIT) {
    const count = distinct === null ? `more than ${p.distinctCount - 1}` : String(distinct);
    return { type: 'identifier', storage: 'text', excluded: true, reason: `${count} distinct values is too many for categories (limit ${CATEGORICAL_LEVEL_LIMIT}); treated as an identifier (${text}).` };
  }
  return { type: 'categorical', storage: 'codes', excluded: false, reason: `${distinct} distinct values (${examples(p)}, ...); ${text}.` };
}
