/**
 * `npm run -s cli -- fit --data FILE.csv --response COL [options]`: fits a regularization path, with
 * cross-validation by default, and prints one JSON object on stdout. Errors: one message on stderr
 * naming the option, file, row or column, a non-zero exit, nothing on stdout.
 */
import { readFileSync } from 'node:fs';
import { crossValidate, crossValidateInWorkers } from '../engine/cv';
import { readCsvFile } from '../engine/csv';
import { EngineInputError, type CvResult, type EngineTable, type FitSpec } from '../engine/types';
import { parseFitOptions, UsageError, type FitOptions } from './args';
import { HELP } from './help';
import { fitOutput, toJson } from './output';
import { fitWithDesign } from './fit';
import { buildFitSpec } from './spec';

/**
 * Worker threads pay ~0.5 s start-up each (the TypeScript loader) and copy the design, so they only
 * help when the folds are costly: below this much work (rows x predictors x lambdas) the folds run
 * in-process. Chosen from bench/engine.bench.ts on 2 cores (workers gained ~20% at 4e8 and 4.5e7;
 * the 569 x 30 x 100 breast cancer path, 1.7e6, finishes before workers would start).
 */
const WORKER_MIN_WORK = 2e7;

function engineVersion(): string {
  const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
  return pkg.version;
}

function useWorkers(options: FitOptions, table: EngineTable, spec: FitSpec): boolean {
  if (options.workers !== 'auto') return options.workers === 'on';
  const lambdas = spec.lambda?.length ?? spec.pathLength;
  return table.nRows * spec.predictors.length * lambdas >= WORKER_MIN_WORK;
}

export async function runFit(argv: string[]): Promise<string> {
  const options = parseFitOptions(argv);
  const started = performance.now();
  const table = readCsvFile(options.data);
  const read = performance.now();
  const spec = buildFitSpec(options, table);
  const { path, built } = fitWithDesign(table, spec);
  const fitted = performance.now();
  let cv: CvResult | null = null;
  const workers = spec.cv !== null && useWorkers(options, table, spec);
  if (spec.cv) cv = workers ? await crossValidateInWorkers(table, spec, path, 2, built) : crossValidate(table, spec, path, built);
  const timing = {
    readSeconds: (read - started) / 1000,
    fitSeconds: (fitted - read) / 1000,
    cvSeconds: (performance.now() - fitted) / 1000,
    cvWorkers: workers ? 2 : 0,
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
