/**
 * One pass over a column's cells, keeping only what type inference needs: counts, whether every
 * value is a number, the first value that is not, and distinct values up to a cap (so memory stays
 * bounded however many rows the file has).
 */
import { CATEGORICAL_OVERRIDE_LIMIT } from '../../../shared/datasets';
import { DECIMAL, type MissingTest } from './missing';

/** Distinct values tracked per column; beyond this a column is "many distinct values". */
export const DISTINCT_CAP = CATEGORICAL_OVERRIDE_LIMIT + 1;

export class ColumnProfile {
  count = 0;
  missing = 0;
  numeric = 0;
  firstText: { value: string; row: number } | null = null;
  /** Whole numbers equal to their row number (1-based or 0-based): a row counter. */
  rowCounter = true;
  integers = true;
  hasWhitespace = false;
  totalLength = 0;
  distinct = new Map<string, number>();
  overflow = false;

  constructor(readonly name: string) {}

  /** `row` is the 1-based data row (the header is row 0 here; reports add 1). */
  add(cell: string, row: number, missing: MissingTest): void {
    this.count++;
    if (missing.isMissing(cell)) {
      this.missing++;
      this.rowCounter = false;
      return;
    }
    let value = cell.trim();
    this.totalLength += value.length;
    if (this.numeric === this.count - this.missing - 1 && this.firstText === null && DECIMAL.test(value)) {
      this.numeric++;
      const x = Number(value);
      if (!Number.isInteger(x)) this.integers = false;
      if (this.rowCounter && x !== row && x !== row - 1) this.rowCounter = false;
      value = String(x); // "1.0" and "1" are the same number
    } else {
      if (this.firstText === null) this.firstText = { value, row };
      if (!this.hasWhitespace && /\s/.test(value)) this.hasWhitespace = true;
    }
    if (!this.overflow) {
      const seen = this.distinct.get(value);
      if (seen !== undefined) this.distinct.set(value, seen + 1);
      else if (this.distinct.size < DISTINCT_CAP) this.distinct.set(value, 1);
      else this.overflow = true;
    }
  }

  get present(): number {
    return this.count - this.missing;
  }

  get allNumeric(): boolean {
    return this.present > 0 && this.firstText === null;
  }
}
