import { PageHeader } from '@/components/PageHeader';
import { Notice } from '@/components/Notice';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { InviteForm } from './InviteForm';
import { MembersTable } from './MembersTable';
import { PendingInvitations } from './PendingInvitations';

/** Everyone sees who is here; only admins invite, change roles and remove (the server checks again). */
export function MembersPage() {
  const { workspaceId, workspaceName, role, userId } = useCurrentWorkspace();
  const isAdmin = role === 'admin';
  return (
    <>
      <PageHeader title="Members" description={`The people in ${workspaceName} and what each of them may do.`} />
      <div className="space-y-8">
        {isAdmin ? (
          <InviteForm workspaceId={workspaceId} />
        ) : (
          <Notice>Only admins can invite people or change roles. Ask an admin of this workspace if something needs to change.</Notice>
        )}
        <MembersTable workspaceId={workspaceId} userId={userId} canManage={isAdmin} />
        {isAdmin && <PendingInvitations workspaceId={workspaceId} />}
      </div>
    </>
  );
}
