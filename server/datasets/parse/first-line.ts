/**
 * The first line's size and field count, checked while streaming before either reader runs: a
 * header row far longer than any list of names, or with more fields than the column limit, is
 * refused after reading at most HEADER_BYTE_LIMIT bytes, with counters only (no line is assembled).
 * Fields are counted at the delimiter outside double quotes, or for whitespace-separated files at the
 * start of each run of other characters.
 */
import fs from 'node:fs';
import { FileProblem } from './errors';
import { WHITESPACE } from './whitespace';

/** 5,000 names of 200 characters would fit: no real header row is longer. */
export const HEADER_BYTE_LIMIT = 1 << 20;

const LF = 10;
const CR = 13;
const QUOTE = 0x22;
const SPACE = 32;
const TAB = 9;

export interface FirstLine {
  fields: number;
  /** Bytes read to find the end of the first line (or to give up). */
  bytesScanned: number;
}

export async function checkFirstLine(filePath: string, fileName: string, delimiter: string, columnLimit: number): Promise<FirstLine> {
  const whitespace = delimiter === WHITESPACE;
  const d = whitespace ? -1 : delimiter.charCodeAt(0);
  let fields = whitespace ? 0 : 1;
  let inQuotes = false;
  let inToken = false;
  let atFieldStart = true;
  let scanned = 0;
  let ended = false;
  const bom = 3;
  const input = fs.createReadStream(filePath, { highWaterMark: 64 * 1024, start: 0, end: HEADER_BYTE_LIMIT + bom - 1 });
  try {
    for await (const chunk of input as AsyncIterable<Buffer>) {
      // A byte-order mark before the first name is not part of it.
      let i = scanned === 0 && chunk[0] === 0xef && chunk[1] === 0xbb && chunk[2] === 0xbf ? 3 : 0;
      for (; i < chunk.length; i++) {
        const b = chunk[i];
        if (whitespace) {
          if (b === LF) {
            ended = true;
            break;
          }
          const blank = b === SPACE || b === TAB || b === CR;
          if (!blank && !inToken) fields++;
          inToken = !blank;
          continue;
        }
        // RFC 4180 quoting: a quote opens a field only at its start; "" inside is an escaped quote.
        if (inQuotes) {
          if (b === QUOTE) inQuotes = chunk[i + 1] === QUOTE ? (i++, true) : false;
          continue;
        }
        if (b === QUOTE && atFieldStart) inQuotes = true;
        else if (b === LF) {
          ended = true;
          break;
        } else if (b === d) fields++;
        atFieldStart = b === d;
      }
      scanned += i;
      if (ended) break;
    }
  } finally {
    input.destroy();
  }
  if (!ended && fs.statSync(filePath).size > scanned) {
    throw new FileProblem(
      `${fileName}: the first line is longer than ${HEADER_BYTE_LIMIT / (1 << 20)} MB without a line break, far longer than a row of column names; ` +
        'check that the file is text with one row per line.',
    );
  }
  if (fields > columnLimit) throw new FileProblem(`${fileName} has ${fields} columns; the limit is ${columnLimit}.`);
  return { fields, bytesScanned: scanned };
}
