/**
 * Column-wise spill file: the parser hands over batches of rows; each batch is written once per
 * column. A column whose cells have all been numbers so far is written as Float64 bytes (NaN for
 * missing), so numeric columns are parsed once and never turned back into text; other columns as
 * the cells joined by NUL (NUL cannot occur in accepted text, see text-stream.ts). Memory stays at
 * one batch of rows plus one column.
 */
import fs from 'node:fs';
import { trimCell, type MissingTest } from './missing';

interface Segment {
  offset: number;
  length: number;
  numbers: boolean;
}

export class ColumnSpill {
  private readonly fd: number;
  private offset = 0;
  private readonly segments: Segment[][];
  closed = false;

  constructor(
    readonly path: string,
    readonly columnCount: number,
    private readonly missing: MissingTest,
  ) {
    this.fd = fs.openSync(path, 'w+');
    this.segments = Array.from({ length: columnCount }, () => []);
  }

  private append(j: number, bytes: Uint8Array, numbers: boolean): void {
    fs.writeSync(this.fd, bytes, 0, bytes.length, this.offset);
    this.segments[j].push({ offset: this.offset, length: bytes.length, numbers });
    this.offset += bytes.length;
  }

  /**
   * rows: row-major cells; numeric(j): every cell of column j in this batch is a number or missing;
   * parsed[j], when given, holds those numbers already (NaN for missing), one per row.
   */
  writeBatch(rows: string[][], numeric: (j: number) => boolean, parsed?: Float64Array[]): void {
    const numbers = (j: number) => {
      if (parsed) return parsed[j];
      const values = new Float64Array(rows.length);
      for (let i = 0; i < rows.length; i++) {
        const t = trimCell(rows[i][j]);
        values[i] = this.missing.isMissingTrimmed(t) ? Number.NaN : Number(t);
      }
      return values;
    };
    this.writeColumns(rows.length, numeric, numbers, (j) => rows.map((r) => r[j]));
  }

  /**
   * The next n rows, column by column: numbers(j) (at least n values, NaN for missing) for columns
   * that are numbers so far, else cells(j), the raw text of at least n cells.
   */
  writeColumns(n: number, numeric: (j: number) => boolean, numbers: (j: number) => Float64Array, cells: (j: number) => string[]): void {
    if (n === 0) return;
    for (let j = 0; j < this.columnCount; j++) {
      if (numeric(j)) {
        const values = numbers(j).slice(0, n);
        this.append(j, new Uint8Array(values.buffer), true);
        continue;
      }
      const text = cells(j);
      this.append(j, Buffer.from((text.length === n ? text : text.slice(0, n)).join('\0'), 'utf8'), false);
    }
  }

  private read(s: Segment): Buffer {
    const buf = Buffer.allocUnsafe(s.length);
    fs.readSync(this.fd, buf, 0, s.length, s.offset);
    return buf;
  }

  /** True when column j was written as numbers throughout (then readNumbers applies). */
  allNumbers(j: number): boolean {
    return this.segments[j].every((s) => s.numbers);
  }

  /** True when column j starts as numbers and turns to text in a later batch. */
  mixed(j: number): boolean {
    return !this.allNumbers(j) && this.segments[j].some((s) => s.numbers);
  }

  readNumbers(j: number): Float64Array {
    const total = this.segments[j].reduce((n, s) => n + s.length, 0);
    const out = new Float64Array(total / 8);
    const bytes = new Uint8Array(out.buffer);
    let at = 0;
    for (const s of this.segments[j]) {
      fs.readSync(this.fd, bytes, at, s.length, s.offset);
      at += s.length;
    }
    return out;
  }

  /**
   * Every cell of column j in row order: raw text, or for batches stored as numbers their shortest
   * text form (so "1.50" reads back as "1.5") and null for missing.
   */
  readCells(j: number): (string | null)[] {
    const parts: (string | null)[][] = [];
    for (const s of this.segments[j]) {
      const buf = this.read(s);
      if (!s.numbers) {
        parts.push(buf.toString('utf8').split('\0'));
        continue;
      }
      const values = new Float64Array(buf.buffer.slice(buf.byteOffset, buf.byteOffset + buf.length));
      parts.push(Array.from(values, (x) => (Number.isNaN(x) ? null : String(x))));
    }
    return parts.length === 1 ? parts[0] : parts.flat();
  }

  close(): void {
    if (this.closed) return;
    this.closed = true;
    fs.closeSync(this.fd);
    fs.rmSync(this.path, { force: true });
  }
}
