/**
 * The cleaned table as CSV (RFC 4180 quoting), typed as the version says, missing cells empty.
 * Spreadsheet formula injection is neutralised as OWASP's "CSV Injection" page advises: a text cell
 * starting with =, +, -, @, tab or carriage return gets a leading apostrophe. Numbers in numeric
 * columns are written as numbers, so -3.5 stays -3.5.
 *
 * Memory stays bounded whatever the version's size: the CSV is produced a block of rows at a time,
 * each column's block read from PostgreSQL as a slice of its stored bytes (fixed-width numbers and
 * codes by position, text by a cursor over its NUL-separated cells).
 */
import type { Database } from '../../db/client';
import { listColumnStorage, readColumnBytes } from '../data/uploads';
import type { Executor } from '../data/executor';
import { bytesToFloat64, bytesToInt32 } from '../storage/codec';
import { ConversionProblem } from '../storage/convert';
import { DECIMAL } from '../parse/missing';
import { requireVersion } from './datasets';
import type { ColumnType } from '../../../shared/datasets';

const FORMULA_START = /^[=+\-@\t\r]/;
/** About this many cells per block (a block of a 20-column table is 25,000 rows). */
const BLOCK_CELLS = 500_000;
/** Bytes of a text column read per query. */
const TEXT_WINDOW = 1 << 20;

export function neutralise(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

/** A text column's cells in order, fetched a window of bytes at a time. */
class TextCursor {
  private pending: Buffer = Buffer.alloc(0);
  private fetched = 0;

  constructor(
    private readonly db: Executor,
    private readonly uploadId: string,
    private readonly position: number,
    private readonly total: number,
  ) {}

  async take(n: number): Promise<(string | null)[]> {
    const out: (string | null)[] = [];
    while (out.length < n) {
      const nul = this.pending.indexOf(0);
      if (nul < 0 && this.fetched < this.total) {
        const more = await readColumnBytes(this.db, this.uploadId, this.position, this.fetched, TEXT_WINDOW);
        if (more.length === 0) break;
        this.fetched += more.length;
        this.pending = this.pending.length > 0 ? Buffer.concat([this.pending, more]) : more;
        continue;
      }
      const end = nul < 0 ? this.pending.length : nul;
      const cell = this.pending.toString('utf8', 0, end);
      out.push(cell === 'm' ? null : cell.slice(1)); // codec.ts: "v" + value, or "m" for missing
      this.pending = this.pending.subarray(nul < 0 ? end : end + 1);
    }
    if (out.length < n) throw new Error(`Stored text column ${this.position} ends after ${out.length} of the expected cells.`);
    return out;
  }
}

interface ColumnReader {
  /** The CSV fields of rows [offset, offset + n). */
  fields(offset: number, n: number): Promise<string[]>;
}

function textField(name: string, type: ColumnType, cell: string | null, row: number): string {
  if (cell === null) return '';
  if (type !== 'numeric') return csvField(neutralise(cell));
  // A number column stored as text or codes (its type was changed): written as a number.
  if (!DECIMAL.test(cell)) throw new ConversionProblem(`Column "${name}" cannot be numbers: "${cell}" in data row ${row + 1} is not a number.`);
  return String(Number(cell));
}

function columnReader(db: Executor, uploadId: string, meta: Awaited<ReturnType<typeof listColumnStorage>>[number], name: string, type: ColumnType): ColumnReader {
  const { position } = meta;
  if (meta.storage === 'float64') {
    // Stored numbers are written as numbers whatever the column's type (no apostrophe on -3.5).
    return {
      async fields(offset, n) {
        const values = bytesToFloat64(await readColumnBytes(db, uploadId, position, offset * 8, n * 8));
        return Array.from(values, (x) => (Number.isNaN(x) ? '' : String(x)));
      },
    };
  }
  if (meta.storage === 'codes') {
    const levels = meta.levels ?? [];
    return {
      async fields(offset, n) {
        const codes = bytesToInt32(await readColumnBytes(db, uploadId, position, offset * 4, n * 4));
        return Array.from(codes, (k, i) => textField(name, type, k < 0 ? null : levels[k], offset + i));
      },
    };
  }
  const cursor = new TextCursor(db, uploadId, position, meta.bytes);
  return {
    async fields(offset, n) {
      return (await cursor.take(n)).map((cell, i) => textField(name, type, cell, offset + i));
    },
  };
}

export async function prepareCleanedCsv(db: Database, scope: { workspaceId: string; datasetId: string; number: number }) {
  const { dataset, version } = await requireVersion(db, scope.workspaceId, scope.datasetId, scope.number);
  const fileName = `${dataset.name.replace(/[^\w.-]+/g, '_')}-v${version.number}-cleaned.csv`;
  return {
    fileName,
    /** The CSV text, a block of rows at a time (for stream.pipeline). */
    async *chunks(): AsyncGenerator<string> {
      const meta = await listColumnStorage(db, version.uploadId);
      const readers = meta.map((m, j) => columnReader(db, version.uploadId, m, version.columns[j].name, version.columns[j].type));
      yield `${version.columns.map((c) => csvField(neutralise(c.name))).join(',')}\r\n`;
      const blockRows = Math.max(1, Math.floor(BLOCK_CELLS / Math.max(1, readers.length)));
      for (let offset = 0; offset < version.rowCount; offset += blockRows) {
        const n = Math.min(blockRows, version.rowCount - offset);
        const columns: string[][] = [];
        for (const reader of readers) columns.push(await reader.fields(offset, n));
        const lines = new Array<string>(n);
        for (let i = 0; i < n; i++) {
          let line = columns[0][i];
          for (let j = 1; j < columns.length; j++) line += `,${columns[j][i]}`;
          lines[i] = line;
        }
        yield `${lines.join('\r\n')}\r\n`;
      }
    },
  };
}
