/**
 * Streams a CSV/TSV file from disk through UTF-8 checks and papaparse (streaming mode), validating
 * the header and the shape of every row, profiling each column for type inference, and spilling
 * the cells column by column to a temporary file. Memory: one batch of rows, whatever the file size.
 */
import fs from 'node:fs';
import { pipeline } from 'node:stream';
import Papa from 'papaparse';
import type { ParseReport } from '../../../shared/datasets';
import { FileProblem } from './errors';
import { checkHeader } from './header';
import { missingTest, type MissingTest } from './missing';
import { ColumnProfile } from './profile';
import { detectDelimiter, detectLineEndings } from './sniff';
import { ColumnSpill } from './spill';
import { Utf8TextStream } from './text-stream';

export interface ParseFileOptions {
  filePath: string;
  fileName: string;
  missingMarkers: string[];
  columnLimit: number;
  /** Where the column spill file goes (deleted by ParsedFile.spill.close()). */
  spillPath: string;
  onProgress?: (bytesRead: number, rowsParsed: number) => void;
}

export interface ParsedFile {
  header: string[];
  rowCount: number;
  blankLinesSkipped: number;
  delimiter: string;
  byteOrderMark: boolean;
  lineEndings: ParseReport['lineEndings'];
  profiles: ColumnProfile[];
  missing: MissingTest;
  /** The caller must close it (it deletes its temporary file). */
  spill: ColumnSpill;
}

const SAMPLE_BYTES = 64 * 1024;
const RAGGED_REPORTED = 5;

function readSample(filePath: string): string {
  const fd = fs.openSync(filePath, 'r');
  try {
    const buf = Buffer.alloc(SAMPLE_BYTES);
    const n = fs.readSync(fd, buf, 0, SAMPLE_BYTES, 0);
    return buf.subarray(0, n).toString('utf8').replace(/^\uFEFF/, '');
  } finally {
    fs.closeSync(fd);
  }
}

export function parseCsvFile(opts: ParseFileOptions): Promise<ParsedFile> {
  const { filePath, fileName } = opts;
  const size = fs.statSync(filePath).size;
  if (size === 0) return Promise.reject(new FileProblem(`${fileName} is empty (0 bytes).`));
  const sample = readSample(filePath);
  const delimiter = detectDelimiter(sample, fileName);
  const missing = missingTest(opts.missingMarkers);

  return new Promise<ParsedFile>((resolve, reject) => {
    let header: string[] | null = null;
    let profiles: ColumnProfile[] = [];
    let spill: ColumnSpill | null = null;
    let batch: string[][] = [];
    let batchRows = 1000;
    let numbers: Float64Array[] = []; // per column, the batch's cells as numbers
    let fileRows = 0; // rows seen by the parser, header included
    let rowCount = 0;
    let blank = 0;
    let lastBlank = false;
    const ragged: number[] = [];
    let settled = false;

    const input = fs.createReadStream(filePath, { highWaterMark: 1 << 20 });
    const text = new Utf8TextStream(fileName);
    const fail = (error: unknown) => {
      if (settled) return;
      settled = true;
      input.destroy();
      spill?.close();
      reject(error);
    };
    pipeline(input, text, (error) => {
      if (error) fail(error);
    });

    const onRow = (row: string[]) => {
      fileRows++;
      if (header === null) {
        header = checkHeader(row, fileName, opts.columnLimit);
        profiles = header.map((h) => new ColumnProfile(h));
        spill = new ColumnSpill(opts.spillPath, header.length, missing);
        batchRows = Math.max(256, Math.floor(400_000 / header.length));
        numbers = header.map(() => new Float64Array(batchRows));
        return;
      }
      lastBlank = row.length === 1 && row[0].trim() === '';
      if (lastBlank) {
        blank++;
        return;
      }
      if (row.length !== header.length) {
        ragged.push(fileRows);
        return;
      }
      if (ragged.length > 0) return;
      rowCount++;
      const at = batch.length;
      for (let j = 0; j < row.length; j++) numbers[j][at] = profiles[j].add(row[j], rowCount, missing);
      batch.push(row);
      if (batch.length >= batchRows) {
        spill!.writeBatch(batch, allNumbers, numbers);
        batch = [];
      }
    };
    const allNumbers = (j: number) => profiles[j].firstText === null;

    Papa.parse<string[]>(text as unknown as File, {
      delimiter,
      chunk(results, parser) {
        if (settled) return parser.abort();
        try {
          const quote = results.errors.find((e) => e.type === 'Quotes');
          if (quote) {
            const row = fileRows + (quote.row ?? 0) + 1;
            const what = quote.code === 'MissingQuotes' ? 'a quoted field is never closed (a " is missing)' : 'a closing quote is followed by other characters';
            throw new FileProblem(`${fileName}, row ${row} (the header is row 1): ${what}.`);
          }
          for (const row of results.data) onRow(row);
          if (ragged.length >= RAGGED_REPORTED) throw raggedProblem();
          opts.onProgress?.(text.bytes, rowCount);
        } catch (error) {
          fail(error); // before abort(), which calls complete()
          parser.abort();
        }
      },
      complete() {
        if (settled) return;
        try {
          if (header === null) throw new FileProblem(`${fileName} has no header row: it contains only blank lines.`);
          if (ragged.length > 0) throw raggedProblem();
          if (lastBlank) blank--; // the newline that ends the last line
          if (rowCount === 0) throw new FileProblem(`${fileName} has a header row but no data rows.`);
          spill!.writeBatch(batch, allNumbers, numbers);
          batch = [];
          settled = true;
          resolve({
            header,
            rowCount,
            blankLinesSkipped: blank,
            delimiter,
            byteOrderMark: text.byteOrderMark,
            lineEndings: detectLineEndings(sample),
            profiles,
            missing,
            spill: spill!,
          });
        } catch (error) {
          fail(error);
        }
      },
      error(error: Error) {
        fail(error);
      },
    });

    function raggedProblem(): FileProblem {
      const width = header?.length ?? 0;
      const more = ragged.length >= RAGGED_REPORTED ? ' and possibly more' : '';
      const rows = ragged.length === 1 ? `row ${ragged[0]} (the header is row 1) does` : `rows ${ragged.join(', ')}${more} (the header is row 1) do`;
      return new FileProblem(
        `${fileName}: ${rows} not have ${width} fields like the header. ` +
          'Check for unquoted delimiters inside values or missing fields.',
      );
    }
  });
}
