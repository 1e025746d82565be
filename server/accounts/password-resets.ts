/**
 * Forgotten passwords: a random, hashed, single-use token valid for one hour, sent by e-mail. The
 * request never says whether the account exists; completing it sets the password, spends the token
 * (and any other open one) and signs out every session of the account, all in one transaction.
 */
import { and, eq, gt, isNull } from 'drizzle-orm';
import { passwordProblem } from '../../shared/auth';
import { hashPassword } from '../auth/passwords';
import { revokeAllSessions } from '../auth/sessions';
import { hashToken, randomToken } from '../auth/tokens';
import type { AppContext } from '../context';
import type { Database } from '../db/client';
import { passwordResets, users } from '../db/schema/auth';
import { afterResponse } from '../http/background';
import { badRequest, HttpError } from '../http/errors';
import type { Executor } from './executor';
import { passwordResetMail } from './mail';
import { findUserByEmail, setPasswordHash } from './users';

export const RESET_MINUTES = 60;

/**
 * Answers at once and looks the address up afterwards (afterResponse): the answer, and the time it
 * takes, are the same whether or not the address has an account (decision 9).
 */
export function requestPasswordReset(ctx: AppContext, email: string): void {
  afterResponse('password-reset request', async () => {
    const user = await findUserByEmail(ctx.db, email);
    if (!user) return;
    const token = randomToken();
    await ctx.db.insert(passwordResets).values({ userId: user.id, tokenHash: hashToken(token), expiresAt: new Date(Date.now() + RESET_MINUTES * 60_000) });
    await ctx.sendMail(passwordResetMail(ctx, { to: user.email, token }));
  });
}

export async function completePasswordReset(db: Database, token: string, password: string): Promise<void> {
  const [row] = await db
    .select({ id: passwordResets.id, userId: passwordResets.userId, email: users.email, usedAt: passwordResets.usedAt, expiresAt: passwordResets.expiresAt })
    .from(passwordResets)
    .innerJoin(users, eq(users.id, passwordResets.userId))
    .where(eq(passwordResets.tokenHash, hashToken(token)))
    .limit(1);
  if (!row) throw new HttpError(404, 'This reset link is not valid. Check that you copied the whole link, or ask for a new one.', 'token');
  if (row.usedAt) throw new HttpError(410, 'This reset link has already been used. Ask for a new one if you need to.', 'token');
  if (row.expiresAt.getTime() <= Date.now()) throw new HttpError(410, 'This reset link has expired (links last 1 hour). Ask for a new one.', 'token');
  const problem = passwordProblem(password, row.email);
  if (problem) throw badRequest(`password: ${problem}`, 'password');
  const passwordHash = await hashPassword(password);
  await db.transaction(async (tx) => {
    const now = new Date();
    const claimed = await tx
      .update(passwordResets)
      .set({ usedAt: now })
      .where(and(eq(passwordResets.id, row.id), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, now)))
      .returning({ id: passwordResets.id });
    if (claimed.length === 0) throw new HttpError(410, 'This reset link has already been used. Ask for a new one if you need to.', 'token');
    // Other open links for this account die too: the new password is the only way in.
    await spendOpenResetLinks(tx, row.userId);
    await setPasswordHash(tx, row.userId, passwordHash);
    await revokeAllSessions(tx, row.userId);
  });
}

/** Spends every open reset link of an account (after any password change). */
export async function spendOpenResetLinks(db: Executor, userId: string): Promise<void> {
  await db
    .update(passwordResets)
    .set({ usedAt: new Date() })
    .where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt)));
}
