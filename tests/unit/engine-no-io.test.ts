/**
 * The lint rule that keeps server/engine free of I/O (docs/decisions/0017-no-io-in-engine.md): a
 * file there importing node: I/O modules, threads or the rest of the server is an error; the same
 * imports in the runner are allowed.
 */
import { ESLint } from 'eslint';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../', import.meta.url));
const probe = [
  "import { readFileSync } from 'node:fs';",
  "import { Worker } from 'worker_threads';",
  "import { spawn } from 'node:child_process';",
  "import { readCsvFile } from '../tabular/csv';",
  'export const used = [readFileSync, Worker, spawn, readCsvFile];',
].join('\n');

async function errorsFor(filePath: string): Promise<string[]> {
  const eslint = new ESLint({ cwd: root });
  const [result] = await eslint.lintText(probe, { filePath: root + filePath });
  return result.messages.filter((m) => m.severity === 2).map((m) => `${m.line}:${m.ruleId}`);
}

describe('server/engine imports no I/O', () => {
  it('flags fs, worker_threads, child_process and the rest of the server inside the engine', { timeout: 60_000 }, async () => {
    const errors = await errorsFor('server/engine/probe.ts');
    expect(errors).toEqual(expect.arrayContaining(['1:no-restricted-imports', '2:no-restricted-imports', '3:no-restricted-imports', '4:import/no-restricted-paths']));
  });

  it('allows them in the engine runner', { timeout: 60_000 }, async () => {
    const errors = await errorsFor('server/engine-runner/probe.ts');
    expect(errors.filter((e) => e.includes('no-restricted'))).toEqual([]);
  });
});
