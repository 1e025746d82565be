/**
 * `npm run bench`: runs every bench/*.bench.ts module in turn (alphabetical order). Each exports
 * `run(): Promise<void>` and prints its own lines. Pass names to run a subset:
 * `npm run bench -- engine`.
 */
import { readdirSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { join } from 'node:path';

interface BenchModule {
  run(): Promise<void>;
}

const here = fileURLToPath(new URL('.', import.meta.url));
const wanted = process.argv.slice(2);
const files = readdirSync(here)
  .filter((f) => f.endsWith('.bench.ts'))
  .filter((f) => wanted.length === 0 || wanted.some((w) => f.startsWith(w)))
  .sort();

if (files.length === 0) {
  console.error(`no benchmark module matches ${wanted.join(', ') || '*'} in ${here}`);
  process.exit(1);
}
let failed = 0;
for (const file of files) {
  console.log(`\n=== ${file} ===`);
  const mod = (await import(pathToFileURL(join(here, file)).href)) as Partial<BenchModule>;
  if (typeof mod.run !== 'function') {
    console.error(`${file} does not export run(): Promise<void>`);
    failed++;
    continue;
  }
  try {
    await mod.run();
  } catch (error) {
    failed++;
    console.error(`${file} failed: ${(error as Error).stack ?? String(error)}`);
  }
}
process.exit(failed === 0 ? 0 : 1);
