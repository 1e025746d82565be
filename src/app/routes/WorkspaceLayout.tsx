import { Outlet, useParams } from 'react-router';
import { useMe } from '@/lib/session';
import { WorkspaceContext } from '@/lib/workspace-context';
import { NotFoundPage } from './NotFoundPage';
import { AppShell } from './AppShell';

/**
 * Everything under /w/:workspaceId. The workspace must be one of the person's memberships; any other
 * id reads as "not found" (the server refuses too: this only keeps the page honest).
 */
export function WorkspaceLayout() {
  const { workspaceId = '' } = useParams();
  const me = useMe().data;
  if (!me) return null; // RequireSession above has already redirected
  const membership = me.memberships.find((m) => m.workspaceId === workspaceId);
  if (!membership) return <NotFoundPage message="There is no workspace at this address that you belong to." />;
  return (
    <WorkspaceContext.Provider value={{ ...membership, userId: me.user.id }}>
      <AppShell me={me} current={membership}>
        <Outlet />
      </AppShell>
    </WorkspaceContext.Provider>
  );
}
