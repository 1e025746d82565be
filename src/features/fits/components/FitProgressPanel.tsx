/** Live progress of a waiting or running fit: a bar, lambda and fold counts, elapsed and time left; cancel. */
import { useQueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { FIT_STATUS_LABELS, type FitProgressDto } from '@shared/fits';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';
import { formatDuration } from '@/lib/numbers';
import { useCancelFit } from '../api/cancel-fit';
import { fitQueryOptions } from '../api/fit';
import { useFitProgress } from '../api/fit-progress';

const STAGE_WORDS = { waiting: 'Waiting for a worker', path: 'Fitting the path on all rows', folds: 'Fitting the cross-validation folds', combining: 'Combining the folds', done: 'Storing the results' } as const;

export function FitProgressPanel({ workspaceId, fitId, initial, canCancel }: { workspaceId: string; fitId: string; initial: FitProgressDto; canCancel: boolean }) {
  const queryClient = useQueryClient();
  const progress = useFitProgress(workspaceId, fitId, true);
  const cancel = useCancelFit(workspaceId, fitId);
  const p = progress.data ?? initial;
  const active = p.status === 'waiting' || p.status === 'running';
  useEffect(() => {
    // The fit ended (finished, failed, cancelled): load it again with its results.
    if (!active) void queryClient.invalidateQueries({ queryKey: fitQueryOptions(workspaceId, fitId).queryKey });
  }, [active, queryClient, workspaceId, fitId]);
  const percent = Math.round(Math.max(0, Math.min(1, p.fraction)) * 100);
  return (
    <section aria-labelledby="progress-heading" className="space-y-3 rounded-lg border border-slate-200 bg-white p-5 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="progress-heading" className="text-lg font-bold">
        {FIT_STATUS_LABELS[p.status]}
      </h2>
      {(p.stage !== 'waiting' || p.message) && (
        <p className="text-sm text-slate-700 dark:text-slate-300">
          {STAGE_WORDS[p.stage]}
          {p.message ? `: ${p.message}` : ''}
        </p>
      )}
      <div className="space-y-1">
        <div className="flex justify-between text-sm">
          <span>Progress</span>
          <span className="font-mono" data-testid="fit-percent">
            {percent}%
          </span>
        </div>
        <div role="progressbar" aria-label="Fit progress" aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent} className="h-2.5 w-full overflow-hidden rounded-full bg-slate-200 dark:bg-slate-700">
          <div className="h-full rounded-full bg-lariat-600 transition-[width] duration-500 dark:bg-lariat-300" style={{ width: `${percent}%` }} />
        </div>
      </div>
      <dl className="grid grid-cols-2 gap-3 text-sm sm:grid-cols-4">
        <div>
          <dt className="text-xs text-slate-600 dark:text-slate-400">Lambdas on the path</dt>
          <dd className="font-mono">
            {p.lambdaIndex}
            {p.lambdaCount !== null ? ` of ${p.lambdaCount}` : ''}
          </dd>
        </div>
        <div>
          <dt className="text-xs text-slate-600 dark:text-slate-400">Folds done</dt>
          <dd className="font-mono">
            {p.foldsDone} of {p.foldsTotal}
          </dd>
        </div>
        <div>
          <dt className="text-xs text-slate-600 dark:text-slate-400">Elapsed</dt>
          <dd className="font-mono">{formatDuration(p.elapsedMs / 1000)}</dd>
        </div>
        <div>
          <dt className="text-xs text-slate-600 dark:text-slate-400">Time left (estimate)</dt>
          <dd className="font-mono">{p.remainingMs === null ? 'estimating…' : formatDuration(p.remainingMs / 1000)}</dd>
        </div>
      </dl>
      {canCancel && active && (
        <Button variant="danger" onClick={() => cancel.mutate()} busy={cancel.isPending} busyLabel="Cancelling…">
          Cancel this fit
        </Button>
      )}
      {cancel.error && <Notice tone="error">{cancel.error.message}</Notice>}
      {progress.error && <Notice tone="error">Progress could not be read: {progress.error.message}</Notice>}
    </section>
  );
}
