/** The settings of this version in plain words, and what changed against the previous version. */
import { Link } from 'react-router';
import { CV_METRIC_LABELS, MISSING_POLICY_LABELS, PENALTY_LABELS, type FitDetailDto } from '@shared/fits';
import { paths } from '@/app/paths';
import { countFormat } from '@/lib/numbers';

export function SpecSummary({ fit, workspaceId }: { fit: FitDetailDto; workspaceId: string }) {
  const s = fit.spec;
  const facts: [string, string][] = [
    ['Predictors', `${countFormat.format(s.predictors.length)} columns`],
    ['Penalty', s.penalty === 'elastic-net' ? `${PENALTY_LABELS[s.penalty]}, L1 share ${s.l1Share}` : PENALTY_LABELS[s.penalty]],
    ['Standardized', s.standardize ? 'yes' : 'no'],
    ['Path', s.path.kind === 'automatic' ? `${s.path.pathLength} automatic lambdas${s.path.pathDecades !== undefined ? ` over ${s.path.pathDecades} decades` : ''}${s.path.maxTerms ? `, at most ${s.path.maxTerms} terms` : ''}` : `${s.path.lambdas.length} given lambdas`],
    ['Cross-validation', s.cv.kind === 'none' ? 'none' : s.cv.kind === 'folds' ? `${s.cv.folds} folds, seed ${s.cv.seed}` : `folds from column ${s.cv.column}`],
    ['Measure', s.metric ? CV_METRIC_LABELS[s.metric] : 'default'],
    ['Missing values', MISSING_POLICY_LABELS[s.missing]],
    ['Holdout', s.holdout ? `${Math.round(s.holdout.share * 100)}% of rows, seed ${s.holdout.seed}` : 'none'],
    ['Dataset version', `${fit.datasetVersion.datasetName}, version ${fit.datasetVersion.number} (SHA-256 ${fit.datasetVersion.sha256.slice(0, 12)}…)`],
    ['Engine', fit.engineVersion],
  ];
  if (s.penaltyWeights && Object.keys(s.penaltyWeights).length) facts.splice(3, 0, ['Penalty weights', Object.entries(s.penaltyWeights).map(([k, v]) => `${k} = ${v}`).join(', ')]);
  return (
    <section aria-labelledby="spec-heading" className="grid gap-4 lg:grid-cols-[2fr_1fr]">
      <div className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
        <h2 id="spec-heading" className="text-base font-bold">
          Settings of this version
        </h2>
        <dl className="mt-2 grid gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
          {facts.map(([k, v]) => (
            <div key={k} className="flex gap-2">
              <dt className="w-32 shrink-0 text-slate-600 dark:text-slate-400">{k}</dt>
              <dd className="min-w-0 break-words">{v}</dd>
            </div>
          ))}
        </dl>
      </div>
      <div className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
        <h2 className="text-base font-bold">Changed from the previous version</h2>
        {fit.specChanges === null || !fit.previousVersion ? (
          <p className="mt-2 text-sm">This is the first version.</p>
        ) : fit.specChanges.length === 0 ? (
          <p className="mt-2 text-sm">Same settings as version {fit.previousVersion.version}.</p>
        ) : (
          <>
            <ul className="mt-2 list-disc space-y-1 pl-5 text-sm" aria-label="Changes">
              {fit.specChanges.map((c) => (
                <li key={c.field}>{c.summary}</li>
              ))}
            </ul>
            <p className="mt-2 text-xs">
              Against{' '}
              <Link className="font-bold text-lariat-800 underline dark:text-lariat-200" to={paths.workspace.fit.getHref(workspaceId, fit.previousVersion.id)}>
                version {fit.previousVersion.version}
              </Link>
              .
            </p>
          </>
        )}
      </div>
    </section>
  );
}
