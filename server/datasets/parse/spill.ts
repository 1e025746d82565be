/**
 * Column-wise spill file: the parser hands over batches of rows; each batch is written once per
 * column as the cells joined by NUL (NUL cannot occur in accepted text, see text-stream.ts). Reading
 * back one column gathers its segments. Memory stays at one batch of rows plus one column.
 */
import fs from 'node:fs';

interface Segment {
  offset: number;
  length: number;
}

export class ColumnSpill {
  private readonly fd: number;
  private offset = 0;
  private readonly segments: Segment[][];
  closed = false;

  constructor(
    readonly path: string,
    readonly columnCount: number,
  ) {
    this.fd = fs.openSync(path, 'w+');
    this.segments = Array.from({ length: columnCount }, () => []);
  }

  /** rows: row-major cells, each row with columnCount cells. */
  writeBatch(rows: string[][]): void {
    if (rows.length === 0) return;
    const cells: string[] = new Array(rows.length);
    for (let j = 0; j < this.columnCount; j++) {
      for (let i = 0; i < rows.length; i++) cells[i] = rows[i][j];
      const bytes = Buffer.from(cells.join('\0'), 'utf8');
      fs.writeSync(this.fd, bytes, 0, bytes.length, this.offset);
      this.segments[j].push({ offset: this.offset, length: bytes.length });
      this.offset += bytes.length;
    }
  }

  /** Every cell of column j, in row order. */
  readColumn(j: number): string[] {
    const parts: string[][] = [];
    for (const s of this.segments[j]) {
      const buf = Buffer.allocUnsafe(s.length);
      fs.readSync(this.fd, buf, 0, s.length, s.offset);
      parts.push(buf.toString('utf8').split('\0'));
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
