/**
 * The ingest's worker thread against the same work on the calling thread: identical parse outcome,
 * stored bytes and summaries; problems in the file come back as FileProblem with their message;
 * the spill file is removed on close. Expected values are the local run's, an independent path
 * through the same functions without the thread, messages and bytes.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_MISSING_MARKERS } from '../../../shared/datasets';
import { FileProblem } from '../../../server/datasets/parse/errors';
import { LocalParse, ParseThread, type ColumnSource } from '../../../server/datasets/service/parse-thread';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lariat-thread-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function job(filePath: string, spill: string) {
  return { filePath, fileName: path.basename(filePath), missingMarkers: [...DEFAULT_MISSING_MARKERS], columnLimit: 100, spillPath: path.join(dir, spill) };
}

async function everything(source: ColumnSource) {
  try {
    const outcome = await source.parsed;
    const columns = [];
    for (let j = 0; j < outcome.header.length; j++) {
      const { stored, schema } = await source.column(j);
      columns.push({ ...stored, data: [...stored.data], schema });
    }
    return { outcome, columns };
  } finally {
    await source.close();
  }
}

describe('ParseThread', () => {
  it('gives the same outcome and columns as the calling thread, and reports progress up to the file size', async () => {
    const rows = Array.from({ length: 30_000 }, (_, i) => `${i + 1},${(i * 0.37).toFixed(3)},${['a', 'b', 'c'][i % 3]},${i % 2 ? 'yes' : 'no'},"note ${i}, quoted"`);
    const filePath = path.join(dir, 'mixed.csv');
    fs.writeFileSync(filePath, `id,x,group,flag,note\n${rows.join('\n')}\n`);
    const progress: number[] = [];
    const thread = new ParseThread(job(filePath, 'a.spill'), (bytes) => progress.push(bytes));
    const viaThread = await everything(thread);
    const local = await everything(new LocalParse(job(filePath, 'b.spill')));
    expect(viaThread).toEqual(local);
    expect(local.outcome.rowCount).toBe(30_000);
    expect(progress.length).toBeGreaterThan(0);
    expect(progress.every((b, i) => i === 0 || b >= progress[i - 1])).toBe(true);
    expect(progress.at(-1)).toBe(fs.statSync(filePath).size);
    expect(fs.existsSync(path.join(dir, 'a.spill'))).toBe(false);
  });

  it('hands back problems in the file as FileProblem, named like the calling thread names them', async () => {
    const filePath = path.join(dir, 'ragged.csv');
    fs.writeFileSync(filePath, 'a,b,c\n1,2,3\n4,5\n');
    const viaThread = new ParseThread(job(filePath, 'c.spill'));
    const error = await viaThread.parsed.catch((e: unknown) => e);
    await viaThread.close();
    expect(error).toBeInstanceOf(FileProblem);
    expect((error as FileProblem).status).toBe(400);
    expect((error as Error).message).toMatch(/ragged\.csv: row 3 \(the header is row 1\) does not have 3 fields/);
    await expect(viaThread.column(0)).rejects.toThrow();
    expect(fs.existsSync(path.join(dir, 'c.spill'))).toBe(false);
  });
});
