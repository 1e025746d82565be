/** Data access for workspaces: creation (with its first admin) and the caller's list. */
import { and, asc, eq } from 'drizzle-orm';
import type { WorkspaceDto } from '../../shared/workspaces';
import { memberships, workspaces } from '../db/schema/auth';
import type { Executor } from './executor';

/** A workspace and its creator's admin membership; call inside a transaction. */
export async function insertWorkspaceWithAdmin(db: Executor, name: string, userId: string, role: WorkspaceDto['role'] = 'admin'): Promise<WorkspaceDto> {
  const [ws] = await db.insert(workspaces).values({ name, createdBy: userId }).returning();
  await db.insert(memberships).values({ workspaceId: ws.id, userId, role });
  return { id: ws.id, name: ws.name, role, createdAt: ws.createdAt.toISOString() };
}

const selection = { id: workspaces.id, name: workspaces.name, role: memberships.role, createdAt: workspaces.createdAt };

export async function listWorkspacesOf(db: Executor, userId: string): Promise<WorkspaceDto[]> {
  const rows = await db
    .select(selection)
    .from(memberships)
    .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(workspaces.name), asc(workspaces.createdAt));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}

export async function findWorkspaceOf(db: Executor, userId: string, workspaceId: string): Promise<WorkspaceDto | null> {
  const rows = await db
    .select(selection)
    .from(memberships)
    .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
    .where(and(eq(memberships.userId, userId), eq(memberships.workspaceId, workspaceId)))
    .limit(1);
  return rows[0] ? { ...rows[0], createdAt: rows[0].createdAt.toISOString() } : null;
}

export async function findWorkspaceName(db: Executor, workspaceId: string): Promise<string | null> {
  const rows = await db.select({ name: workspaces.name }).from(workspaces).where(eq(workspaces.id, workspaceId)).limit(1);
  return rows[0]?.name ?? null;
}
