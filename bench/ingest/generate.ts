/**
 * The ingest benchmark's input: N rows x 20 columns of seeded synthetic data (a row number, 15
 * numeric columns with six decimals, two categorical, one yes/no, one numeric with 2% missing),
 * about 200 bytes a row. Written in 8 MB slices; reused when already present with the same size.
 */
import fs from 'node:fs';

export const COLUMNS = 20;

/** Park & Miller (1988) minimal standard generator: seeded, enough for synthetic benchmark data. */
function rng(seed: number): () => number {
  let s = seed % 2147483647;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

export function generateCsv(filePath: string, rows: number): number {
  const header = ['row', ...Array.from({ length: 15 }, (_, j) => `x${j + 1}`), 'region', 'grade', 'member', 'spend'].join(',');
  const regions = ['north', 'south', 'east', 'west', 'centre'];
  const next = rng(20260101);
  const fd = fs.openSync(filePath, 'w');
  try {
    fs.writeSync(fd, `${header}\n`);
    let lines: string[] = [];
    let bytes = 0;
    for (let i = 1; i <= rows; i++) {
      const cells: string[] = [String(i)];
      for (let j = 0; j < 15; j++) cells.push(((next() - 0.5) * 2000).toFixed(6));
      cells.push(regions[Math.floor(next() * 5)], `g${1 + Math.floor(next() * 12)}`, next() < 0.4 ? 'yes' : 'no');
      cells.push(next() < 0.02 ? 'NA' : (next() * 5000).toFixed(2));
      const line = cells.join(',');
      lines.push(line);
      bytes += line.length + 1;
      if (bytes > 8 << 20) {
        fs.writeSync(fd, `${lines.join('\n')}\n`);
        lines = [];
        bytes = 0;
      }
    }
    if (lines.length > 0) fs.writeSync(fd, `${lines.join('\n')}\n`);
  } finally {
    fs.closeSync(fd);
  }
  return fs.statSync(filePath).size;
}
