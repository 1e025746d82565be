/** Parsed cells -> stored columns, their schema and summaries, plus the parse report's notes. */
import type { ColumnSchema, ColumnType, ParseReport } from '../../../shared/datasets';
import { COLUMN_TYPE_LABELS } from '../../../shared/datasets';
import type { Inference } from '../parse/infer';
import { DECIMAL, type MissingTest } from '../parse/missing';
import type { ParsedFile } from '../parse/parse-file';
import type { ColumnSpill } from '../parse/spill';
import { describeDelimiter } from '../parse/sniff';
import { bytesToInt32, encodeCodes, encodeFloat64, encodeText, typedBytes } from '../storage/codec';
import { loadAs, type StoredColumn } from '../storage/convert';
import { summarize } from '../summary';

/** Column j of the spill in its stored form; numeric columns were parsed to numbers while streaming. */
export function encodeColumn(spill: ColumnSpill, j: number, name: string, inference: Inference, missing: MissingTest): StoredColumn {
  if (inference.storage === 'float64') {
    const data = spill.allNumbers(j) ? spill.readNumbers(j) : encodeFloat64(spill.readCells(j), missing);
    return { name, storage: 'float64', data: typedBytes(data), levels: null };
  }
  const cells = spill.readCells(j);
  if (inference.storage === 'codes') {
    const { codes, levels } = encodeCodes(cells, missing);
    return { name, storage: 'codes', data: typedBytes(codes), levels };
  }
  return { name, storage: 'text', data: encodeText(cells, missing), levels: null };
}

/** Stored numbers are summarised as numbers whatever the type (a row number's min and max help). */
function summarizeStored(stored: StoredColumn, type: ColumnType) {
  if (stored.storage === 'codes' && (type === 'binary' || type === 'categorical')) {
    // Stored codes already index levels in their sorted order (encodeCodes): no round trip through text.
    return summarize({ name: stored.name, kind: 'categorical', codes: bytesToInt32(stored.data), levels: stored.levels });
  }
  if (stored.storage !== 'float64' || type === 'binary' || type === 'categorical') return summarize(loadAs(stored, type));
  const s = summarize(loadAs(stored, 'numeric'));
  return type === 'numeric' ? s : { count: s.count, missing: s.missing, distinct: s.distinct, min: s.min, max: s.max };
}

export function columnSchema(stored: StoredColumn, position: number, inference: Inference): ColumnSchema {
  return {
    name: stored.name,
    position,
    type: inference.type,
    inferredType: inference.type,
    reason: inference.reason,
    excluded: inference.excluded,
    overridden: false,
    summary: summarizeStored(stored, inference.type),
  };
}

export function buildReport(parsed: ParsedFile, fileName: string, inferences: Inference[]): ParseReport {
  const notes: string[] = [`Delimiter: ${describeDelimiter(parsed.delimiter)} (detected).`];
  if (!parsed.headerRow) {
    notes.push(`The first row was read as data, as the uploader chose: the columns are named column_1 to column_${parsed.header.length}.`);
  } else if (parsed.header.every((h) => DECIMAL.test(h))) {
    notes.push('Every name in the first row is a number: if that row is data, upload the file again saying that the first row is data.');
  }
  if (parsed.byteOrderMark) notes.push('A UTF-8 byte-order mark at the start of the file was removed.');
  if (parsed.blankLinesSkipped > 0) notes.push(`${parsed.blankLinesSkipped} blank line(s) were skipped.`);
  const counts = new Map<string, number>();
  inferences.forEach((inf) => counts.set(inf.type, (counts.get(inf.type) ?? 0) + 1));
  notes.push(`Inferred column types: ${[...counts].map(([t, n]) => `${n} ${COLUMN_TYPE_LABELS[t as keyof typeof COLUMN_TYPE_LABELS].toLowerCase()}`).join(', ')}.`);
  inferences.forEach((inf, j) => {
    if (inf.excluded) notes.push(`Column "${parsed.header[j]}" is left out of modelling: ${inf.reason}`);
    if (parsed.spill.mixed(j)) {
      notes.push(`Column "${parsed.header[j]}" held only numbers for its first rows, so those values are kept in their shortest form (e.g. 1.50 as 1.5); the original file keeps them as written.`);
    }
  });
  const missingCols = parsed.profiles.filter((p) => p.missing > 0);
  if (missingCols.length > 0) {
    const shown = missingCols.slice(0, 10).map((p) => `"${p.name}" (${p.missing})`).join(', ');
    notes.push(`Missing values in ${missingCols.length} column(s): ${shown}${missingCols.length > 10 ? ', ...' : ''}.`);
  }
  return {
    fileName,
    delimiter: parsed.delimiter,
    headerRow: parsed.headerRow,
    encoding: 'utf-8',
    byteOrderMark: parsed.byteOrderMark,
    lineEndings: parsed.lineEndings,
    missingMarkers: parsed.missing.markers,
    rowCount: parsed.rowCount,
    columnCount: parsed.header.length,
    blankLinesSkipped: parsed.blankLinesSkipped,
    notes,
  };
}
