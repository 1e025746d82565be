/**
 * The general reader: papaparse in streaming mode (quotes, embedded delimiters and newlines, any
 * line ending), fed by the UTF-8 checks. Memory: one batch of rows, whatever the file size.
 */
import fs from 'node:fs';
import { pipeline } from 'node:stream';
import Papa from 'papaparse';
import type { RowCollector } from './collect';
import { FileProblem } from './errors';
import type { MissingTest } from './missing';
import { Utf8TextStream } from './text-stream';

export interface ReadResult {
  byteOrderMark: boolean;
}

export function readWithPapaparse(
  filePath: string,
  fileName: string,
  delimiter: string,
  c: RowCollector,
  missing: MissingTest,
  onProgress?: (bytesRead: number, rowsParsed: number) => void,
): Promise<ReadResult> {
  return new Promise<ReadResult>((resolve, reject) => {
    let batch: string[][] = [];
    let settled = false;
    const input = fs.createReadStream(filePath, { highWaterMark: 1 << 20 });
    const text = new Utf8TextStream(fileName);
    const fail = (error: unknown) => {
      if (settled) return;
      settled = true;
      input.destroy();
      reject(error);
    };
    pipeline(input, text, (error) => {
      if (error) fail(error);
    });
    const cells = (j: number) => batch.map((row) => row[j]);

    const onRow = (row: string[]) => {
      if (c.header === null) {
        c.setHeader(row);
        if (!c.firstRowIsData) return;
      }
      if (!c.admit(row.length, () => row[0].trim() === '')) return;
      const at = c.inBatch++;
      for (let j = 0; j < row.length; j++) c.numbers[j][at] = c.profiles[j].add(row[j], c.rowCount, missing);
      batch.push(row);
      if (c.inBatch >= c.batchRows) {
        c.flush(cells);
        batch = [];
      }
    };

    Papa.parse<string[]>(text as unknown as File, {
      delimiter,
      chunk(results, parser) {
        if (settled) return parser.abort();
        try {
          const quote = results.errors.find((e) => e.type === 'Quotes');
          if (quote) {
            const row = c.fileRows + (quote.row ?? 0) + 1;
            const what = quote.code === 'MissingQuotes' ? 'a quoted field is never closed (a " is missing)' : 'a closing quote is followed by other characters';
            throw new FileProblem(`${fileName}, row ${row} ${c.rowNote}: ${what}.`);
          }
          for (const row of results.data) onRow(row);
          c.checkRagged();
          onProgress?.(text.bytes, c.rowCount);
        } catch (error) {
          fail(error); // before abort(), which calls complete()
          parser.abort();
        }
      },
      complete() {
        if (settled) return;
        try {
          c.finish(cells);
          settled = true;
          resolve({ byteOrderMark: text.byteOrderMark });
        } catch (error) {
          fail(error);
        }
      },
      error(error: Error) {
        fail(error);
      },
    });
  });
}
