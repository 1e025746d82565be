/** One model: its question, and its versions side by side with key metrics and what changed. */
import type { ReactNode } from 'react';
import { Link, useParams } from 'react-router';
import { FAMILY_LABELS, type ModelDetailDto } from '@shared/models';
import { CV_METRIC_LABELS, PENALTY_LABELS, type CvMetric } from '@shared/fits';
import { paths } from '@/app/paths';
import { Cautions } from '@/components/Cautions';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { formatShare, formatStat } from '@/lib/numbers';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useModel } from '../api/model';
import { FitStatusBadge } from './FitStatusBadge';
import { formatWhen } from './format';

type Version = ModelDetailDto['versions'][number];

const RULE_WORDS = { minimum: 'CV minimum', 'one-standard-error': 'One standard error', manual: 'Chosen by hand', last: 'End of the path' } as const;
const LINK = 'font-bold text-lariat-800 underline dark:text-lariat-200';

export function ModelPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const { modelId = '' } = useParams();
  const model = useModel(workspaceId, modelId);
  if (model.isPending) return <Loading label="Loading the model…" />;
  if (model.error) return <Notice tone="error">{model.error.message}</Notice>;
  const m = model.data;
  const versions = m.versions;
  const canRun = role === 'admin' || role === 'analyst';
  const rows: [string, (v: Version) => ReactNode][] = [
    ['Status', (v) => <FitStatusBadge status={v.status} unconverged={v.unconverged} />],
    ['Dataset version', (v) => `${v.datasetVersion.datasetName}, version ${v.datasetVersion.number}`],
    ['Penalty', (v) => (v.spec.penalty === 'elastic-net' ? `${PENALTY_LABELS['elastic-net']}, L1 share ${v.spec.l1Share}` : PENALTY_LABELS[v.spec.penalty])],
    ['Predictors', (v) => `${v.spec.predictors.length} columns`],
    ['Cross-validation', (v) => (v.spec.cv.kind === 'none' ? 'None' : v.spec.cv.kind === 'folds' ? `${v.spec.cv.folds} folds, seed ${v.spec.cv.seed}` : `Folds from ${v.spec.cv.column}`)],
    ['Lambda', (v) => (v.metrics.lambda === null ? '–' : formatStat(v.metrics.lambda))],
    ['Chosen by', (v) => (v.metrics.chosenRule ? RULE_WORDS[v.metrics.chosenRule] : '–')],
    ['Nonzero terms', (v) => v.metrics.nonzero ?? '–'],
    ['Deviance explained', (v) => (v.metrics.devianceExplained === null ? '–' : formatShare(v.metrics.devianceExplained))],
    ['CV error', (v) => (v.metrics.cvError === null ? '–' : `${formatStat(v.metrics.cvError)} (${CV_METRIC_LABELS[v.metrics.cvMetric as CvMetric] ?? v.metrics.cvMetric})`)],
    ['Holdout', (v) => (v.metrics.holdout ? `${v.metrics.holdout.name} ${formatStat(v.metrics.holdout.value)}` : '–')],
    ['Run by', (v) => `${v.createdBy.name}, ${formatWhen(v.createdAt)}`],
    [
      'Changed from the previous version',
      (v) =>
        v.specChanges === null ? (
          'First version'
        ) : v.specChanges.length === 0 ? (
          'Same spec'
        ) : (
          <ul className="list-disc space-y-0.5 pl-4 text-xs">
            {v.specChanges.map((c) => (
              <li key={c.field}>{c.summary}</li>
            ))}
          </ul>
        ),
    ],
  ];
  return (
    <>
      <PageHeader
        title={m.name}
        description={`${m.description ? `${m.description} · ` : ''}${m.datasetName} · outcome ${m.outcome} · ${FAMILY_LABELS[m.family]}`}
        actions={
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <Link className={LINK} to={paths.workspace.models.getHref(workspaceId)}>
              All models
            </Link>
            {canRun && (
              <Link
                to={paths.workspace.runFit.getHref(workspaceId, m.id, versions[0]?.id)}
                className="rounded-md bg-lariat-700 px-4 py-2 font-bold text-white hover:bg-lariat-800 dark:bg-lariat-300 dark:text-lariat-950"
              >
                {versions.length === 0 ? 'Set up the first fit' : 'Run a new version'}
              </Link>
            )}
          </div>
        }
      />
      <div className="space-y-6">
        {versions.length === 0 ? (
          <Notice>No versions yet. {canRun ? 'Set up the first fit to make version 1.' : ''}</Notice>
        ) : (
          <section aria-labelledby="versions-heading" className="space-y-2">
            <h2 id="versions-heading" className="text-lg font-bold">
              Versions
            </h2>
            <div className="overflow-x-auto rounded-lg border border-slate-200 bg-white dark:border-slate-800 dark:bg-slate-900" tabIndex={0} role="region" aria-label="Versions side by side (scrolls)">
              <table className="min-w-full border-collapse text-sm">
                <caption className="sr-only">Versions of {m.name} side by side</caption>
                <thead className="bg-slate-100 dark:bg-slate-800">
                  <tr>
                    <td className="px-3 py-2" />
                    {versions.map((v) => (
                      <th key={v.id} scope="col" className="min-w-44 px-3 py-2 text-left">
                        <Link className={LINK} to={paths.workspace.fit.getHref(workspaceId, v.id)}>
                          Version {v.version}
                        </Link>
                      </th>
                    ))}
                  </tr>
                </thead>
                <tbody>
                  {rows.map(([label, cell]) => (
                    <tr key={label} className="border-t border-slate-100 align-top dark:border-slate-800">
                      <th scope="row" className="whitespace-nowrap px-3 py-2 text-left text-xs font-bold text-slate-700 dark:text-slate-300">
                        {label}
                      </th>
                      {versions.map((v) => (
                        <td key={v.id} className="px-3 py-2">
                          {cell(v)}
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          </section>
        )}
        <Cautions />
      </div>
    </>
  );
}
