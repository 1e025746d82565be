import type { MemberDto } from '@shared/members';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { useChangeMemberRole } from '../api/change-member-role';
import { useMembers } from '../api/members';
import { useRemoveMember } from '../api/remove-member';
import { MemberRow } from './MemberRow';

export function MembersTable({ workspaceId, userId, canManage }: { workspaceId: string; userId: string; canManage: boolean }) {
  const members = useMembers(workspaceId);
  const changeRole = useChangeMemberRole(workspaceId);
  const remove = useRemoveMember(workspaceId);

  if (members.isPending) return <Loading label="Loading members…" />;
  if (members.isError) return <Notice tone="error">Could not load the members: {members.error.message}</Notice>;

  const mutationError = changeRole.error ?? remove.error;
  const busyFor = (m: MemberDto) =>
    (changeRole.isPending && changeRole.variables?.userId === m.userId) || (remove.isPending && remove.variables === m.userId);

  return (
    <div className="space-y-3">
      {mutationError && <Notice tone="error">{mutationError.message}</Notice>}
      <div className="overflow-x-auto rounded-lg border border-slate-200 bg-white dark:border-slate-800 dark:bg-slate-900">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">People in this workspace</caption>
          <thead className="bg-slate-100 text-xs uppercase tracking-wide text-slate-700 dark:bg-slate-800 dark:text-slate-300">
            <tr>
              <th scope="col" className="px-4 py-2">Name</th>
              <th scope="col" className="px-4 py-2">E-mail</th>
              <th scope="col" className="px-4 py-2">Role</th>
              <th scope="col" className="px-4 py-2">Joined</th>
              {canManage && <th scope="col" className="px-4 py-2"><span className="sr-only">Actions</span></th>}
            </tr>
          </thead>
          <tbody>
            {members.data.map((m) => (
              <MemberRow
                key={m.userId}
                member={m}
                isSelf={m.userId === userId}
                canManage={canManage}
                busy={busyFor(m)}
                onChangeRole={(role) => changeRole.mutate({ userId: m.userId, role })}
                onRemove={() => remove.mutate(m.userId)}
              />
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
