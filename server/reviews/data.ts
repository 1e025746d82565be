/** Review rows and their DTOs (every lookup scoped to a workspace). */
import { alias } from 'drizzle-orm/pg-core';
import { and, asc, count, desc, eq, inArray, type SQL } from 'drizzle-orm';
import type { ReviewCommentDto, ReviewDto, ReviewState } from '../../shared/reviews';
import type { Executor } from '../datasets/data/executor';
import { fits, models, reviewComments, reviews, users } from '../db/schema/index';

const requester = alias(users, 'requester');
const decider = alias(users, 'decider');

function selectReviews(db: Executor) {
  return db
    .select({
      review: reviews,
      modelName: models.name,
      fitVersion: fits.version,
      fitCreatedBy: fits.createdBy,
      fitResults: fits.results,
      fitChosenIndex: fits.chosenIndex,
      requesterName: requester.name,
      deciderName: decider.name,
    })
    .from(reviews)
    .innerJoin(models, eq(models.id, reviews.modelId))
    .innerJoin(fits, eq(fits.id, reviews.fitId))
    .leftJoin(requester, eq(requester.id, reviews.requestedBy))
    .leftJoin(decider, eq(decider.id, reviews.decidedBy));
}

export type ReviewRow = Awaited<ReturnType<typeof selectReviews>>[number];

export async function findReviewRow(db: Executor, workspaceId: string, reviewId: string): Promise<ReviewRow | null> {
  const rows = await selectReviews(db).where(and(eq(reviews.workspaceId, workspaceId), eq(reviews.id, reviewId)));
  return rows[0] ?? null;
}

export async function listReviewRows(db: Executor, workspaceId: string, filter: { state?: ReviewState; fitId?: string } = {}): Promise<ReviewRow[]> {
  const where: SQL[] = [eq(reviews.workspaceId, workspaceId)];
  if (filter.state) where.push(eq(reviews.state, filter.state));
  if (filter.fitId) where.push(eq(reviews.fitId, filter.fitId));
  return selectReviews(db)
    .where(and(...where))
    .orderBy(desc(reviews.requestedAt))
    .limit(500);
}

export async function commentCounts(db: Executor, reviewIds: string[]): Promise<Map<string, number>> {
  if (reviewIds.length === 0) return new Map();
  const rows = await db
    .select({ reviewId: reviewComments.reviewId, n: count() })
    .from(reviewComments)
    .where(inArray(reviewComments.reviewId, reviewIds))
    .groupBy(reviewComments.reviewId);
  return new Map(rows.map((r) => [r.reviewId, Number(r.n)]));
}

export async function listComments(db: Executor, reviewId: string): Promise<ReviewCommentDto[]> {
  const rows = await db
    .select({ c: reviewComments, authorName: users.name })
    .from(reviewComments)
    .leftJoin(users, eq(users.id, reviewComments.authorId))
    .where(eq(reviewComments.reviewId, reviewId))
    .orderBy(asc(reviewComments.createdAt));
  return rows.map(({ c, authorName }) => ({
    id: c.id,
    author: { id: c.authorId, name: authorName },
    term: c.term,
    body: c.body,
    createdAt: c.createdAt.toISOString(),
  }));
}

export function reviewDto(r: ReviewRow, commentCount: number): ReviewDto {
  const v = r.review;
  return {
    id: v.id,
    modelId: v.modelId,
    modelName: r.modelName,
    fitId: v.fitId,
    fitVersion: r.fitVersion,
    lambdaIndex: v.lambdaIndex,
    lambda: r.fitResults?.lambda[v.lambdaIndex] ?? null,
    state: v.state,
    note: v.note,
    requestedBy: { id: v.requestedBy, name: r.requesterName },
    requestedAt: v.requestedAt.toISOString(),
    decidedBy: v.decidedAt ? { id: v.decidedBy, name: r.deciderName } : null,
    decidedAt: v.decidedAt?.toISOString() ?? null,
    reasons: v.reasons,
    commentCount,
  };
}
