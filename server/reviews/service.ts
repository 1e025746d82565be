/**
 * Reviews: an analyst (or admin) asks for a review of a finished fit at its chosen lambda; reviewers
 * and admins comment and decide; nobody decides on a fit they made or asked to have reviewed. Every
 * change of state is written to the audit log in the same transaction, and tells the people concerned.
 */
import { and, eq } from 'drizzle-orm';
import type { WorkspaceRole } from '../../shared/members';
import {
  addCommentSchema,
  decideReviewSchema,
  requestReviewSchema,
  REVIEW_STATES,
  type ReviewDetailDto,
  type ReviewDto,
  type ReviewState,
} from '../../shared/reviews';
import { recordAudit } from '../audit';
import type { SessionUser } from '../auth/sessions';
import type { AppContext } from '../context';
import { isUniqueViolation } from '../accounts/executor';
import { fits, reviewComments, reviews } from '../db/schema/index';
import { badRequest, conflict, forbidden, fromZod, notFound } from '../http/errors';
import { addNotices, membersToTell, queueNoticeMails } from '../notices/notify';
import { commentCounts, findReviewRow, listComments, listReviewRows, reviewDto, type ReviewRow } from './data';

export interface Actor {
  user: SessionUser;
  role: WorkspaceRole;
  ip: string | null;
}

const DECIDERS: WorkspaceRole[] = ['admin', 'reviewer'];
const reviewLink = (workspaceId: string, reviewId: string) => `/w/${workspaceId}/reviews/${reviewId}`;

async function requireReview(ctx: AppContext, workspaceId: string, reviewId: string): Promise<ReviewRow> {
  const row = await findReviewRow(ctx.db, workspaceId, reviewId);
  if (!row) throw notFound('No such review in this workspace.');
  return row;
}

/** Why `actor` may not decide this review, or null when they may. */
function cannotDecide(row: ReviewRow, actor: Actor): string | null {
  if (row.review.requestedBy === actor.user.id) return 'You asked for this review: someone else decides it.';
  if (row.fitCreatedBy === actor.user.id) return 'You ran this fit: someone else decides on it.';
  if (!DECIDERS.includes(actor.role)) return `Deciding needs the role reviewer or admin in this workspace; yours is ${actor.role}.`;
  return null;
}

export async function listReviews(ctx: AppContext, workspaceId: string, query: Record<string, unknown>): Promise<ReviewDto[]> {
  const state = typeof query.state === 'string' ? query.state : undefined;
  if (state !== undefined && !(REVIEW_STATES as readonly string[]).includes(state)) {
    throw badRequest(`state: choose one of ${REVIEW_STATES.join(', ')}.`, 'state');
  }
  const fitId = typeof query.fitId === 'string' && /^[0-9a-f-]{36}$/i.test(query.fitId) ? query.fitId : undefined;
  const rows = await listReviewRows(ctx.db, workspaceId, { state: state as ReviewState | undefined, fitId });
  const counts = await commentCounts(ctx.db, rows.map((r) => r.review.id));
  return rows.map((r) => reviewDto(r, counts.get(r.review.id) ?? 0));
}

export async function getReview(ctx: AppContext, workspaceId: string, reviewId: string, actor: Actor): Promise<ReviewDetailDto> {
  const row = await requireReview(ctx, workspaceId, reviewId);
  const comments = await listComments(ctx.db, reviewId);
  const reason = row.review.state === 'waiting' ? cannotDecide(row, actor) : 'This review has been decided.';
  return {
    ...reviewDto(row, comments.length),
    comments,
    canDecide: reason === null,
    cannotDecideReason: reason,
    choiceChanged: row.fitChosenIndex !== row.review.lambdaIndex,
  };
}

export async function requestReview(ctx: AppContext, workspaceId: string, fitId: string, actor: Actor, body: unknown): Promise<ReviewDto> {
  const [fit] = await ctx.db
    .select({ id: fits.id, modelId: fits.modelId, status: fits.status, version: fits.version, chosenIndex: fits.chosenIndex, unconverged: fits.unconverged })
    .from(fits)
    .where(and(eq(fits.workspaceId, workspaceId), eq(fits.id, fitId)));
  if (!fit) throw notFound('No such fit in this workspace.');
  const parsed = requestReviewSchema.safeParse(body ?? {});
  if (!parsed.success) throw fromZod(parsed.error);
  if (fit.status !== 'finished' || fit.chosenIndex === null) throw conflict(`Only a finished fit can be reviewed; version ${fit.version} is ${fit.status}.`, 'status');
  let reviewId = '';
  let noticeIds: string[] = [];
  try {
    await ctx.db.transaction(async (tx) => {
      const [created] = await tx
        .insert(reviews)
        .values({ workspaceId, modelId: fit.modelId, fitId, lambdaIndex: fit.chosenIndex!, note: parsed.data.note, requestedBy: actor.user.id })
        .returning({ id: reviews.id });
      reviewId = created.id;
      await recordAudit(tx, {
        workspaceId,
        actorUserId: actor.user.id,
        actorLabel: actor.user.email,
        action: 'review.requested',
        targetType: 'review',
        targetId: reviewId,
        details: { fitId, fitVersion: fit.version, lambdaIndex: fit.chosenIndex, unconverged: fit.unconverged },
        ip: actor.ip,
      });
      const row = (await findReviewRow(tx, workspaceId, reviewId))!;
      const userIds = await membersToTell(tx, workspaceId, { roles: DECIDERS, except: [actor.user.id, row.fitCreatedBy] });
      noticeIds = await addNotices(tx, {
        workspaceId,
        kind: 'review-requested',
        title: `${actor.user.name} asks for a review of ${row.modelName}, version ${row.fitVersion}`,
        link: reviewLink(workspaceId, reviewId),
        userIds,
      });
    });
  } catch (error) {
    if (isUniqueViolation(error)) throw conflict('This fit already has a review waiting for a reviewer.', 'fitId');
    throw error;
  }
  await queueNoticeMails(ctx, noticeIds);
  return reviewDto((await findReviewRow(ctx.db, workspaceId, reviewId))!, 0);
}

export async function addComment(ctx: AppContext, workspaceId: string, reviewId: string, actor: Actor, body: unknown): Promise<ReviewDetailDto> {
  const row = await requireReview(ctx, workspaceId, reviewId);
  const parsed = addCommentSchema.safeParse(body ?? {});
  if (!parsed.success) throw fromZod(parsed.error);
  const { term } = parsed.data;
  if (term !== undefined && !(row.fitResults?.terms ?? []).includes(term)) {
    throw badRequest(`term: "${term}" is not a term of this fit.`, 'term');
  }
  await ctx.db.transaction(async (tx) => {
    const [c] = await tx
      .insert(reviewComments)
      .values({ reviewId, workspaceId, authorId: actor.user.id, term: term ?? null, body: parsed.data.body })
      .returning({ id: reviewComments.id });
    await recordAudit(tx, {
      workspaceId,
      actorUserId: actor.user.id,
      actorLabel: actor.user.email,
      action: 'review.commented',
      targetType: 'review',
      targetId: reviewId,
      details: { commentId: c.id, term: term ?? null },
      ip: actor.ip,
    });
  });
  return getReview(ctx, workspaceId, reviewId, actor);
}

export async function decideReview(ctx: AppContext, workspaceId: string, reviewId: string, actor: Actor, body: unknown): Promise<ReviewDetailDto> {
  const row = await requireReview(ctx, workspaceId, reviewId);
  const parsed = decideReviewSchema.safeParse(body ?? {});
  if (!parsed.success) throw fromZod(parsed.error);
  const reason = cannotDecide(row, actor);
  if (reason) throw forbidden(reason);
  const state: ReviewState = parsed.data.decision === 'approve' ? 'approved' : 'sent-back';
  if (state === 'approved' && row.fitChosenIndex !== row.review.lambdaIndex) {
    throw conflict('The fit\'s chosen lambda changed after the review was asked for; send it back, or ask for a new review of the new choice.', 'decision');
  }
  let noticeIds: string[] = [];
  await ctx.db.transaction(async (tx) => {
    const updated = await tx
      .update(reviews)
      .set({ state, decidedBy: actor.user.id, decidedAt: new Date(), reasons: parsed.data.reasons || null })
      .where(and(eq(reviews.id, reviewId), eq(reviews.state, 'waiting')))
      .returning({ id: reviews.id });
    if (updated.length === 0) throw conflict(`This review is no longer waiting (it is ${row.review.state}).`, 'state');
    await recordAudit(tx, {
      workspaceId,
      actorUserId: actor.user.id,
      actorLabel: actor.user.email,
      action: state === 'approved' ? 'review.approved' : 'review.sent-back',
      targetType: 'review',
      targetId: reviewId,
      details: { fitId: row.review.fitId, fitVersion: row.fitVersion, lambdaIndex: row.review.lambdaIndex, reasons: parsed.data.reasons || null },
      ip: actor.ip,
    });
    const userIds = await membersToTell(tx, workspaceId, { only: [row.review.requestedBy, row.fitCreatedBy], except: [actor.user.id] });
    noticeIds = await addNotices(tx, {
      workspaceId,
      kind: 'review-decided',
      title: `${actor.user.name} ${state === 'approved' ? 'approved' : 'sent back'} ${row.modelName}, version ${row.fitVersion}`,
      link: reviewLink(workspaceId, reviewId),
      userIds,
    });
  });
  await queueNoticeMails(ctx, noticeIds);
  return getReview(ctx, workspaceId, reviewId, actor);
}

/** The requester (or an admin) takes a waiting review back. */
export async function withdrawReview(ctx: AppContext, workspaceId: string, reviewId: string, actor: Actor): Promise<ReviewDetailDto> {
  const row = await requireReview(ctx, workspaceId, reviewId);
  if (actor.role !== 'admin' && row.review.requestedBy !== actor.user.id) throw forbidden('Only the person who asked for the review, or an admin, can withdraw it.');
  await ctx.db.transaction(async (tx) => {
    const updated = await tx
      .update(reviews)
      .set({ state: 'withdrawn', decidedBy: actor.user.id, decidedAt: new Date() })
      .where(and(eq(reviews.id, reviewId), eq(reviews.state, 'waiting')))
      .returning({ id: reviews.id });
    if (updated.length === 0) throw conflict(`This review is no longer waiting (it is ${row.review.state}).`, 'state');
    await recordAudit(tx, {
      workspaceId,
      actorUserId: actor.user.id,
      actorLabel: actor.user.email,
      action: 'review.withdrawn',
      targetType: 'review',
      targetId: reviewId,
      details: { fitId: row.review.fitId },
      ip: actor.ip,
    });
  });
  return getReview(ctx, workspaceId, reviewId, actor);
}
