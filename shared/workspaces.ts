/** Workspaces: the unit of isolation (no data crosses workspaces). */
import { z } from 'zod';
import type { WorkspaceRole } from './members';
import { singleLine } from './text';

export const WORKSPACE_NAME_MAX = 80;

export const workspaceNameSchema = singleLine(
  z
    .string({ error: 'Enter a workspace name.' })
    .trim()
    .min(1, 'Enter a workspace name.')
    .max(WORKSPACE_NAME_MAX, `A workspace name has at most ${WORKSPACE_NAME_MAX} characters.`),
);

/** POST /api/workspaces */
export const createWorkspaceSchema = z.strictObject({ name: workspaceNameSchema });
export type CreateWorkspaceInput = z.input<typeof createWorkspaceSchema>;

/** GET /api/workspaces (mine) and GET /api/workspaces/:workspaceId */
export interface WorkspaceDto {
  id: string;
  name: string;
  /** The signed-in person's role here. */
  role: WorkspaceRole;
  createdAt: string;
}
