import { useNavigate } from 'react-router';
import { ROLE_LABELS, type WorkspaceRole } from '@shared/members';
import { paths } from '@/app/paths';

export interface SwitcherEntry {
  workspaceId: string;
  workspaceName: string;
  role: WorkspaceRole;
}

const NEW_WORKSPACE = '__new__';

/** A plain select: every workspace of the person (with their role there), and "New workspace…". */
export function WorkspaceSwitcher({ current, entries }: { current: string; entries: readonly SwitcherEntry[] }) {
  const navigate = useNavigate();
  return (
    <div>
      <label htmlFor="workspace-switcher" className="block text-xs font-bold uppercase tracking-wide text-lariat-100">
        Workspace
      </label>
      <select
        id="workspace-switcher"
        value={current}
        onChange={(e) =>
          navigate(e.target.value === NEW_WORKSPACE ? paths.newWorkspace.getHref() : paths.workspace.root.getHref(e.target.value))
        }
        className="mt-1 w-full rounded-md border border-lariat-600 bg-lariat-900 px-2 py-1.5 text-sm text-white"
      >
        {entries.map((e) => (
          <option key={e.workspaceId} value={e.workspaceId}>
            {e.workspaceName} ({ROLE_LABELS[e.role]})
          </option>
        ))}
        <option value={NEW_WORKSPACE}>New workspace…</option>
      </select>
    </div>
  );
}
