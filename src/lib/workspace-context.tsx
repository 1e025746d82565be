import { createContext, useContext } from 'react';
import type { WorkspaceRole } from '@shared/members';

/** The workspace the current page belongs to and the signed-in person's role in it. */
export interface CurrentWorkspace {
  workspaceId: string;
  workspaceName: string;
  role: WorkspaceRole;
  userId: string;
}

export const WorkspaceContext = createContext<CurrentWorkspace | null>(null);

/** For pages under /w/:workspaceId; the app's workspace layout provides it. */
export function useCurrentWorkspace(): CurrentWorkspace {
  const value = useContext(WorkspaceContext);
  if (!value) throw new Error('useCurrentWorkspace() is only available inside a workspace page');
  return value;
}
