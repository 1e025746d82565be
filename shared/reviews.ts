/**
 * Reviews, releases, notices and the audit log (issue 11): the states, request bodies and response
 * shapes shared by the client and the server. The state words are Lariat's own plain words.
 */
import { z } from 'zod';

// ---- reviews ------------------------------------------------------------------------------------
/** waiting: asked, nobody has decided; approved; sent-back: returned with reasons; withdrawn: the requester took it back. */
export const REVIEW_STATES = ['waiting', 'approved', 'sent-back', 'withdrawn'] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];
export const REVIEW_STATE_LABELS: Record<ReviewState, string> = {
  waiting: 'Waiting for a reviewer',
  approved: 'Approved',
  'sent-back': 'Sent back',
  withdrawn: 'Withdrawn',
};

// ---- notices ------------------------------------------------------------------------------------
export const NOTICE_KINDS = ['review-requested', 'review-decided', 'release-published'] as const;
export type NoticeKind = (typeof NOTICE_KINDS)[number];
export const NOTICE_KIND_LABELS: Record<NoticeKind, string> = {
  'review-requested': 'Review asked for',
  'review-decided': 'Review decided',
  'release-published': 'New release',
};

export const REVIEW_NOTE_MAX = 4000;
export const COMMENT_MAX = 4000;
export const RELEASE_NOTES_MAX = 8000;

const text = (what: string, max: number) =>
  z
    .string({ error: `Write ${what}.` })
    .trim()
    .max(max, `At most ${max} characters.`);

/** POST /api/workspaces/:workspaceId/fits/:fitId/reviews */
export const requestReviewSchema = z.strictObject({ note: text('a note', REVIEW_NOTE_MAX).default('') });
export type RequestReviewInput = z.input<typeof requestReviewSchema>;

/** POST .../reviews/:reviewId/comments: on the fit as a whole (no term) or on one coefficient (its term name). */
export const addCommentSchema = z.strictObject({
  body: text('a comment', COMMENT_MAX).min(1, 'Write a comment.'),
  term: z.string().min(1).max(600).optional(),
});
export type AddCommentInput = z.input<typeof addCommentSchema>;

/** POST .../reviews/:reviewId/decision: approve, or send back with reasons. */
export const decideReviewSchema = z
  .strictObject({
    decision: z.enum(['approve', 'send-back'], { error: () => 'Choose approve or send-back.' }),
    reasons: text('your reasons', COMMENT_MAX).default(''),
  })
  .superRefine((d, ctx) => {
    if (d.decision === 'send-back' && d.reasons.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['reasons'], message: 'Say why the fit is sent back.' });
    }
  });
export type DecideReviewInput = z.input<typeof decideReviewSchema>;

export interface PersonRef {
  id: string | null;
  name: string | null;
}

export interface ReviewCommentDto {
  id: string;
  author: PersonRef;
  /** null: about the fit as a whole; else the coefficient's term name. */
  term: string | null;
  body: string;
  createdAt: string;
}

export interface ReviewDto {
  id: string;
  modelId: string;
  modelName: string;
  fitId: string;
  fitVersion: number;
  /** The chosen lambda the review covers. */
  lambdaIndex: number;
  lambda: number | null;
  state: ReviewState;
  note: string;
  requestedBy: PersonRef;
  requestedAt: string;
  decidedBy: PersonRef | null;
  decidedAt: string | null;
  reasons: string | null;
  commentCount: number;
}

export interface ReviewDetailDto extends ReviewDto {
  comments: ReviewCommentDto[];
  /** Whether the signed-in person may decide this review (role, and not their own fit). */
  canDecide: boolean;
  /** Why not, in plain words, when canDecide is false. */
  cannotDecideReason: string | null;
  /** The fit's chosen lambda moved since the request: the approval would not cover it. */
  choiceChanged: boolean;
}

// ---- releases -----------------------------------------------------------------------------------
/** POST .../models/:modelId/releases */
export const publishReleaseSchema = z.strictObject({
  fitId: z.uuid('fitId must be a fit id'),
  notes: text('release notes', RELEASE_NOTES_MAX).min(1, 'Write release notes: what changed and why.'),
});
export type PublishReleaseInput = z.input<typeof publishReleaseSchema>;

/** POST .../releases/:releaseId/restore */
export const restoreReleaseSchema = z.strictObject({
  notes: text('release notes', RELEASE_NOTES_MAX).min(1, 'Say why the earlier release comes back.'),
});
export type RestoreReleaseInput = z.input<typeof restoreReleaseSchema>;

export interface ReleaseDto {
  id: string;
  modelId: string;
  modelName: string;
  fitId: string;
  fitVersion: number;
  lambdaIndex: number;
  number: number;
  notes: string;
  reviewId: string | null;
  releasedBy: PersonRef;
  releasedAt: string;
  /** Set when this release brought back an earlier one. */
  restoredFrom: { id: string; number: number } | null;
  /** The model's current release (highest number). */
  current: boolean;
}

// ---- notices, mail preferences, audit -----------------------------------------------------------
export interface NoticeDto {
  id: string;
  kind: NoticeKind;
  title: string;
  link: string;
  createdAt: string;
  read: boolean;
}

/** POST .../notices/read: the notices to mark read (all when absent). */
export const markNoticesReadSchema = z.strictObject({ ids: z.array(z.uuid()).max(500).optional() });

export interface MailPreferencesDto {
  reviewRequested: boolean;
  reviewDecided: boolean;
  releasePublished: boolean;
}
/** PUT /api/me/mail-preferences: every switch named. */
export const mailPreferencesSchema = z.strictObject({
  reviewRequested: z.boolean({ error: 'reviewRequested must be true or false.' }),
  reviewDecided: z.boolean({ error: 'reviewDecided must be true or false.' }),
  releasePublished: z.boolean({ error: 'releasePublished must be true or false.' }),
});
export const MAIL_PREFERENCE_LABELS: Record<keyof MailPreferencesDto, string> = {
  reviewRequested: 'Someone asks for a review in a workspace where I review',
  reviewDecided: 'A review I asked for is decided',
  releasePublished: 'A model in my workspace gets a new release',
};

export interface AuditEventDto {
  id: string;
  at: string;
  actor: { userId: string | null; apiKeyId: string | null; label: string };
  action: string;
  targetType: string;
  targetId: string | null;
  details: Record<string, unknown>;
  ip: string | null;
}
