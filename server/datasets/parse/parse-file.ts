/**
 * Reads a CSV/TSV file from disk through UTF-8 checks, validating the header and the shape of every
 * row, profiling each column for type inference, and spilling the cells column by column to a
 * temporary file. Memory: one batch of rows, whatever the file size. Files without quotes (and with
 * one line ending) take the quote-free reader, several times faster; others papaparse. Both feed
 * the same RowCollector, so the result does not depend on the reader.
 */
import fs from 'node:fs';
import type { ParseReport } from '../../../shared/datasets';
import { RowCollector } from './collect';
import { FileProblem } from './errors';
import { checkFirstLine } from './first-line';
import { missingTest, type MissingTest } from './missing';
import type { ColumnProfile } from './profile';
import { isQuoteFree, readQuoteFree } from './read-fast';
import { readWithPapaparse } from './read-papa';
import { detectDelimiter, detectLineEndings } from './sniff';
import type { ColumnSpill } from './spill';
import { readWhitespace, WHITESPACE } from './whitespace';

export type Reader = 'quote-free' | 'papaparse' | 'whitespace';

export interface ParseFileOptions {
  filePath: string;
  fileName: string;
  missingMarkers: string[];
  columnLimit: number;
  /** Where the column spill file goes (deleted by ParsedFile.spill.close()). */
  spillPath: string;
  onProgress?: (bytesRead: number, rowsParsed: number) => void;
  /** Force a reader (tests compare them); by default the quote-free one whenever the file allows. */
  reader?: Reader;
  /** False when the uploader says the first row is data (columns are then named column_1, ...). */
  headerRow?: boolean;
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
  reader: Reader;
  headerRow: boolean;
}

const SAMPLE_BYTES = 64 * 1024;

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

export async function parseCsvFile(opts: ParseFileOptions): Promise<ParsedFile> {
  const { filePath, fileName } = opts;
  const size = fs.statSync(filePath).size;
  if (size === 0) throw new FileProblem(`${fileName} is empty (0 bytes).`);
  const sample = readSample(filePath);
  const delimiter = detectDelimiter(sample, fileName);
  const missing = missingTest(opts.missingMarkers);
  const headerRow = opts.headerRow !== false;
  await checkFirstLine(filePath, fileName, delimiter, opts.columnLimit);
  const c = new RowCollector({ fileName, columnLimit: opts.columnLimit, spillPath: opts.spillPath, missing, firstRowIsData: !headerRow });
  try {
    const whitespace = delimiter === WHITESPACE;
    const reader = whitespace ? 'whitespace' : (opts.reader ?? ((await isQuoteFree(filePath)) ? 'quote-free' : 'papaparse'));
    const { byteOrderMark } =
      reader === 'whitespace'
        ? await readWhitespace(filePath, fileName, c, missing, opts.onProgress)
        : await (reader === 'quote-free' ? readQuoteFree : readWithPapaparse)(filePath, fileName, delimiter, c, missing, opts.onProgress);
    return {
      header: c.header!,
      rowCount: c.rowCount,
      blankLinesSkipped: c.blank,
      delimiter,
      byteOrderMark,
      lineEndings: detectLineEndings(sample),
      profiles: c.profiles,
      missing,
      spill: c.spill!,
      reader,
      headerRow,
    };
  } catch (error) {
    c.close();
    throw error;
  }
}
