/** Reading the audit log (admins): newest first as JSON, or the whole log of a workspace as CSV. */
import { and, desc, eq, gte, lt, type SQL } from 'drizzle-orm';
import type { AuditEventDto } from '../../shared/reviews';
import type { Executor } from '../datasets/data/executor';
import { auditEvents } from '../db/schema/index';
import { badRequest } from '../http/errors';

export const AUDIT_PAGE_MAX = 1000;

export interface AuditQuery {
  /** ISO time: only events before it (the next page). */
  before?: string;
  since?: string;
  limit?: number;
}

export function parseAuditQuery(q: Record<string, unknown>): AuditQuery {
  const out: AuditQuery = {};
  for (const key of ['before', 'since'] as const) {
    const v = q[key];
    if (v === undefined) continue;
    if (typeof v !== 'string' || Number.isNaN(Date.parse(v))) throw badRequest(`${key}: give a date and time such as 2026-12-01T00:00:00Z.`, key);
    out[key] = v;
  }
  if (q.limit !== undefined) {
    const n = Number(q.limit);
    if (!Number.isInteger(n) || n < 1 || n > AUDIT_PAGE_MAX) throw badRequest(`limit: a whole number from 1 to ${AUDIT_PAGE_MAX}.`, 'limit');
    out.limit = n;
  }
  return out;
}

export async function listAuditEvents(db: Executor, workspaceId: string, q: AuditQuery): Promise<AuditEventDto[]> {
  const where: SQL[] = [eq(auditEvents.workspaceId, workspaceId)];
  if (q.before) where.push(lt(auditEvents.at, new Date(q.before)));
  if (q.since) where.push(gte(auditEvents.at, new Date(q.since)));
  const rows = await db
    .select()
    .from(auditEvents)
    .where(and(...where))
    .orderBy(desc(auditEvents.at), desc(auditEvents.id))
    .limit(q.limit ?? 200);
  return rows.map((r) => ({
    id: r.id,
    at: r.at.toISOString(),
    actor: { userId: r.actorUserId, apiKeyId: r.actorApiKeyId, label: r.actorLabel },
    action: r.action,
    targetType: r.targetType,
    targetId: r.targetId,
    details: r.details,
    ip: r.ip,
  }));
}

/**
 * One CSV field (RFC 4180 quoting). A value starting with = + - @ (or a tab / carriage return) gets a
 * leading apostrophe so a spreadsheet never runs it as a formula (common practice against CSV injection).
 */
export function csvField(value: unknown): string {
  let s = value === null || value === undefined ? '' : typeof value === 'string' ? value : JSON.stringify(value);
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export const AUDIT_CSV_COLUMNS = ['at', 'action', 'actor', 'actor_user_id', 'actor_api_key_id', 'target_type', 'target_id', 'ip', 'details'] as const;

export function auditCsv(events: AuditEventDto[]): string {
  const lines = [AUDIT_CSV_COLUMNS.join(',')];
  for (const e of events) {
    lines.push([e.at, e.action, e.actor.label, e.actor.userId, e.actor.apiKeyId, e.targetType, e.targetId, e.ip, e.details].map(csvField).join(','));
  }
  return `${lines.join('\n')}\n`;
}
