/**
 * `npm run -s cli -- fit --data FILE.csv --response COL [options]`: fits a regularization path, with
 * cross-validation by default, and prints one JSON object on stdout. Errors: one message on stderr
 * naming the option, file, row or column, a non-zero exit, nothing on stdout.
 */
import { readFileSync } from 'node:fs';
import { crossValidatePrepared, foldAssignment } from '../engine/cv';
import { attachFoldsBeside, coreToSpare, cpuSnapshot, crossValidateInWorkersPrepared, crossValidateScoringBeside, fitPathAndFolds, scoringBesidePays, startFoldWorker, threadsPay, type FoldWorker } from '../engine-runner';
import { readCsvFile } from '../tabular/csv';
import { attachFolds, DEFAULT_PATH_LENGTH, EngineInputError, fitPathPrepared, prepareFit, type CvResult, type PathResult } from '../engine/index';
import { parseFitOptions, UsageError } from './args';
import { earlyWorkerMayPay } from './early-worker';
import { HELP } from './help';
import { fitOutput, toJson } from './output';
import { buildFitSpec } from './spec';

function engineVersion(): string {
  const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version: string };
  return pkg.version;
}

/**
 * --workers auto: a worker thread is started before the data are read (when the file's shape,
 * seen in its first megabyte, promises enough work: earlyWorkerMayPay), so its start-up overlaps the reading; after the design is built, it is
 * used when the work is large enough (threadsPay) and other processes left a core free meanwhile
 * (coreToSpare).
 * With it, the fold blocks' cross products are split between it and this thread
 * (attachFoldsBeside), then the folds run on it and on this thread (this thread first fits the full
 * path, and the worker starts on the folds at once when the grid is known beforehand:
 * fitPathAndFolds). Below that work, on a tall table (scoringBesidePays), this thread fits every
 * fold and the worker scores each one's held-out rows meanwhile (crossValidateScoringBeside).
 * Results are the single-thread ones whichever thread computes what.
 * --workers on: every fold on 2 worker threads; off: everything in this thread.
 */
export async function runFit(argv: string[]): Promise<string> {
  const options = parseFitOptions(argv);
  const started = performance.now();
  let early: FoldWorker | null = null;
  const cpuAtStart = cpuSnapshot();
  if (options.workers === 'auto' && earlyWorkerMayPay(options)) early = startFoldWorker();
  try {
    // The table is needed until the folds are planned; kept in this block only, so its columns can
    // be collected while the path and the folds run.
    const { spec, prepared, read, threads, scoring } = await (async () => {
      const table = readCsvFile(options.data);
      const readAt = performance.now();
      const fitSpec = buildFitSpec(options, table);
      // One code path with fitPath: prepareFit, its fold plan (attachFolds), fitPathPrepared.
      // With a worker started, the design is built in shared memory (no copy to hand it over).
      const fitPrepared = prepareFit(table, fitSpec, false, early !== null);
      const cv = fitSpec.cv;
      const assignment = cv ? foldAssignment(table, fitSpec, cv, fitPrepared.built) : null;
      const lambdaCount = fitPrepared.options.lambda?.length ?? fitPrepared.options.pathLength ?? DEFAULT_PATH_LENGTH;
      const spare = early !== null && assignment !== null && coreToSpare(cpuAtStart);
      const useWorker = spare && assignment !== null && threadsPay(fitPrepared, assignment.folds, lambdaCount);
      // Without fold threads, a tall table's folds can still be scored on the worker: the blocks are
      // then summed on both threads too (attachFoldsBeside puts the regrouped rows in shared memory).
      if (early && assignment && spare) await attachFoldsBeside(table, fitSpec, fitPrepared, early, assignment);
      // One thread: the rows regrouped by fold all the same (the folds' scoring reads them in order).
      else attachFolds(table, fitSpec, fitPrepared, assignment ?? undefined, true);
      const scoring = spare && !useWorker && scoringBesidePays(fitPrepared, lambdaCount);
      return { spec: fitSpec, prepared: fitPrepared, read: readAt, threads: useWorker, scoring };
    })();
    let path: PathResult;
    let cv: CvResult | null = null;
    let workers = 0;
    let fitted: number;
    if (early && threads) {
      ({ path, cv, pathDone: fitted } = await fitPathAndFolds(spec, prepared, early));
      workers = 2;
    } else if (early && scoring && spec.cv) {
      path = fitPathPrepared(prepared);
      fitted = performance.now();
      cv = await crossValidateScoringBeside(spec, path, prepared, early);
      workers = 1;
    } else {
      await early?.stop();
      early = null;
      path = fitPathPrepared(prepared);
      fitted = performance.now();
      if (spec.cv && options.workers === 'on') {
        cv = await crossValidateInWorkersPrepared(spec, path, prepared);
        workers = 2;
      } else if (spec.cv) cv = crossValidatePrepared(spec, path, prepared);
    }
    const timing = {
      readSeconds: (read - started) / 1000,
      fitSeconds: (fitted - read) / 1000,
      cvSeconds: (performance.now() - fitted) / 1000,
      cvWorkers: workers,
    };
    return toJson({ ...fitOutput(path, cv, engineVersion()), timing });
  } finally {
    await early?.stop();
  }
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
