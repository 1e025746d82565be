/**
 * One pass over a column's cells, keeping only what type inference needs: counts, whether every
 * value is a number, the first value that is not, and distinct values up to a cap (so memory stays
 * bounded however many rows the file has).
 */
import { CATEGORICAL_OVERRIDE_LIMIT } from '../../../shared/datasets';
import { DECIMAL_TRIMMED, trimCell, type MissingTest } from './missing';

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
  /** Distinct values and their counts; numbers are keyed by value while the column is all numbers. */
  distinct = new Map<string, number>();
  private numbers = new Map<number, number>();
  overflow = false;

  /**
   * `lineOffset`: the file line of data row r is r + lineOffset (1 below a header row, 0 when the
   * first row is data), for messages that name the row.
   */
  constructor(
    readonly name: string,
    readonly lineOffset = 1,
  ) {}

  /** `row` is the 1-based data row (the header is row 0 here; reports add 1). */
  /** Returns the cell's number (NaN when missing or not a number), so callers need not parse it again. */
  add(cell: string, row: number, missing: MissingTest): number {
    const value = trimCell(cell);
    if (missing.isMissingTrimmed(value)) {
      this.count++;
      this.missing++;
      this.rowCounter = false;
      return Number.NaN;
    }
    if (this.firstText === null && DECIMAL_TRIMMED.test(value)) return this.addDecimal(Number(value), value.length, row);
    this.count++;
    this.totalLength += value.length;
    if (this.firstText === null) {
      this.firstText = { value, row };
      for (const [x, n] of this.numbers) this.distinct.set(String(x), n);
      this.numbers.clear();
    }
    if (!this.hasWhitespace && /\s/.test(value)) this.hasWhitespace = true;
    if (!this.overflow) this.count1(this.distinct, value);
    return Number.NaN;
  }

  /**
   * A cell already known to be a decimal number (trimmed text of `length` characters, not a missing
   * marker) while the column is all numbers so far: the quote-free reader's path, with no string.
   */
  addDecimal(x: number, length: number, row: number): number {
    this.count++;
    this.totalLength += length;
    this.numeric++;
    if (this.integers && !Number.isInteger(x)) this.integers = false;
    if (this.rowCounter && x !== row && x !== row - 1) this.rowCounter = false;
    if (!this.overflow) this.count1(this.numbers, x); // "1.0" and "1" are the same number
    return x;
  }

  private count1<K>(map: Map<K, number>, key: K): void {
    const seen = map.get(key);
    if (seen !== undefined) map.set(key, seen + 1);
    else if (map.size < DISTINCT_CAP) map.set(key, 1);
    else this.overflow = true;
  }

  /** Distinct values seen (as text) with their counts, up to the cap. */
  get distinctValues(): Map<string, number> {
    if (this.firstText !== null) return this.distinct;
    return new Map([...this.numbers].map(([x, n]) => [String(x), n]));
  }

  get distinctCount(): number {
    return this.firstText !== null ? this.distinct.size : this.numbers.size;
  }

  get present(): number {
    return this.count - this.missing;
  }

  get allNumeric(): boolean {
    return this.present > 0 && this.firstText === null;
  }
}
