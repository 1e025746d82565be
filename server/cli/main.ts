/**
 * `npm run -s cli -- fit --data FILE.csv --response COL [options]`: fits a regularization path, with
 * cross-validation by default, and prints one JSON object on stdout. Errors: one message on stderr
 * naming the option, file, row or column, a non-zero exit, nothing on stdout.
 */
import { readFileSync } from 'node:fs';
import { crossValidate } from '../engine/cv';
import { crossValidateAdaptive, crossValidateInWorkers } from '../engine-runner';
import { readCsvFile } from '../tabular/csv';
import { EngineInputError, fitPathPrepared, prepareFit, type CvResult, type EngineTable, type FitSpec, type PathResult, type PreparedFit } from '../engine/index';
import { parseFitOptions, UsageError, type FitOptions } from './args';
import { HELP } from './help';
import { fitOutput, toJson } from './output';
import { buildFitSpec } from './spec';

function engineVersion(): string {
  const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
  return pkg.version;
}

/**
 * --workers auto: time the first fold here and share the rest between this thread and a worker
 * only when they would take long enough in this thread to pay for the worker's start-up
 * (crossValidateAdaptive; bench/engine.bench.ts).
 */
async function crossValidation(
  options: FitOptions,
  table: EngineTable,
  spec: FitSpec,
  path: PathResult,
  prepared: PreparedFit,
): Promise<{ cv: CvResult | null; workers: number }> {
  if (!spec.cv) return { cv: null, workers: 0 };
  if (options.workers === 'off') return { cv: crossValidate(table, spec, path, prepared), workers: 0 };
  if (options.workers === 'on') return { cv: await crossValidateInWorkers(table, spec, path, 2, prepared), workers: 2 };
  const { result, workers } = await crossValidateAdaptive(table, spec, path, prepared);
  return { cv: result, workers };
}

export async function runFit(argv: string[]): Promise<string> {
  const options = parseFitOptions(argv);
  const started = performance.now();
  const table = readCsvFile(options.data);
  const read = performance.now();
  const spec = buildFitSpec(options, table);
  // One code path with fitPath; the prepared design is kept for cross-validation.
  const prepared = prepareFit(table, spec);
  const path = fitPathPrepared(prepared);
  const fitted = performance.now();
  const { cv, workers } = await crossValidation(options, table, spec, path, prepared);
  const timing = {
    readSeconds: (read - started) / 1000,
    fitSeconds: (fitted - read) / 1000,
    cvSeconds: (performance.now() - fitted) / 1000,
    cvWorkers: workers,
  };
  return toJson({ ...fitOutput(path, cv, engineVersion()), timing });
}

async function main(argv: string[]): Promise<number> {
  const [command, ...rest] = argv;
  if (command === undefined) {
    process.stderr.write(HELP);
    return 2;
  }
  if (command === '--help' || command === 'help' || rest.includes('--help')) {
    process.stdout.write(HELP);
    return 0;
  }
  if (command !== 'fit') {
    process.stderr.write(`lariat: unknown command "${command}" (the only command is "fit"; see --help)\n`);
    return 2;
  }
  try {
    process.stdout.write(`${await runFit(rest)}\n`);
    return 0;
  } catch (error) {
    if (error instanceof UsageError || error instanceof EngineInputError) {
      process.stderr.write(`lariat fit: ${error.message}\n`);
      return 2;
    }
    process.stderr.write(`lariat fit: internal error: ${(error as Error).stack ?? String(error)}\n`);
    return 1;
  }
}

process.exitCode = await main(process.argv.slice(2));
