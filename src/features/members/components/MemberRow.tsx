import { formatDay } from '@/lib/dates';
import { useState } from 'react';
import { ROLE_LABELS, WORKSPACE_ROLES, type MemberDto, type WorkspaceRole } from '@shared/members';
import { Button } from '@/components/Button';

interface MemberRowProps {
  member: MemberDto;
  isSelf: boolean;
  /** Admins manage other people; nobody changes their own role or removes themselves here. */
  canManage: boolean;
  onChangeRole(role: WorkspaceRole): void;
  onRemove(): void;
  busy: boolean;
}

export function MemberRow({ member, isSelf, canManage, onChangeRole, onRemove, busy }: MemberRowProps) {
  const [confirming, setConfirming] = useState(false);
  const manage = canManage && !isSelf;
  return (
    <tr className="border-t border-slate-200 dark:border-slate-800">
      <td className="px-4 py-3 font-bold">
        {member.name}
        {isSelf && <span className="ml-2 text-xs font-normal text-slate-600 dark:text-slate-400">(you)</span>}
      </td>
      <td className="px-4 py-3 text-slate-700 dark:text-slate-300">{member.email}</td>
      <td className="px-4 py-3">
        {manage ? (
          <>
            <label htmlFor={`role-${member.userId}`} className="sr-only">
              Role of {member.name}
            </label>
            <select
              id={`role-${member.userId}`}
              value={member.role}
              disabled={busy}
              onChange={(e) => onChangeRole(e.target.value as WorkspaceRole)}
              className="rounded-md border border-slate-400 bg-white px-2 py-1 text-sm dark:border-slate-500 dark:bg-slate-900"
            >
              {WORKSPACE_ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </select>
          </>
        ) : (
          ROLE_LABELS[member.role]
        )}
      </td>
      <td className="px-4 py-3 text-slate-700 dark:text-slate-300">{formatDay(member.joinedAt)}</td>
      {canManage && (
        <td className="px-4 py-3 text-right">
          {manage &&
            (confirming ? (
              <span className="inline-flex items-center gap-2">
                <span className="text-sm">Remove {member.name}?</span>
                <Button variant="danger" onClick={onRemove} busy={busy} busyLabel="Removing…">
                  Yes, remove
                </Button>
                <Button variant="secondary" onClick={() => setConfirming(false)}>
                  Keep
                </Button>
              </span>
            ) : (
              <Button variant="secondary" onClick={() => setConfirming(true)} aria-label={`Remove ${member.name}`}>
                Remove
              </Button>
            ))}
        </td>
      )}
    </tr>
  );
}
