/**
 * Text files whose columns are separated by runs of spaces or tabs, as older statistical tools
 * export them (aligned columns, often names in quotes like 'GPA', sometimes no header row). A line is
 * split into tokens: a run of characters other than space and tab, or a quoted token ('...' or
 * "..."), whose quotes are removed and inside which spaces are kept. Lines are read as bytes and
 * split once each; cells go to the same RowCollector as the CSV readers.
 *
 * Some tools write a row name before each row but no name for that column in the header (one name
 * fewer than the fields of every row): when the first data row has exactly one field more than the
 * header, the first column is named `row_name`.
 */
import fs from 'node:fs';
import type { RowCollector } from './collect';
import type { MissingTest } from './missing';
import type { ReadResult } from './read-papa';
import { Utf8Check } from './utf8-check';

/** The delimiter value that stands for "runs of spaces or tabs" (in the parse report too). */
export const WHITESPACE = 'whitespace';
/** The name given to an unnamed first column of row names. */
export const ROW_NAME_COLUMN = 'row_name';

const isBlank = (ch: string) => ch === ' ' || ch === '\t';

/** The tokens of one line (a trailing CR is part of the line ending). */
export function splitWhitespace(line: string): string[] {
  const text = line.endsWith('\r') ? line.slice(0, -1) : line;
  const out: string[] = [];
  let i = 0;
  while (i < text.length) {
    while (i < text.length && isBlank(text[i])) i++;
    if (i >= text.length) break;
    const quote = text[i];
    if (quote === "'" || quote === '"') {
      // A quoted token ends at the matching quote followed by a blank or the end of the line.
      let j = i + 1;
      while (j < text.length && !(text[j] === quote && (j + 1 === text.length || isBlank(text[j + 1])))) j++;
      if (j < text.length) {
        out.push(text.slice(i + 1, j));
        i = j + 1;
        continue;
      }
    }
    let j = i;
    while (j < text.length && !isBlank(text[j])) j++;
    out.push(text.slice(i, j));
    i = j;
  }
  return out;
}

export async function readWhitespace(
  filePath: string,
  fileName: string,
  c: RowCollector,
  missing: MissingTest,
  onProgress?: (bytesRead: number, rowsParsed: number) => void,
): Promise<ReadResult> {
  const check = new Utf8Check(fileName);
  let batch: string[][] = [];
  const cells = (j: number) => batch.map((row) => row[j]);
  // The header row waits for the first data row, which tells whether it lacks a row-name column.
  let names: string[] | null = null;
  let blanksAfterNames = 0;
  const setNames = (fields: number | null) => {
    const header = names!;
    c.setHeader(fields === header.length + 1 ? [ROW_NAME_COLUMN, ...header] : header);
    for (; blanksAfterNames > 0; blanksAfterNames--) c.admit(1, () => true);
  };
  const onLine = (line: string) => {
    const row = splitWhitespace(line);
    if (c.header === null && names === null) {
      if (c.firstRowIsData || row.length === 0) {
        c.setHeader(row.length === 0 ? [''] : row);
        if (!c.firstRowIsData) return;
      } else {
        names = row;
        return;
      }
    }
    if (c.header === null) {
      if (row.length === 0) {
        blanksAfterNames++;
        return;
      }
      setNames(row.length);
    }
    if (!c.admit(Math.max(1, row.length), () => row.length === 0)) return;
    const at = c.inBatch++;
    for (let j = 0; j < row.length; j++) c.numbers[j][at] = c.profiles[j].add(row[j], c.rowCount, missing);
    batch.push(row);
    if (c.inBatch >= c.batchRows) {
      c.flush(cells);
      batch = [];
    }
  };
  // Pieces of a line not yet ended, joined once when its newline arrives (never re-copied per chunk).
  let pending: string[] = [];
  const decoder = new TextDecoder('utf-8');
  for await (const chunk of fs.createReadStream(filePath, { highWaterMark: 1 << 20 }) as AsyncIterable<Buffer>) {
    const text = decoder.decode(check.accept(chunk), { stream: true });
    let start = 0;
    for (let nl = text.indexOf('\n'); nl !== -1; nl = text.indexOf('\n', start)) {
      pending.push(text.slice(start, nl));
      onLine(pending.length === 1 ? pending[0] : pending.join(''));
      pending = [];
      start = nl + 1;
    }
    if (start < text.length) pending.push(text.slice(start));
    c.checkRagged();
    onProgress?.(check.bytes, c.rowCount);
  }
  // The last line: empty when the file ends with a newline, which the collector counts as the CSV
  // readers do (a blank line, taken back at the end).
  pending.push(decoder.decode(check.finish()));
  onLine(pending.join(''));
  if (c.header === null && names !== null) setNames(null); // names and no data row: the collector says so
  c.finish(cells);
  return { byteOrderMark: check.byteOrderMark };
}
