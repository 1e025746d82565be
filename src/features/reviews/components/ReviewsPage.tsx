/** Reviews: my notices, asking for a review (admins, analysts), and the reviews of the workspace. */
import { useState } from 'react';
import { Link, useNavigate } from 'react-router';
import { REVIEW_STATE_LABELS, REVIEW_STATES, type ReviewState } from '@shared/reviews';
import { paths } from '@/app/paths';
import { EmptyState } from '@/components/EmptyState';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { formatStat } from '@/lib/numbers';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useReviews } from '../api/reviews';
import { MailPreferencesPanel } from './MailPreferencesPanel';
import { NoticesPanel } from './NoticesPanel';
import { RequestReviewForm } from './RequestReviewForm';
import { ReviewStateBadge } from './ReviewStateBadge';
import { formatWhen } from '@/lib/dates';

export function ReviewsPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const [state, setState] = useState<ReviewState | undefined>('waiting');
  const reviews = useReviews(workspaceId, state);
  const navigate = useNavigate();
  const canAsk = role === 'admin' || role === 'analyst';
  return (
    <>
      <PageHeader
        title="Reviews"
        description="Reviewers read a fit, comment on it or on single coefficients, and approve it or send it back with reasons. Nobody decides on their own fit."
        actions={
          <Link className="text-sm font-bold text-lariat-800 underline dark:text-lariat-200" to={paths.workspace.compare.getHref(workspaceId)}>
            Compare fits
          </Link>
        }
      />
      <div className="space-y-6">
        <NoticesPanel workspaceId={workspaceId} />
        {canAsk && <RequestReviewForm workspaceId={workspaceId} onDone={(id) => void navigate(paths.workspace.review.getHref(workspaceId, id))} />}
        <section aria-labelledby="list-heading" className="space-y-3">
          <div className="flex flex-wrap items-center gap-2">
            <h2 id="list-heading" className="mr-2 text-base font-bold">
              {state ? REVIEW_STATE_LABELS[state] : 'All reviews'}
            </h2>
            {[undefined, ...REVIEW_STATES].map((s) => (
              <button key={s ?? 'all'} type="button" aria-pressed={state === s} className={`rounded px-2 py-1 text-xs ${state === s ? 'bg-lariat-700 text-white' : 'bg-slate-100 dark:bg-slate-800'}`} onClick={() => setState(s)}>
                {s ? REVIEW_STATE_LABELS[s] : 'All'}
              </button>
            ))}
          </div>
          {reviews.isPending && <Loading label="Loading reviews…" />}
          {reviews.error && <Notice tone="error">{reviews.error.message}</Notice>}
          {reviews.data?.length === 0 && (
            <EmptyState title="No reviews here yet">
              <p>{canAsk ? 'Ask for a review of a finished fit above.' : 'When an analyst asks for a review, it appears here and you get a notice.'}</p>
            </EmptyState>
          )}
          {reviews.data && reviews.data.length > 0 && (
            <table className="w-full border-collapse text-sm">
              <thead>
                <tr className="border-b border-slate-300 text-left dark:border-slate-700">
                  <th className="py-2">Fit</th>
                  <th>State</th>
                  <th>Lambda</th>
                  <th>Asked by</th>
                  <th>Comments</th>
                </tr>
              </thead>
              <tbody>
                {reviews.data.map((r) => (
                  <tr key={r.id} className="border-b border-slate-200 dark:border-slate-800">
                    <td className="py-2">
                      <Link className="font-bold underline" to={paths.workspace.review.getHref(workspaceId, r.id)}>
                        {r.modelName}, version {r.fitVersion}
                      </Link>
                    </td>
                    <td>
                      <ReviewStateBadge state={r.state} />
                    </td>
                    <td className="font-mono">{formatStat(r.lambda)}</td>
                    <td>
                      {r.requestedBy.name ?? 'a former member'} · {formatWhen(r.requestedAt)}
                    </td>
                    <td>{r.commentCount}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
        <MailPreferencesPanel />
      </div>
    </>
  );
}
