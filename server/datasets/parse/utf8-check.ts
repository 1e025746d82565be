/**
 * Byte-level checks that a file is UTF-8 text, shared by both CSV readers: refuses ZIP archives
 * (spreadsheet workbooks), NUL bytes (binary files) and malformed UTF-8, each reported with the line
 * where it occurs; strips a leading byte-order mark. Chunks may split a multi-byte character, so the
 * incomplete tail is held back for the next chunk.
 */
import { isUtf8 } from 'node:buffer';
import { FileProblem } from './errors';
import { completePrefixLength, firstInvalidUtf8 } from './utf8';

const ZIP_MAGIC = Buffer.from('PK\u0003\u0004', 'latin1');
const EMPTY: Buffer = Buffer.alloc(0);

function countNewlines(buf: Buffer, end: number): number {
  let n = 0;
  for (let i = buf.indexOf(0x0a); i !== -1 && i < end; i = buf.indexOf(0x0a, i + 1)) n++;
  return n;
}

export class Utf8Check {
  /** Bytes read from the file so far (for progress). */
  bytes = 0;
  byteOrderMark = false;
  private lines = 0;
  private tail: Buffer = EMPTY;
  private first = true;

  constructor(private readonly fileName: string) {}

  /** The checked bytes of this chunk that can be decoded now (a split character waits for the next). */
  accept(chunk: Buffer): Buffer {
    this.bytes += chunk.length;
    let buf = this.tail.length > 0 ? Buffer.concat([this.tail, chunk]) : chunk;
    if (this.first) {
      this.first = false;
      if (buf.subarray(0, 4).equals(ZIP_MAGIC)) {
        throw new FileProblem(`${this.fileName} is a ZIP archive or a spreadsheet workbook, not CSV text. Save or export it as CSV (UTF-8) and upload that.`);
      }
      if (buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf) {
        this.byteOrderMark = true;
        buf = buf.subarray(3);
      }
    }
    return this.check(buf, false);
  }

  /** What is left at the end of the file (an unfinished character is an error here). */
  finish(): Buffer {
    return this.check(this.tail, true);
  }

  private check(buf: Buffer, last: boolean): Buffer {
    const nul = buf.indexOf(0);
    if (nul !== -1) {
      const line = this.lines + countNewlines(buf, nul) + 1;
      throw new FileProblem(`${this.fileName} contains binary data (a NUL byte on line ${line}), so it is not a text CSV file. Export the data as CSV text and upload that.`);
    }
    const cut = last ? buf.length : completePrefixLength(buf);
    const whole = buf.subarray(0, cut);
    if (!isUtf8(whole)) {
      const at = firstInvalidUtf8(whole);
      const bad = at >= 0 ? at : cut;
      const line = this.lines + countNewlines(whole, bad) + 1;
      const byte = whole[bad] === undefined ? 'an unfinished character' : `byte 0x${whole[bad].toString(16).toUpperCase()}`;
      throw new FileProblem(`${this.fileName}, line ${line}: the text is not valid UTF-8 (${byte}). Save the file with UTF-8 encoding and upload it again.`);
    }
    this.lines += countNewlines(whole, whole.length);
    this.tail = cut < buf.length ? Buffer.from(buf.subarray(cut)) : EMPTY;
    return whole;
  }
}
