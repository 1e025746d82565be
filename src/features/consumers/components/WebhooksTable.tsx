import { useState } from 'react';
import { DELIVERY_STATE_LABELS, type WebhookDto } from '@shared/consumers';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';
import { useDeliveries } from '../api/deliveries';
import { useRemoveWebhook } from '../api/remove-webhook';
import { useWebhooks } from '../api/webhooks';
import { formatWhen } from '@/lib/dates';

function DeliveryHistory({ workspaceId, webhookId }: { workspaceId: string; webhookId: string }) {
  const deliveries = useDeliveries(workspaceId, webhookId);
  if (deliveries.isError) return <Notice tone="error">{deliveries.error.message}</Notice>;
  if (!deliveries.data) return <p className="text-sm">Loading deliveries…</p>;
  if (deliveries.data.length === 0) return <p className="text-sm">Nothing sent yet: the first release after this webhook was added will be.</p>;
  return (
    <ul className="space-y-2 text-sm">
      {deliveries.data.map((d) => (
        <li key={d.id} className="rounded border border-slate-200 p-2 dark:border-slate-800">
          <span className="font-bold">{DELIVERY_STATE_LABELS[d.state]}</span> · {d.event} · {formatWhen(d.createdAt)}
          <ol className="mt-1 list-decimal pl-5">
            {d.attempts.map((a) => (
              <li key={a.at}>
                {formatWhen(a.at)}: {a.status === null ? 'no answer' : `HTTP ${a.status}`}
                {a.error ? ` (${a.error})` : ''}, {a.ms} ms
              </li>
            ))}
          </ol>
        </li>
      ))}
    </ul>
  );
}

function WebhookRow({ workspaceId, hook }: { workspaceId: string; hook: WebhookDto }) {
  const [open, setOpen] = useState(false);
  const remove = useRemoveWebhook(workspaceId);
  return (
    <li className="rounded-lg border border-slate-200 p-3 dark:border-slate-800">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <div>
          <p className="break-all font-mono text-sm">{hook.url}</p>
          <p className="text-xs text-slate-700 dark:text-slate-300">
            {hook.model ? `Releases of ${hook.model.name}` : 'Releases of every model'}
            {hook.description ? ` · ${hook.description}` : ''}
            {hook.removedAt ? ` · removed ${formatWhen(hook.removedAt)}` : ''}
          </p>
        </div>
        <div className="flex gap-2">
          <Button variant="secondary" aria-expanded={open} onClick={() => setOpen((o) => !o)}>
            {open ? 'Hide history' : 'Delivery history'}
          </Button>
          {!hook.removedAt && (
            <Button
              variant="danger"
              busy={remove.isPending}
              onClick={() => {
                if (window.confirm(`Stop sending releases to ${hook.url}?`)) remove.mutate(hook.id);
              }}
            >
              Remove
            </Button>
          )}
        </div>
      </div>
      {open && (
        <div className="mt-3">
          <DeliveryHistory workspaceId={workspaceId} webhookId={hook.id} />
        </div>
      )}
    </li>
  );
}

export function WebhooksTable({ workspaceId }: { workspaceId: string }) {
  const hooks = useWebhooks(workspaceId);
  if (hooks.isError) return <Notice tone="error">{hooks.error.message}</Notice>;
  if (!hooks.data) return <p className="text-sm">Loading webhooks…</p>;
  if (hooks.data.length === 0) return <p className="text-sm">No webhooks yet.</p>;
  return (
    <ul className="space-y-2">
      {hooks.data.map((h) => (
        <WebhookRow key={h.id} workspaceId={workspaceId} hook={h} />
      ))}
    </ul>
  );
}
