/**
 * Bytes -> text for papaparse, refusing what is not UTF-8 text (see utf8-check.ts) and counting
 * bytes so the caller can report progress.
 */
import { Transform, type TransformCallback } from 'node:stream';
import { Utf8Check } from './utf8-check';

export class Utf8TextStream extends Transform {
  private readonly check: Utf8Check;

  constructor(fileName: string) {
    super({ readableObjectMode: true });
    this.check = new Utf8Check(fileName);
  }

  get bytes(): number {
    return this.check.bytes;
  }

  get byteOrderMark(): boolean {
    return this.check.byteOrderMark;
  }

  override _transform(chunk: Buffer, _enc: BufferEncoding, done: TransformCallback): void {
    try {
      done(null, this.check.accept(chunk).toString('utf8'));
    } catch (error) {
      done(error as Error);
    }
  }

  override _flush(done: TransformCallback): void {
    try {
      const text = this.check.finish().toString('utf8');
      if (text !== '') this.push(text);
      done();
    } catch (error) {
      done(error as Error);
    }
  }
}
