/** Workspace roles and member management: one schema per request body, used by client forms and handlers. */
import { z } from 'zod';

/**
 * The four roles a person can hold in a workspace (DESIGN.md "Who uses it"). Not a strict hierarchy:
 * reviewers review and analysts upload, so routes name the roles they accept explicitly.
 */
export const WORKSPACE_ROLES = ['admin', 'analyst', 'reviewer', 'viewer'] as const;
export type WorkspaceRole = (typeof WORKSPACE_ROLES)[number];

export const ROLE_LABELS: Record<WorkspaceRole, string> = {
  admin: 'Admin',
  analyst: 'Analyst',
  reviewer: 'Reviewer',
  viewer: 'Viewer',
};

export const roleSchema = z.enum(WORKSPACE_ROLES, {
  error: () => `Choose one of the roles: ${WORKSPACE_ROLES.join(', ')}.`,
});

/** PATCH /api/workspaces/:workspaceId/members/:userId */
export const changeRoleSchema = z.strictObject({ role: roleSchema });
export type ChangeRoleInput = z.infer<typeof changeRoleSchema>;

export interface MemberDto {
  userId: string;
  email: string;
  name: string;
  role: WorkspaceRole;
  joinedAt: string;
}
