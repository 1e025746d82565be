/**
 * Server-side session rows: created at sign-in, looked up on every request, revoked at sign-out.
 * Two lifetimes (docs/decisions/0008-sessions.md): a sliding one (LARIAT_SESSION_MINUTES, renewed
 * while the person is active) and an absolute one (LARIAT_SESSION_MAX_HOURS after sign-in, never
 * extended), so a stolen or forgotten session cannot be kept alive forever.
 */
import { createHash, randomUUID } from 'node:crypto';
import { and, desc, eq, gt, isNull, ne } from 'drizzle-orm';
import type { Response } from 'express';
import type { SessionDto } from '../../shared/auth';
import type { AppContext } from '../context';
import type { Database } from '../db/client';
import { sessions, users } from '../db/schema/auth';
import { setCsrfCookie, setSessionCookie } from './cookies';
import { csrfTokenFor } from './csrf';
import { signSessionToken } from './session-token';

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

function slidingMs(ctx: AppContext): number {
  return ctx.config.LARIAT_SESSION_MINUTES * 60_000;
}

function absoluteMs(ctx: Pick<AppContext, 'config'>): number {
  return ctx.config.LARIAT_SESSION_MAX_HOURS * 3_600_000;
}

/** Signs the user in: a new session row, the session cookie and its CSRF cookie. Returns the CSRF token. */
export async function startSession(ctx: AppContext, res: Response, userId: string, userAgent?: string): Promise<string> {
  const sessionId = randomUUID();
  const expiresAt = new Date(Date.now() + Math.min(slidingMs(ctx), absoluteMs(ctx)));
  await ctx.db.insert(sessions).values({ id: sessionId, userId, expiresAt, userAgent: userAgent?.slice(0, 200) ?? null });
  const token = await signSessionToken(ctx.config.sessionSecret, { userId, sessionId, expiresAt });
  setSessionCookie(res, ctx.config, token, expiresAt);
  return setCsrfCookie(res, ctx.config, csrfTokenFor(ctx.config.sessionSecret, sessionId));
}

export interface LiveSession {
  user: SessionUser;
  createdAt: Date;
}

/** The live session, or null when the row is missing, revoked, past its expiry or past its absolute lifetime. */
export async function findLiveSession(ctx: Pick<AppContext, 'db' | 'config'>, sessionId: string, userId: string): Promise<LiveSession | null> {
  const now = Date.now();
  const rows = await ctx.db
    .select({ id: users.id, email: users.email, name: users.name, createdAt: sessions.createdAt })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(
      and(
        eq(sessions.id, sessionId),
        eq(sessions.userId, userId),
        isNull(sessions.revokedAt),
        gt(sessions.expiresAt, new Date(now)),
        gt(sessions.createdAt, new Date(now - absoluteMs(ctx))),
      ),
    )
    .limit(1);
  const row = rows[0];
  return row ? { user: { id: row.id, email: row.email, name: row.name }, createdAt: row.createdAt } : null;
}

/**
 * Sliding renewal: once half of a token's life has passed, a new token with the same jti and a later
 * expiry replaces it, so an active person is not signed out mid-task while idle sessions still end.
 * The new expiry never passes the absolute end (sign-in + LARIAT_SESSION_MAX_HOURS).
 */
export async function renewIfHalfSpent(ctx: AppContext, res: Response, session: { userId: string; sessionId: string; expiresAt: Date; createdAt: Date }): Promise<void> {
  const lifetime = slidingMs(ctx);
  if (session.expiresAt.getTime() - Date.now() > lifetime / 2) return;
  const end = session.createdAt.getTime() + absoluteMs(ctx);
  const next = new Date(Math.min(Date.now() + lifetime, end));
  if (next.getTime() <= session.expiresAt.getTime()) return;
  await ctx.db.update(sessions).set({ expiresAt: next }).where(eq(sessions.id, session.sessionId));
  const token = await signSessionToken(ctx.config.sessionSecret, { userId: session.userId, sessionId: session.sessionId, expiresAt: next });
  setSessionCookie(res, ctx.config, token, next);
}

export async function revokeSession(db: Database, sessionId: string): Promise<void> {
  await db.update(sessions).set({ revokedAt: new Date() }).where(and(eq(sessions.id, sessionId), isNull(sessions.revokedAt)));
}

/** Ends every session of a user (after a password reset). Takes a transaction or the database. */
export async function revokeAllSessions(db: Pick<Database, 'update'>, userId: string): Promise<void> {
  await db.update(sessions).set({ revokedAt: new Date() }).where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt)));
}

/** Ends every session of a user except `keep`; returns how many ended. */
export async function revokeOtherSessions(db: Pick<Database, 'update'>, userId: string, keep: string): Promise<number> {
  const rows = await db
    .update(sessions)
    .set({ revokedAt: new Date() })
    .where(and(eq(sessions.userId, userId), ne(sessions.id, keep), isNull(sessions.revokedAt), gt(sessions.expiresAt, new Date())))
    .returning({ id: sessions.id });
  return rows.length;
}

/** A stable public name for a session: the jti itself stays server-side (it is half of a credential). */
function publicId(sessionId: string): string {
  return createHash('sha256').update(`session|${sessionId}`).digest('hex').slice(0, 16);
}

/** The user's live sessions, newest first, the current one marked. */
export async function listLiveSessions(ctx: Pick<AppContext, 'db' | 'config'>, userId: string, currentId: string): Promise<SessionDto[]> {
  const now = Date.now();
  const rows = await ctx.db
    .select({ id: sessions.id, createdAt: sessions.createdAt, expiresAt: sessions.expiresAt, userAgent: sessions.userAgent })
    .from(sessions)
    .where(
      and(
        eq(sessions.userId, userId),
        isNull(sessions.revokedAt),
        gt(sessions.expiresAt, new Date(now)),
        gt(sessions.createdAt, new Date(now - absoluteMs(ctx))),
      ),
    )
    .orderBy(desc(sessions.createdAt));
  return rows.map((r) => ({
    id: publicId(r.id),
    signedInAt: r.createdAt.toISOString(),
    expiresAt: r.expiresAt.toISOString(),
    endsAt: new Date(r.createdAt.getTime() + absoluteMs(ctx)).toISOString(),
    userAgent: r.userAgent,
    current: r.id === currentId,
  }));
}
