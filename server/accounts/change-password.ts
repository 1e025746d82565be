/**
 * Changing the password while signed in (ASVS 2.1.5/2.1.6): the current password is required, the
 * new one follows the same rules as at sign-up, every other session of the account and every open
 * reset link end in the same transaction, and the owner gets an e-mail saying so.
 */
import { passwordProblem } from '../../shared/auth';
import { hashPassword, verifyPassword } from '../auth/passwords';
import { revokeOtherSessions } from '../auth/sessions';
import type { AppContext } from '../context';
import { badRequest } from '../http/errors';
import { passwordChangedMail, sendInBackground } from './mail';
import { spendOpenResetLinks } from './password-resets';
import { findUserById, setPasswordHash, type UserRecord } from './users';

export async function changePassword(
  ctx: AppContext,
  userId: string,
  keepSessionId: string,
  input: { currentPassword: string; newPassword: string },
): Promise<{ signedOut: number }> {
  const user: UserRecord | null = await findUserById(ctx.db, userId);
  if (!(await verifyPassword(user?.passwordHash ?? null, input.currentPassword)) || !user) {
    throw badRequest('currentPassword: This is not your current password.', 'currentPassword');
  }
  const problem = passwordProblem(input.newPassword, user.email);
  if (problem) throw badRequest(`newPassword: ${problem}`, 'newPassword');
  if (input.newPassword === input.currentPassword) throw badRequest('newPassword: Choose a password different from the current one.', 'newPassword');
  const passwordHash = await hashPassword(input.newPassword);
  const signedOut = await ctx.db.transaction(async (tx) => {
    await setPasswordHash(tx, user.id, passwordHash);
    await spendOpenResetLinks(tx, user.id);
    return revokeOtherSessions(tx, user.id, keepSessionId);
  });
  sendInBackground(ctx, passwordChangedMail(ctx, { to: user.email, signedOut }));
  return { signedOut };
}
