/**
 * Guesses the delimiter and line endings from the first part of the file. Each candidate parses the
 * sample; the winner gives the same field count (more than one) on the most lines, ties broken by
 * more fields. A .tsv name or a tab-only header prefers the tab. (Common practice, as in Python's
 * csv.Sniffer: consistency of field counts across lines.) Runs of spaces or tabs (whitespace.ts) are
 * scored the same way and win only when strictly more consistent or wider than every delimiter.
 */
import Papa from 'papaparse';
import type { ParseReport } from '../../../shared/datasets';
import { splitWhitespace, WHITESPACE } from './whitespace';

const CANDIDATES = [',', '\t', ';', '|'] as const;

export function detectLineEndings(sample: string): ParseReport['lineEndings'] {
  const lf = sample.indexOf('\n');
  if (lf > 0 && sample[lf - 1] === '\r') return 'CRLF';
  if (lf >= 0) return 'LF';
  return sample.includes('\r') ? 'CR' : 'none';
}

export function detectDelimiter(sample: string, fileName: string): string {
  // Drop a possibly cut last line so it does not count as inconsistent.
  const cut = sample.lastIndexOf('\n');
  const text = cut > 0 ? sample.slice(0, cut) : sample;
  let best: { delimiter: string; score: number; fields: number } = { delimiter: fileName.toLowerCase().endsWith('.tsv') ? '\t' : ',', score: 0, fields: 1 };
  for (const delimiter of CANDIDATES) {
    const rows = Papa.parse<string[]>(text, { delimiter, preview: 50, skipEmptyLines: true }).data;
    if (rows.length === 0) continue;
    const fields = rows[0].length;
    if (fields < 2) continue;
    const consistent = rows.filter((r) => r.length === fields).length / rows.length;
    const score = consistent * 1000 + Math.min(fields, 999);
    if (score > best.score) best = { delimiter, score, fields };
  }
  const lines = text.split('\n').filter((l) => l.trim() !== '').slice(0, 50);
  if (lines.length > 0) {
    let counts = lines.map((l) => splitWhitespace(l).length);
    const named = counts[0];
    // A header without a name for the row-name column (whitespace.ts): judge the rows below it, but
    // credit only the named columns, so a delimiter that explains the file as well still wins.
    if (counts.length > 2 && counts[1] === counts[0] + 1) counts = counts.slice(1);
    const fields = counts[0];
    const consistent = counts.filter((n) => n === fields).length / counts.length;
    const score = fields < 2 ? 0 : consistent * 1000 + Math.min(named, 999);
    if (score > best.score) return WHITESPACE;
  }
  return best.delimiter;
}

export function describeDelimiter(d: string): string {
  if (d === WHITESPACE) return 'runs of spaces or tabs';
  return d === '\t' ? 'tab' : d === ',' ? 'comma' : d === ';' ? 'semicolon' : d === '|' ? 'vertical bar' : JSON.stringify(d);
}
