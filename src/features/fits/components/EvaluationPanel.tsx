/** What needs the data at the chosen lambda: diagnostics, holdout metrics and the unpenalized refit. */
import type { EvaluationDto } from '@shared/fits';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { formatStat } from '@/lib/numbers';
import { BinomialDiagnostics } from '../charts/BinomialDiagnostics';
import { GaussianDiagnostics } from '../charts/GaussianDiagnostics';
import { RefitTable } from '../tables/RefitTable';

export function EvaluationPanel({ evaluation }: { evaluation: EvaluationDto }) {
  if (evaluation.state === 'waiting') return <Loading label="Computing diagnostics and the refit at the chosen lambda…" />;
  if (evaluation.state === 'failed') return <Notice tone="error">The diagnostics could not be computed: {evaluation.message}</Notice>;
  const d = evaluation.diagnostics;
  return (
    <div className="space-y-6">
      <section aria-labelledby="diagnostics-heading" className="space-y-3">
        <h2 id="diagnostics-heading" className="text-lg font-bold">
          Diagnostics at the chosen lambda
        </h2>
        {d === null ? <p className="text-sm">No diagnostics for this fit.</p> : d.family === 'gaussian' ? <GaussianDiagnostics d={d} /> : <BinomialDiagnostics d={d} />}
        {evaluation.holdout && (
          <div className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
            <h3 className="text-base font-bold">Holdout ({evaluation.holdout.rowCount} rows set aside before fitting)</h3>
            <dl className="mt-2 flex flex-wrap gap-6 text-sm">
              {evaluation.holdout.metrics.map((m) => (
                <div key={m.name}>
                  <dt className="text-xs text-slate-600 dark:text-slate-400">{m.name}</dt>
                  <dd className="font-mono font-bold">{formatStat(m.value)}</dd>
                </div>
              ))}
            </dl>
          </div>
        )}
      </section>
      {evaluation.refit && <RefitTable refit={evaluation.refit} />}
    </div>
  );
}
