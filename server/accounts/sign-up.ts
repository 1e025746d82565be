/**
 * Sign-up in two steps (docs/decisions/0009-sign-up-and-reset-without-enumeration.md):
 * 1. `requestSignUp` hashes the password (the same work for every address), and after the answer
 *    is sent either stores a pending sign-up and e-mails its link, or tells the owner of an existing
 *    account that someone tried. The answer never depends on which.
 * 2. `completeSignUp` spends the e-mailed token and creates the account and its workspace, all in one
 *    transaction. Every sign-up, the first of a fresh install included, gets its own new workspace
 *    with the new person as admin (decision 2).
 */
import { and, eq, gt, isNull } from 'drizzle-orm';
import type { UserDto } from '../../shared/auth';
import { hashPassword } from '../auth/passwords';
import { hashToken, randomToken } from '../auth/tokens';
import type { AppContext } from '../context';
import type { Database } from '../db/client';
import { signUpRequests } from '../db/schema/auth';
import { afterResponse } from '../http/background';
import { conflict, HttpError } from '../http/errors';
import { isUniqueViolation } from './executor';
import { accountExistsMail, finishSignUpMail } from './mail';
import { findUserByEmail, insertUser } from './users';
import { insertWorkspaceWithAdmin } from './workspaces';

export const SIGN_UP_MINUTES = 60;

export async function requestSignUp(ctx: AppContext, input: { email: string; password: string; name: string; workspaceName?: string }): Promise<void> {
  const passwordHash = await hashPassword(input.password);
  afterResponse('sign-up request', async () => {
    const existing = await findUserByEmail(ctx.db, input.email);
    if (existing) {
      await ctx.sendMail(accountExistsMail(ctx, { to: existing.email }));
      return;
    }
    const token = randomToken();
    await ctx.db.insert(signUpRequests).values({
      email: input.email,
      name: input.name,
      workspaceName: input.workspaceName ?? null,
      passwordHash,
      tokenHash: hashToken(token),
      expiresAt: new Date(Date.now() + SIGN_UP_MINUTES * 60_000),
    });
    await ctx.sendMail(finishSignUpMail(ctx, { to: input.email, token }));
  });
}

async function explainUnusable(db: Database, tokenHash: string): Promise<HttpError> {
  const [row] = await db.select({ usedAt: signUpRequests.usedAt }).from(signUpRequests).where(eq(signUpRequests.tokenHash, tokenHash)).limit(1);
  if (!row) return new HttpError(404, 'This sign-up link is not valid. Check that you copied the whole link, or sign up again.', 'token');
  if (row.usedAt) return new HttpError(410, 'This sign-up link has already been used. Sign in instead.', 'token');
  return new HttpError(410, 'This sign-up link has expired (links last 1 hour). Sign up again.', 'token');
}

export async function completeSignUp(db: Database, token: string): Promise<{ user: UserDto; workspaceId: string }> {
  const tokenHash = hashToken(token);
  try {
    return await db.transaction(async (tx) => {
      const now = new Date();
      const [claimed] = await tx
        .update(signUpRequests)
        .set({ usedAt: now })
        .where(and(eq(signUpRequests.tokenHash, tokenHash), isNull(signUpRequests.usedAt), gt(signUpRequests.expiresAt, now)))
        .returning();
      if (!claimed) throw await explainUnusable(db, tokenHash);
      const user = await insertUser(tx, { email: claimed.email, name: claimed.name, passwordHash: claimed.passwordHash });
      const workspace = await insertWorkspaceWithAdmin(tx, claimed.workspaceName ?? `${claimed.name}'s workspace`, user.id);
      return { user, workspaceId: workspace.id };
    });
  } catch (err) {
    // Two pending sign-ups for one address, or an invitation accepted in between: the first wins.
    if (isUniqueViolation(err)) throw conflict('This e-mail address already has an account. Sign in, or reset your password.', 'email');
    throw err;
  }
}
