import { FIT_STATUS_LABELS, type FitStatus } from '@shared/fits';

const TONES: Record<FitStatus, string> = {
  waiting: 'bg-slate-200 text-slate-800 dark:bg-slate-700 dark:text-slate-100',
  running: 'bg-lariat-100 text-lariat-900 dark:bg-lariat-900 dark:text-lariat-100',
  finished: 'bg-lariat-700 text-white dark:bg-lariat-300 dark:text-lariat-950',
  failed: 'bg-red-700 text-white dark:bg-red-300 dark:text-red-950',
  cancelled: 'bg-slate-500 text-white dark:bg-slate-400 dark:text-slate-950',
};

/** A fit's status in words; a finished fit with an unconverged lambda says so instead of plain success. */
export function FitStatusBadge({ status, unconverged = false }: { status: FitStatus; unconverged?: boolean }) {
  if (status === 'finished' && unconverged) {
    return <span className="inline-block rounded px-2 py-0.5 text-xs font-bold bg-saffron-300 text-slate-900">Finished, not all converged</span>;
  }
  return <span className={`inline-block rounded px-2 py-0.5 text-xs font-bold ${TONES[status]}`}>{FIT_STATUS_LABELS[status]}</span>;
}
