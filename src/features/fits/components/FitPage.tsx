/** One fit (a version of a model): live progress while it runs, then the results workspace. */
import { Link, useParams } from 'react-router';
import { ACTIVE_FIT_STATUSES } from '@shared/fits';
import { paths } from '@/app/paths';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { formatDuration } from '@/lib/numbers';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useFit } from '../api/fit';
import { FitProgressPanel } from './FitProgressPanel';
import { ResultsWorkspace } from './ResultsWorkspace';
import { SpecSummary } from './SpecSummary';

const LINK = 'font-bold text-lariat-800 underline dark:text-lariat-200';

export function FitPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const { fitId = '' } = useParams();
  const fit = useFit(workspaceId, fitId);
  if (fit.isPending) return <Loading label="Loading the fit…" />;
  if (fit.error) return <Notice tone="error">{fit.error.message}</Notice>;
  const f = fit.data;
  const canRun = role === 'admin' || role === 'analyst';
  const active = ACTIVE_FIT_STATUSES.includes(f.status);
  const t = f.timings;
  return (
    <>
      <PageHeader
        title={`${f.modelName}, version ${f.version}`}
        description={`Outcome ${f.outcome} · run by ${f.createdBy.name}${t.totalMs !== null ? ` · took ${formatDuration(t.totalMs / 1000)}` : ''}${f.seed !== null ? ` · seed ${f.seed}` : ''}`}
        actions={
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <Link className={LINK} to={paths.workspace.model.getHref(workspaceId, f.modelId)}>
              All versions
            </Link>
            {canRun && !active && (
              <Link className="rounded-md bg-lariat-700 px-4 py-2 font-bold text-white hover:bg-lariat-800 dark:bg-lariat-300 dark:text-lariat-950" to={paths.workspace.runFit.getHref(workspaceId, f.modelId, f.id)}>
                Run again with changes
              </Link>
            )}
          </div>
        }
      />
      <div className="space-y-6">
        {active && <FitProgressPanel workspaceId={workspaceId} fitId={f.id} initial={f.progress} canCancel={canRun} />}
        {f.status === 'failed' && (
          <Notice tone="error">
            <strong>This fit failed.</strong> {f.message ?? 'No reason was recorded.'}
          </Notice>
        )}
        {f.status === 'cancelled' && <Notice>{f.message ?? 'This fit was cancelled.'}</Notice>}
        <SpecSummary fit={f} workspaceId={workspaceId} />
        {f.status === 'finished' && f.results && <ResultsWorkspace fit={f} results={f.results} workspaceId={workspaceId} canChoose={canRun} />}
      </div>
    </>
  );
}
