/**
 * The audit log: one row per change of state (who, what, when, from where). Call it inside the same
 * transaction as the change it records, so a change is never stored without its entry (or the reverse).
 */
import type { Executor } from '../datasets/data/executor';
import { auditEvents } from '../db/schema/index';

export interface AuditEventInput {
  workspaceId: string | null;
  /** The signed-in user, when a person acted. */
  actorUserId?: string | null;
  /** The consumer API key, when a key acted. */
  actorApiKeyId?: string | null;
  /** E-mail address or key name at the time: the log outlives accounts and keys. */
  actorLabel?: string;
  /** Dotted plain words: `review.requested`, `review.approved`, `release.published`, `key.created`, ... */
  action: string;
  targetType: string;
  targetId?: string | null;
  details?: Record<string, unknown>;
  /** The request's address (req.ip), null for background jobs. */
  ip?: string | null;
}

export async function recordAudit(db: Executor, event: AuditEventInput): Promise<void> {
  await db.insert(auditEvents).values({
    workspaceId: event.workspaceId,
    actorUserId: event.actorUserId ?? null,
    actorApiKeyId: event.actorApiKeyId ?? null,
    actorLabel: event.actorLabel ?? '',
    action: event.action,
    targetType: event.targetType,
    targetId: event.targetId ?? null,
    details: event.details ?? {},
    ip: event.ip ?? null,
  });
}
