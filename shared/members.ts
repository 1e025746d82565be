/** Workspace roles and member management: one schema per request body, used by client forms and handlers. */
import { z } from 'zod';
import { emailSchema } from './auth';

/**
 * The four roles a person can hold in a workspace (docs/roles.md). Not a strict hierarchy:
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

/** POST /api/workspaces/:workspaceId/invitations */
export const createInvitationSchema = z.strictObject({
  email: emailSchema,
  role: roleSchema,
});
export type CreateInvitationInput = z.infer<typeof createInvitationSchema>;

/** Invitations last a week; after that the admin sends a new one. */
export const INVITATION_DAYS = 7;

export interface InvitationDto {
  id: string;
  email: string;
  role: WorkspaceRole;
  invitedByName: string | null;
  createdAt: string;
  expiresAt: string;
}

/** GET /api/invitations/:token: what the link is for, before accepting it. */
export interface InvitationPreviewDto {
  workspaceName: string;
  email: string;
  role: WorkspaceRole;
  invitedByName: string | null;
  expiresAt: string;
  /** True when that e-mail already has an account: the client asks them to sign in, then accept. */
  accountExists: boolean;
}
