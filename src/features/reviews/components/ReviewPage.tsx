/**
 * One review: the fit's coefficients at the reviewed lambda (comment on any one), the comments, and
 * the decision (reviewers and admins, never on their own fit). The cautions sit beside the numbers.
 */
import { useState } from 'react';
import { Link, useParams } from 'react-router';
import type { FitDetailDto } from '@shared/fits';
import type { ReviewDetailDto } from '@shared/reviews';
import { paths } from '@/app/paths';
import { Button } from '@/components/Button';
import { Cautions } from '@/components/Cautions';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { formatShare, formatStat } from '@/lib/numbers';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useReview } from '../api/review';
import { useReviewedFit } from '../api/reviewed-fit';
import { useWithdrawReview } from '../api/withdraw-review';
import { CommentsPanel } from './CommentsPanel';
import { DecisionForm } from './DecisionForm';
import { ReviewStateBadge } from './ReviewStateBadge';
import { formatWhen } from '@/lib/dates';

const LINK = 'font-bold text-lariat-800 underline dark:text-lariat-200';

export function ReviewPage() {
  const { workspaceId, userId, role } = useCurrentWorkspace();
  const { reviewId = '' } = useParams();
  const review = useReview(workspaceId, reviewId);
  const fit = useReviewedFit(workspaceId, review.data?.fitId);
  const withdraw = useWithdrawReview(workspaceId, reviewId);
  const [term, setTerm] = useState<string | null>(null);
  if (review.isPending) return <Loading label="Loading the review…" />;
  if (review.error) return <Notice tone="error">{review.error.message}</Notice>;
  const r = review.data;
  const canComment = role !== 'viewer';
  const canWithdraw = r.state === 'waiting' && (role === 'admin' || (role === 'analyst' && r.requestedBy.id === userId));
  return (
    <>
      <PageHeader
        title={`Review of ${r.modelName}, version ${r.fitVersion}`}
        description={
          <>
            <ReviewStateBadge state={r.state} /> Asked by {r.requestedBy.name ?? 'a former member'} on {formatWhen(r.requestedAt)} · lambda {formatStat(r.lambda)}
          </>
        }
        actions={
          <div className="flex flex-wrap gap-3 text-sm">
            <Link className={LINK} to={paths.workspace.fit.getHref(workspaceId, r.fitId)}>
              Open the fit
            </Link>
            {fit.data?.previousVersion && (
              <Link className={LINK} to={paths.workspace.compare.getHref(workspaceId, [fit.data.previousVersion.id, r.fitId])}>
                Compare with version {fit.data.previousVersion.version}
              </Link>
            )}
          </div>
        }
      />
      <div className="space-y-6">
        {r.note && (
          <Notice>
            <strong>Note from {r.requestedBy.name ?? 'the requester'}:</strong> {r.note}
          </Notice>
        )}
        {r.decidedAt && r.state !== 'waiting' && (
          <Notice tone={r.state === 'approved' ? 'success' : 'info'}>
            <strong>
              {r.state === 'approved' ? 'Approved' : r.state === 'sent-back' ? 'Sent back' : 'Withdrawn'} by {r.decidedBy?.name ?? 'a former member'}
            </strong>{' '}
            on {formatWhen(r.decidedAt)}
            {r.reasons ? `: ${r.reasons}` : '.'}
          </Notice>
        )}
        {r.choiceChanged && r.state === 'waiting' && (
          <Notice tone="error">The fit&apos;s chosen lambda changed after this review was asked for; an approval would not cover the new choice. Send it back, or withdraw it and ask again.</Notice>
        )}
        {fit.data?.unconverged && <Notice tone="error">This fit did not converge at every lambda: read its numbers with that in mind.</Notice>}
        {fit.isPending && <Loading label="Loading the fit…" />}
        {fit.data?.results && <ReviewedCoefficients fit={fit.data} review={r} onComment={canComment ? setTerm : undefined} />}
        <Cautions />
        <CommentsPanel workspaceId={workspaceId} review={r} canComment={canComment} term={term} onTermChange={setTerm} terms={fit.data?.results?.terms ?? []} />
        {r.state === 'waiting' && (r.canDecide ? <DecisionForm workspaceId={workspaceId} reviewId={r.id} /> : r.cannotDecideReason && <p className="text-sm text-slate-600 dark:text-slate-300">{r.cannotDecideReason}</p>)}
        {canWithdraw && (
          <Button variant="secondary" busy={withdraw.isPending} onClick={() => withdraw.mutate()}>
            Withdraw the review
          </Button>
        )}
        {withdraw.error && <Notice tone="error">{withdraw.error.message}</Notice>}
      </div>
    </>
  );
}

/** Kept coefficients (original scale) at the reviewed lambda, with their selection stability. */
function ReviewedCoefficients({ fit, review, onComment }: { fit: FitDetailDto; review: ReviewDetailDto; onComment?: (term: string) => void }) {
  const res = fit.results!;
  const i = review.lambdaIndex;
  const sparse = res.coefficients[i];
  const commented = new Set(review.comments.map((c) => c.term));
  const rows = sparse.terms.map((j, k) => ({ term: res.terms[j], value: sparse.values[k], stability: res.stability && i === res.chosen.index ? res.stability[j] : null })).sort((a, b) => Math.abs(b.value) - Math.abs(a.value));
  return (
    <section aria-labelledby="coef-heading" className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="coef-heading" className="text-base font-bold">
        Coefficients at the reviewed lambda ({formatStat(res.lambda[i])})
      </h2>
      <p className="text-sm text-slate-600 dark:text-slate-300">
        Intercept {formatStat(res.intercept[i])} · {rows.length} kept terms · original scale. Stability: the share of CV folds that keep the term.
      </p>
      <table className="mt-2 w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-slate-300 text-left dark:border-slate-700">
            <th className="py-1">Term</th>
            <th className="text-right">Coefficient</th>
            <th className="text-right">Stability</th>
            <th><span className="sr-only">Comment</span></th>
          </tr>
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.term} className="border-b border-slate-100 dark:border-slate-800">
              <td className="py-1 font-mono">{row.term}</td>
              <td className="text-right font-mono">{formatStat(row.value)}</td>
              <td className="text-right">{row.stability === null ? '—' : formatShare(row.stability)}</td>
              <td className="text-right">
                {onComment && (
                  <button type="button" className="text-xs font-bold text-lariat-800 underline dark:text-lariat-200" onClick={() => onComment(row.term)}>
                    {commented.has(row.term) ? 'Comment again' : 'Comment'}
                    <span className="sr-only"> on {row.term}</span>
                  </button>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
