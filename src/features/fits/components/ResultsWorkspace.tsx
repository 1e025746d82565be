/**
 * The results of a finished fit, in reading order: the chosen lambda (and how to change it), the
 * cautions, the CV curve and the coefficient paths, the coefficients with their stability, the
 * diagnostics and refit, the solver's certificates, and applying the fit to a table.
 */
import type { FitDetailDto, FitResultsDto } from '@shared/fits';
import { Cautions } from '@/components/Cautions';
import { Notice } from '@/components/Notice';
import { countFormat } from '@/lib/numbers';
import { CvChart } from '../charts/CvChart';
import { PathChart } from '../charts/PathChart';
import { useChooseLambda } from '../api/choose-lambda';
import { CertificateTable } from '../tables/CertificateTable';
import { CoefficientTable } from '../tables/CoefficientTable';
import { ApplyPanel } from './ApplyPanel';
import { EvaluationPanel } from './EvaluationPanel';
import { ExportPanel } from './ExportPanel';
import { LambdaChooser } from './LambdaChooser';

/** In-page links: the workspace is long, and readers come back for one part. */
const JUMPS = [
  ['choice-heading', 'Chosen lambda'],
  ['cv-title', 'Cross-validation'],
  ['paths-title', 'Paths'],
  ['coefficients-heading', 'Coefficients'],
  ['diagnostics-heading', 'Diagnostics'],
  ['refit-heading', 'Refit'],
  ['certificates-heading', 'Solver certificates'],
  ['apply-heading', 'Apply to a table'],
] as const;

export function ResultsWorkspace({ fit, results, workspaceId, canChoose }: { fit: FitDetailDto; results: FitResultsDto; workspaceId: string; canChoose: boolean }) {
  const choose = useChooseLambda(workspaceId, fit.id);
  const onChoose = canChoose ? (index: number) => choose.mutate({ index }) : undefined;
  const index = results.chosen.index;
  return (
    <div className="space-y-6">
      {fit.unconverged && (
        <Notice tone="error">
          Some solves stopped at their iteration limit{results.unconvergedLambdas.length ? ` (lambda positions ${results.unconvergedLambdas.map((i) => i + 1).join(', ')})` : ''}
          {results.cv?.unconvergedFolds.length ? ` or in folds ${results.cv.unconvergedFolds.map((f) => f + 1).join(', ')}` : ''}. Their results are not certified; see the solver certificates below.
        </Notice>
      )}
      <RowsUsed rowsFitted={results.rowsFitted} rowsDropped={results.rowsDropped} />
      <nav aria-label="Parts of the results" className="flex flex-wrap gap-x-4 gap-y-1 text-sm">
        {JUMPS.map(([id, label]) => (
          <a key={id} href={`#${id}`} className="font-bold text-lariat-800 underline dark:text-lariat-200">
            {label}
          </a>
        ))}
      </nav>
      <LambdaChooser results={results} canChoose={canChoose} busy={choose.isPending} error={choose.error} onChoose={(input) => choose.mutate(input)} />
      <Cautions />
      <div className="grid gap-4 xl:grid-cols-2">
        {results.cv ? (
          <CvChart lambda={results.lambda} cv={results.cv} chosenIndex={index} onChoose={onChoose} />
        ) : (
          <Notice>No cross-validation in this version: the lambda is the end of the path unless chosen by hand.</Notice>
        )}
        <PathChart
          lambda={results.lambda}
          coefficients={results.coefficients}
          standardizedCoefficients={results.standardizedCoefficients}
          terms={results.terms}
          chosenIndex={index}
          onChoose={onChoose}
        />
      </div>
      <CoefficientTable results={results} index={index} />
      <EvaluationPanel evaluation={results.evaluation} />
      <CertificateTable results={results} />
      {results.notes.length > 0 && (
        <section aria-labelledby="notes-heading" className="rounded-lg border border-slate-200 bg-white p-4 text-sm dark:border-slate-800 dark:bg-slate-900">
          <h2 id="notes-heading" className="font-bold">
            Notes from the fit
          </h2>
          <ul className="mt-1 list-disc space-y-1 pl-5">
            {results.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
        </section>
      )}
      <ApplyPanel workspaceId={workspaceId} fitId={fit.id} binomial={fit.family === 'binomial'} />
      <ExportPanel workspaceId={workspaceId} fitId={fit.id} />
    </div>
  );
}

/** Rows fitted and left out, at the top: a fit that lost many rows to blanks must not look like a fit on all of them. */
function RowsUsed({ rowsFitted, rowsDropped }: { rowsFitted: number; rowsDropped: number }) {
  const total = rowsFitted + rowsDropped;
  const many = rowsDropped > 0.2 * total;
  return (
    <p className={`text-base ${many ? 'font-bold text-amber-800 dark:text-amber-200' : 'text-slate-800 dark:text-slate-200'}`} data-testid="rows-used">
      Rows fitted: {countFormat.format(rowsFitted)} of {countFormat.format(total)}
      {rowsDropped > 0 ? ` (${countFormat.format(rowsDropped)} left out for a missing value)` : ' (none left out)'}.
    </p>
  );
}
