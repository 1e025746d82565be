/**
 * Bytes -> text for the CSV parser, refusing what is not UTF-8 text: NUL bytes (binary files such as
 * spreadsheets or archives) and malformed UTF-8, each reported with the line where it occurs. Strips
 * a leading byte-order mark and counts bytes so the caller can report progress.
 */
import { isUtf8 } from 'node:buffer';
import { Transform, type TransformCallback } from 'node:stream';
import { FileProblem } from './errors';
import { completePrefixLength, firstInvalidUtf8 } from './utf8';

const ZIP_MAGIC = Buffer.from('PK\u0003\u0004', 'latin1');

function countNewlines(buf: Buffer, end: number): number {
  let n = 0;
  for (let i = buf.indexOf(0x0a); i !== -1 && i < end; i = buf.indexOf(0x0a, i + 1)) n++;
  return n;
}

export class Utf8TextStream extends Transform {
  bytes = 0;
  byteOrderMark = false;
  private lines = 0;
  private tail: Buffer = Buffer.alloc(0);
  private first = true;

  constructor(private readonly fileName: string) {
    super({ readableObjectMode: true });
  }

  override _transform(chunk: Buffer, _enc: BufferEncoding, done: TransformCallback): void {
    this.bytes += chunk.length;
    let buf = this.tail.length > 0 ? Buffer.concat([this.tail, chunk]) : chunk;
    if (this.first) {
      this.first = false;
      if (buf.subarray(0, 4).equals(ZIP_MAGIC)) {
        return done(new FileProblem(`${this.fileName} is a ZIP archive or a spreadsheet workbook, not CSV text. Save or export it as CSV (UTF-8) and upload that.`));
      }
      if (buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf) {
        this.byteOrderMark = true;
        buf = buf.subarray(3);
      }
    }
    try {
      done(null, this.decode(buf, false));
    } catch (error) {
      done(error as Error);
    }
  }

  override _flush(done: TransformCallback): void {
    try {
      const text = this.decode(this.tail, true);
      if (text !== '') this.push(text);
      done();
    } catch (error) {
      done(error as Error);
    }
  }

  private decode(buf: Buffer, last: boolean): string {
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
    this.tail = Buffer.from(buf.subarray(cut));
    return whole.toString('utf8');
  }
}
