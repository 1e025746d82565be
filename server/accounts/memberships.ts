/** Data access and rules for members: role changes and removal, never leaving a workspace without an admin. */
import { and, asc, eq } from 'drizzle-orm';
import type { MemberDto, WorkspaceRole } from '../../shared/members';
import type { Database } from '../db/client';
import { memberships, users } from '../db/schema/auth';
import { conflict, notFound } from '../http/errors';
import type { Executor } from './executor';

export async function findMembership(db: Executor, workspaceId: string, userId: string): Promise<{ role: WorkspaceRole } | null> {
  const rows = await db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
    .limit(1);
  return rows[0] ?? null;
}

export async function listMembers(db: Executor, workspaceId: string): Promise<MemberDto[]> {
  const rows = await db
    .select({ userId: users.id, email: users.email, name: users.name, role: memberships.role, joinedAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.workspaceId, workspaceId))
    .orderBy(asc(users.name), asc(users.email));
  return rows.map((r) => ({ ...r, joinedAt: r.joinedAt.toISOString() }));
}

/** Adds a member, or keeps the existing membership as it is (accepting an invitation twice is harmless). */
export async function addMember(db: Executor, workspaceId: string, userId: string, role: WorkspaceRole): Promise<void> {
  await db.insert(memberships).values({ workspaceId, userId, role }).onConflictDoNothing();
}

/**
 * Locks the workspace's memberships (FOR UPDATE) and checks the target exists and that the change
 * keeps at least one admin; two admins demoting each other at once cannot both succeed.
 */
async function guardLastAdmin(tx: Executor, workspaceId: string, userId: string, nextRole: WorkspaceRole | null): Promise<void> {
  const rows = await tx
    .select({ userId: memberships.userId, role: memberships.role })
    .from(memberships)
    .where(eq(memberships.workspaceId, workspaceId))
    .for('update');
  const target = rows.find((r) => r.userId === userId);
  if (!target) throw notFound('No such member in this workspace.');
  const adminsAfter = rows.filter((r) => (r.userId === userId ? nextRole === 'admin' : r.role === 'admin')).length;
  if (adminsAfter === 0) {
    throw conflict(
      nextRole === null
        ? 'This is the last admin of the workspace; make someone else admin before removing them.'
        : 'This is the last admin of the workspace; make someone else admin before changing this role.',
      nextRole === null ? 'userId' : 'role',
    );
  }
}

export async function changeRole(db: Database, workspaceId: string, userId: string, role: WorkspaceRole): Promise<void> {
  await db.transaction(async (tx) => {
    await guardLastAdmin(tx, workspaceId, userId, role);
    await tx
      .update(memberships)
      .set({ role })
      .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)));
  });
}

export async function removeMember(db: Database, workspaceId: string, userId: string): Promise<void> {
  await db.transaction(async (tx) => {
    await guardLastAdmin(tx, workspaceId, userId, null);
    await tx.delete(memberships).where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)));
  });
}

/** The workspaces where this person is an admin. */
export async function adminWorkspaceIds(db: Executor, userId: string): Promise<Set<string>> {
  const rows = await db
    .select({ workspaceId: memberships.workspaceId })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.role, 'admin')));
  return new Set(rows.map((r) => r.workspaceId));
}
