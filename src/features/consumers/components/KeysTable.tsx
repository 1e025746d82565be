import { KEY_STATE_LABELS, type ApiKeyDto } from '@shared/consumers';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';
import { useKeys } from '../api/keys';
import { useRevokeKey } from '../api/revoke-key';
import { formatWhen } from '@/lib/dates';

const when = (iso: string | null) => (iso ? formatWhen(iso) : 'never');

function KeyRow({ workspaceId, k }: { workspaceId: string; k: ApiKeyDto }) {
  const revoke = useRevokeKey(workspaceId);
  return (
    <tr className="border-t border-slate-200 dark:border-slate-800">
      <td className="py-2 pr-3 font-bold">{k.name}</td>
      <td className="py-2 pr-3 font-mono text-xs">{k.prefix}…</td>
      <td className="py-2 pr-3">{k.scope === 'workspace' ? 'Whole workspace' : k.models.map((m) => m.name).join(', ')}</td>
      <td className="py-2 pr-3">{KEY_STATE_LABELS[k.state]}</td>
      <td className="py-2 pr-3">{when(k.expiresAt)}</td>
      <td className="py-2 pr-3">{when(k.lastUsedAt)}</td>
      <td className="py-2">
        {k.state === 'active' && (
          <Button
            variant="danger"
            busy={revoke.isPending}
            busyLabel="Revoking…"
            onClick={() => {
              if (window.confirm(`Revoke “${k.name}”? Whatever uses it stops working at once.`)) revoke.mutate(k.id);
            }}
          >
            Revoke
          </Button>
        )}
      </td>
    </tr>
  );
}

export function KeysTable({ workspaceId }: { workspaceId: string }) {
  const keys = useKeys(workspaceId);
  if (keys.isError) return <Notice tone="error">{keys.error.message}</Notice>;
  if (!keys.data) return <p className="text-sm">Loading keys…</p>;
  if (keys.data.length === 0) return <p className="text-sm">No keys yet.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">API keys</caption>
        <thead>
          <tr>
            {['Name', 'Starts with', 'May read', 'State', 'Expires', 'Last used'].map((h) => (
              <th key={h} scope="col" className="pb-2 pr-3 font-bold">
                {h}
              </th>
            ))}
            <th scope="col" className="pb-2">
              <span className="sr-only">Actions</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {keys.data.map((k) => (
            <KeyRow key={k.id} workspaceId={workspaceId} k={k} />
          ))}
        </tbody>
      </table>
    </div>
  );
}
