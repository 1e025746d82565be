/**
 * Sign-in, the "me" view, the demo seed's account and new workspaces. Sign-up lives in sign-up.ts
 * (two steps: an e-mailed link creates the account).
 */
import type { MembershipSummaryDto, UserDto } from '../../shared/auth';
import type { WorkspaceRole } from '../../shared/members';
import type { WorkspaceDto } from '../../shared/workspaces';
import { hashPassword, verifyPassword } from '../auth/passwords';
import type { Database } from '../db/client';
import { HttpError } from '../http/errors';
import { findUserByEmail, insertUser, toUserDto } from './users';
import { insertWorkspaceWithAdmin, listWorkspacesOf } from './workspaces';

/** The user for a right e-mail and password; one message for both wrong cases (no enumeration). */
export async function authenticate(db: Database, email: string, password: string): Promise<UserDto> {
  const user = await findUserByEmail(db, email);
  const ok = await verifyPassword(user?.passwordHash ?? null, password);
  if (!user || !ok) throw new HttpError(401, 'The e-mail address or the password is not right.', 'password');
  return toUserDto(user);
}

export async function membershipSummaries(db: Database, userId: string): Promise<MembershipSummaryDto[]> {
  const list = await listWorkspacesOf(db, userId);
  return list.map((w) => ({ workspaceId: w.id, workspaceName: w.name, role: w.role }));
}

/**
 * For the demo seed (idempotent): the account with this e-mail (created with `password` if missing;
 * an existing password is left alone) and its membership of a workspace named `workspaceName`
 * (created with this role if the person has no workspace of that name).
 */
export async function ensureUserWithWorkspace(
  db: Database,
  input: { email: string; password: string; name: string; workspaceName: string; role: WorkspaceRole },
): Promise<{ userId: string; workspaceId: string }> {
  const email = input.email.trim().toLowerCase();
  const existing = await findUserByEmail(db, email);
  const passwordHash = existing ? '' : await hashPassword(input.password);
  return db.transaction(async (tx) => {
    const user = existing ?? (await insertUser(tx, { email, name: input.name, passwordHash }));
    const workspaces = await listWorkspacesOf(tx, user.id);
    const found = workspaces.find((w) => w.name === input.workspaceName);
    if (found) return { userId: user.id, workspaceId: found.id };
    const created = await insertWorkspaceWithAdmin(tx, input.workspaceName, user.id, input.role);
    return { userId: user.id, workspaceId: created.id };
  });
}

/** POST /api/workspaces: a new workspace with its creator as admin. */
export async function createWorkspace(db: Database, name: string, userId: string): Promise<WorkspaceDto> {
  return db.transaction((tx) => insertWorkspaceWithAdmin(tx, name, userId));
}
