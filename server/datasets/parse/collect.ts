/**
 * What both CSV readers share once a line is split: the header checks, blank and ragged lines with
 * their row numbers, per-column profiles, and batches of rows spilled column by column. The readers
 * differ only in how they split lines, so a file gives the same result through either.
 */
import { FileProblem } from './errors';
import { checkHeader } from './header';
import type { MissingTest } from './missing';
import { ColumnProfile } from './profile';
import { ColumnSpill } from './spill';

const RAGGED_REPORTED = 5;

export interface CollectOptions {
  fileName: string;
  columnLimit: number;
  spillPath: string;
  missing: MissingTest;
  /** The uploader said the file has no header row: the first row is data, columns are column_1, ... */
  firstRowIsData?: boolean;
}

export class RowCollector {
  header: string[] | null = null;
  profiles: ColumnProfile[] = [];
  spill: ColumnSpill | null = null;
  /** Per column, the batch's cells as numbers (NaN when missing or text). */
  numbers: Float64Array[] = [];
  batchRows = 1000;
  /** Rows in the current batch. */
  inBatch = 0;
  /** Lines seen, the header and blank lines included (row numbers in messages). */
  fileRows = 0;
  rowCount = 0;
  blank = 0;
  private lastBlank = false;
  private readonly ragged: number[] = [];

  constructor(private readonly opts: CollectOptions) {}

  get firstRowIsData(): boolean {
    return this.opts.firstRowIsData === true;
  }

  /** How messages number rows: from the header, or from the first line when there is none. */
  get rowNote(): string {
    return this.firstRowIsData ? '(the first line is row 1)' : '(the header is row 1)';
  }

  /** The first line: the header row, or (no header) the row that sets the number of columns; the caller then admits it as data. */
  setHeader(raw: string[]): void {
    if (!this.firstRowIsData) this.fileRows++;
    const names = this.firstRowIsData ? raw.map((_, j) => `column_${j + 1}`) : raw;
    const header = checkHeader(names, this.opts.fileName, this.opts.columnLimit);
    this.header = header;
    this.profiles = header.map((h) => new ColumnProfile(h, this.firstRowIsData ? 0 : 1));
    this.spill = new ColumnSpill(this.opts.spillPath, header.length, this.opts.missing);
    this.batchRows = Math.max(256, Math.floor(400_000 / header.length));
    this.numbers = header.map(() => new Float64Array(this.batchRows));
  }

  /** Counts a line after the header; true when it is a data row to add (then rowCount is its number). */
  admit(fields: number, isBlank: () => boolean): boolean {
    this.fileRows++;
    this.lastBlank = fields === 1 && isBlank();
    if (this.lastBlank) {
      this.blank++;
      return false;
    }
    if (fields !== this.header!.length) {
      this.ragged.push(this.fileRows);
      return false;
    }
    if (this.ragged.length > 0) return false;
    this.rowCount++;
    return true;
  }

  /** After each read chunk: stop early once enough ragged rows were seen. */
  checkRagged(): void {
    if (this.ragged.length >= RAGGED_REPORTED) throw this.raggedProblem();
  }

  /** Column j holds only numbers (or missing values) so far. */
  numeric = (j: number): boolean => this.profiles[j].firstText === null;

  /** Writes the batch; `cells(j)` gives the raw text of a text column's batch cells. */
  flush(cells: (j: number) => string[]): void {
    this.spill?.writeColumns(this.inBatch, this.numeric, (j) => this.numbers[j], cells);
    this.inBatch = 0;
  }

  /** At the end of the file: the checks that need every line, then the last batch. */
  finish(cells: (j: number) => string[]): { header: string[]; spill: ColumnSpill } {
    const { fileName } = this.opts;
    if (this.header === null) throw new FileProblem(`${fileName} has no header row: it contains only blank lines.`);
    if (this.ragged.length > 0) throw this.raggedProblem();
    if (this.lastBlank) this.blank--; // the newline that ends the last line
    if (this.rowCount === 0) throw new FileProblem(`${fileName} has a header row but no data rows.`);
    this.flush(cells);
    return { header: this.header, spill: this.spill! };
  }

  close(): void {
    this.spill?.close();
  }

  private raggedProblem(): FileProblem {
    const width = this.header?.length ?? 0;
    const ragged = this.ragged;
    const more = ragged.length >= RAGGED_REPORTED ? ' and possibly more' : '';
    const rows = ragged.length === 1 ? `row ${ragged[0]} ${this.rowNote} does` : `rows ${ragged.join(', ')}${more} ${this.rowNote} do`;
    const like = this.firstRowIsData ? 'the first row' : 'the header';
    return new FileProblem(
      `${this.opts.fileName}: ${rows} not have ${width} fields like ${like}. ` + 'Check for unquoted delimiters inside values or missing fields.',
    );
  }
}
