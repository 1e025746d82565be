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
