/** Server-side session rows: created at sign-in, looked up on every request, revoked at sign-out. */
import { randomUUID } from 'node:crypto';
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { Response } from 'express';
import type { AppContext } from '../context';
import type { Database } from '../db/client';
import { sessions, users } from '../db/schema/auth';
import { setCsrfCookie, setSessionCookie } from './cookies';
import { signSessionToken } from './session-token';

export interface SessionUser {
  id: string;
  email: string;
  name: string;
}

function lifetimeMs(ctx: AppContext): number {
  return ctx.config.LARIAT_SESSION_MINUTES * 60_000;
}

/** Signs the user in: a new session row, the session cookie and a fresh CSRF cookie. Returns the CSRF value. */
export async function startSession(ctx: AppContext, res: Response, userId: string): Promise<string> {
  const sessionId = randomUUID();
  const expiresAt = new Date(Date.now() + lifetimeMs(ctx));
  await ctx.db.insert(sessions).values({ id: sessionId, userId, expiresAt });
  const token = await signSessionToken(ctx.config.sessionSecret, { userId, sessionId, expiresAt });
  setSessionCookie(res, ctx.config, token, expiresAt);
  return setCsrfCookie(res, ctx.config);
}

/** The live session's user, or null when the row is missing, revoked or past its expiry. */
export async function findLiveSession(db: Database, sessionId: string, userId: string): Promise<SessionUser | null> {
  const rows = await db
    .select({ id: users.id, email: users.email, name: users.name })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(and(eq(sessions.id, sessionId), eq(sessions.userId, userId), isNull(sessions.revokedAt), gt(sessions.expiresAt, new Date())))
    .limit(1);
  return rows[0] ?? null;
}

/**
 * Sliding renewal: once half of a token's life has passed, a new token with the same jti and a later
 * expiry replaces it, so an active person is not signed out mid-task while idle sessions still end.
 */
export async function renewIfHalfSpent(ctx: AppContext, res: Response, userId: string, sessionId: string, expiresAt: Date): Promise<void> {
  const lifetime = lifetimeMs(ctx);
  if (expiresAt.getTime() - Date.now() > lifetime / 2) return;
  const next = new Date(Date.now() + lifetime);
  await ctx.db.update(sessions).set({ expiresAt: next }).where(eq(sessions.id, sessionId));
  const token = await signSessionToken(ctx.config.sessionSecret, { userId, sessionId, expiresAt: next });
  setSessionCookie(res, ctx.config, token, next);
}

export async function revokeSession(db: Database, sessionId: string): Promise<void> {
  await db.update(sessions).set({ revokedAt: new Date() }).where(and(eq(sessions.id, sessionId), isNull(sessions.revokedAt)));
}

/** Ends every session of a user (after a password reset). Takes a transaction or the database. */
export async function revokeAllSessions(db: Pick<Database, 'update'>, userId: string): Promise<void> {
  await db.update(sessions).set({ revokedAt: new Date() }).where(and(eq(sessions.userId, userId), isNull(sessions.revokedAt)));
}
