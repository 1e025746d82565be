import { REVIEW_STATE_LABELS, type ReviewState } from '@shared/reviews';

const TONES: Record<ReviewState, string> = {
  waiting: 'bg-saffron-300/30 text-slate-900 dark:text-saffron-200',
  approved: 'bg-lariat-100 text-lariat-900 dark:bg-lariat-900 dark:text-lariat-100',
  'sent-back': 'bg-red-100 text-red-900 dark:bg-red-950 dark:text-red-100',
  withdrawn: 'bg-slate-200 text-slate-700 dark:bg-slate-800 dark:text-slate-300',
};

export function ReviewStateBadge({ state }: { state: ReviewState }) {
  return <span className={`inline-block rounded px-2 py-0.5 text-xs font-bold ${TONES[state]}`}>{REVIEW_STATE_LABELS[state]}</span>;
}
