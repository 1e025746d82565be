/**
 * The quote-free reader, for files with no `"` and one line ending throughout (LF, or CRLF on every
 * line): lines are split on bytes, and plain decimals become numbers without a string per cell
 * (server/tabular/csv-scan.ts). Without quotes papaparse splits exactly so (lines at the newline, fields at the
 * delimiter), so both readers give the same rows, counts, messages and spilled cells
 * (tests/unit/datasets/read-fast.test.ts compares them).
 */
import fs from 'node:fs';
import type { RowCollector } from './collect';
import { DECIMAL_TRIMMED, type MissingTest } from './missing';
import type { ReadResult } from './read-papa';
import { scanCell, scanned } from '../../tabular/csv-scan';
import { Utf8Check } from './utf8-check';

const NEWLINE = 10;
const CR = 13;
const QUOTE = 0x22;
const EMPTY: Buffer = Buffer.alloc(0);

/** True when the file has no quote and its line endings are all LF or all CRLF (one pass, indexOf only). */
export async function isQuoteFree(filePath: string): Promise<boolean> {
  let crs = 0;
  let lfs = 0;
  let crAtEnd = false; // a CR ended the previous chunk: the next byte must be LF
  for await (const chunk of fs.createReadStream(filePath, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
    if (chunk.indexOf(QUOTE) !== -1) return false;
    if (crAtEnd && chunk[0] !== NEWLINE) return false;
    for (let i = chunk.indexOf(CR); i !== -1; i = chunk.indexOf(CR, i + 1)) {
      crs++;
      if (i + 1 < chunk.length && chunk[i + 1] !== NEWLINE) return false;
    }
    crAtEnd = chunk[chunk.length - 1] === CR;
    for (let i = chunk.indexOf(NEWLINE); i !== -1; i = chunk.indexOf(NEWLINE, i + 1)) lfs++;
  }
  return !crAtEnd && (crs === 0 || crs === lfs);
}

/** Splits lines into cells and hands them to the collector; holds the current line's cell bounds. */
class LineReader {
  private p = 0;
  private values = new Float64Array(0);
  private starts = new Int32Array(0);
  private ends = new Int32Array(0);
  private lengths = new Int32Array(0);
  /** Per text column, the batch's raw cells. */
  private texts: (string[] | null)[] = [];
  /** File offset of each batch row, to recover earlier cells of a column that turns to text. */
  private rowStarts = new Float64Array(0);
  private readonly delimiter: number;
  /** False when a missing-value marker is itself a number: every cell then goes through the marker test. */
  private readonly fastNumbers: boolean;

  constructor(
    private readonly c: RowCollector,
    private readonly missing: MissingTest,
    private readonly delimiterText: string,
    private readonly filePath: string,
  ) {
    this.delimiter = delimiterText.charCodeAt(0);
    this.fastNumbers = !missing.markers.some((m) => DECIMAL_TRIMMED.test(m.trim()));
  }

  /** Every line of `view`; all end with a newline except, when `final`, the last one. */
  lines(view: Buffer, viewStart: number, final: boolean): void {
    const stop = final ? view.length + 1 : view.length;
    for (let pos = 0; pos < stop; ) pos = this.line(view, pos, viewStart);
  }

  finish(): void {
    this.c.finish((j) => this.texts[j]!);
  }

  /** The cell's text; a CR before the newline belongs to the line ending, not to the cell. */
  private text(view: Buffer, start: number, end: number): string {
    return view.toString('utf8', start, end > start && view[end - 1] === CR ? end - 1 : end);
  }

  private line(view: Buffer, start: number, viewStart: number): number {
    const c = this.c;
    if (c.header === null) {
      const nl = view.indexOf(NEWLINE, start);
      const end = nl < 0 ? view.length : nl;
      c.setHeader(this.text(view, start, end).split(this.delimiterText));
      this.allocate(c.header!.length, c.batchRows);
      if (!c.firstRowIsData) return end + 1;
      // No header row: the same line is also the first data row.
    }
    const p = this.p;
    let fields = 0;
    let pos = start;
    let end: number;
    for (;;) {
      scanCell(view, pos, this.delimiter);
      if (fields < p) {
        this.values[fields] = scanned.value;
        this.starts[fields] = pos;
        this.ends[fields] = scanned.end;
        this.lengths[fields] = scanned.length;
      }
      fields++;
      end = scanned.end;
      if (end >= view.length || view[end] === NEWLINE) break;
      pos = end + 1;
    }
    const lineEnd = end;
    if (c.admit(fields, () => this.text(view, start, lineEnd).trim() === '')) this.commit(view, viewStart + start);
    return end + 1;
  }

  private allocate(p: number, batchRows: number): void {
    this.p = p;
    this.values = new Float64Array(p);
    this.starts = new Int32Array(p);
    this.ends = new Int32Array(p);
    this.lengths = new Int32Array(p);
    this.texts = new Array<string[] | null>(p).fill(null);
    this.rowStarts = new Float64Array(batchRows);
  }

  private commit(view: Buffer, rowStart: number): void {
    const c = this.c;
    const at = c.inBatch++;
    const row = c.rowCount;
    this.rowStarts[at] = rowStart;
    for (let j = 0; j < this.p; j++) {
      const profile = c.profiles[j];
      const v = this.values[j];
      if (profile.firstText === null && this.fastNumbers && !Number.isNaN(v)) {
        c.numbers[j][at] = profile.addDecimal(v, this.lengths[j], row);
        continue;
      }
      const cell = this.text(view, this.starts[j], this.ends[j]);
      const wasNumeric = profile.firstText === null;
      c.numbers[j][at] = profile.add(cell, row, this.missing);
      if (profile.firstText === null) continue;
      let cells = this.texts[j];
      if (cells === null) {
        cells = this.texts[j] = new Array<string>(c.batchRows);
        if (wasNumeric && at > 0) this.recover(j, at, rowStart, cells);
      }
      cells[at] = cell;
    }
    if (c.inBatch >= c.batchRows) {
      c.flush((j) => this.texts[j]!);
      this.texts.fill(null);
    }
  }

  /** Column j turned to text at batch row `count`: its earlier batch cells, read again from the file (rare). */
  private recover(j: number, count: number, until: number, cells: string[]): void {
    const from = this.rowStarts[0];
    const bytes = Buffer.allocUnsafe(until - from);
    const fd = fs.openSync(this.filePath, 'r');
    try {
      fs.readSync(fd, bytes, 0, bytes.length, from);
    } finally {
      fs.closeSync(fd);
    }
    for (let r = 0; r < count; r++) {
      let start = this.rowStarts[r] - from;
      for (let k = 0; k < j; k++) start = bytes.indexOf(this.delimiter, start) + 1;
      let end = start;
      while (end < bytes.length && bytes[end] !== this.delimiter && bytes[end] !== NEWLINE) end++;
      cells[r] = this.text(bytes, start, end);
    }
  }
}

export async function readQuoteFree(
  filePath: string,
  fileName: string,
  delimiter: string,
  c: RowCollector,
  missing: MissingTest,
  onProgress?: (bytesRead: number, rowsParsed: number) => void,
): Promise<ReadResult> {
  const check = new Utf8Check(fileName);
  const reader = new LineReader(c, missing, delimiter, filePath);
  let carry: Buffer = EMPTY;
  // Chunks of a line longer than a chunk, joined once when its newline arrives: concatenating the
  // carry with every chunk would copy a long line over and over.
  let waiting: Buffer[] = [];
  let waitingBytes = 0;
  let emitted = -1; // file offset where the next checked bytes start (after a byte-order mark)
  for await (const chunk of fs.createReadStream(filePath, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
    const got = check.accept(chunk);
    if (emitted < 0) emitted = check.byteOrderMark ? 3 : 0;
    if (got.indexOf(NEWLINE) < 0) {
      waiting.push(got);
      waitingBytes += got.length;
      emitted += got.length;
      continue;
    }
    const buf = carry.length + waitingBytes > 0 ? Buffer.concat([carry, ...waiting, got]) : got;
    const bufStart = emitted - waitingBytes - carry.length;
    waiting = [];
    waitingBytes = 0;
    emitted += got.length;
    const lastNewline = buf.lastIndexOf(NEWLINE);
    reader.lines(buf.subarray(0, lastNewline + 1), bufStart, false);
    carry = buf.subarray(lastNewline + 1);
    c.checkRagged();
    onProgress?.(check.bytes, c.rowCount);
  }
  const rest = check.finish();
  if (waitingBytes > 0) carry = Buffer.concat([carry, ...waiting]);
  reader.lines(rest.length > 0 ? Buffer.concat([carry, rest]) : carry, emitted - carry.length, true);
  reader.finish();
  return { byteOrderMark: check.byteOrderMark };
}
