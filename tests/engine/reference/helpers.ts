import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { DesignMatrix } from '../../../server/engine/types';

/** Root of the repository, for reading fixtures under datasets/. */
export const repoRoot = fileURLToPath(new URL('../../../', import.meta.url));

export function readJson<T>(relativePath: string): T {
  return JSON.parse(readFileSync(repoRoot + relativePath, 'utf8')) as T;
}

/** A column-major design from named columns, in the given order. */
export function designFrom(columns: Record<string, number[]>, order = Object.keys(columns)): DesignMatrix {
  const n = columns[order[0]].length;
  const x = new Float64Array(n * order.length);
  order.forEach((name, j) => x.set(columns[name], j * n));
  return { n, p: order.length, x, terms: [...order] };
}

/** Column-major design from row-major rows (as numpy writes them). */
export function designFromRows(rows: number[][], terms: string[]): DesignMatrix {
  const n = rows.length;
  const p = terms.length;
  const x = new Float64Array(n * p);
  for (let i = 0; i < n; i++) for (let j = 0; j < p; j++) x[j * n + i] = rows[i][j];
  return { n, p, x, terms: [...terms] };
}

/** A numeric CSV from datasets/ (header row, comma-separated, no quoting) and its sha256. */
export function readNumericCsv(relativePath: string): { header: string[]; columns: Record<string, number[]>; sha256: string } {
  const raw = readFileSync(repoRoot + relativePath);
  const lines = raw.toString('utf8').trim().split('\n');
  const header = lines[0].split(',');
  const columns: Record<string, number[]> = Object.fromEntries(header.map((h) => [h, [] as number[]]));
  lines.slice(1).forEach((line, i) => {
    const cells = line.split(',');
    if (cells.length !== header.length) throw new Error(`${relativePath} row ${i + 2}: ${cells.length} cells, expected ${header.length}`);
    cells.forEach((cell, j) => columns[header[j]].push(Number(cell)));
  });
  return { header, columns, sha256: createHash('sha256').update(raw).digest('hex') };
}
