import { formatWhen } from '@/lib/dates';
import { Button } from '@/components/Button';
import { EmptyState } from '@/components/EmptyState';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useOutbox } from '../api/outbox';
import { LinkifiedText } from './LinkifiedText';

/** Development only: the e-mails Lariat would have sent, so invitation and reset links can be followed. */
export function OutboxPage() {
  const outbox = useOutbox();
  return (
    <>
      <PageHeader
        title="Outbox"
        description="In development and tests Lariat does not send real e-mail. Messages to you, and invitations sent from workspaces you administer, are caught by a local mail server and shown here, newest first."
        actions={
          <Button variant="secondary" onClick={() => outbox.refetch()} busy={outbox.isFetching} busyLabel="Refreshing…">
            Refresh
          </Button>
        }
      />
      {outbox.isPending && <Loading label="Loading captured e-mail…" />}
      {outbox.isError && <Notice tone="error">{outbox.error.message}</Notice>}
      {outbox.data?.length === 0 && (
        <EmptyState title="No e-mail yet">
          <p>Invitations and password reset messages will appear here as soon as Lariat sends them.</p>
        </EmptyState>
      )}
      <ol className="space-y-4">
        {(outbox.data ?? []).map((m) => (
          <li key={m.id} className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
            <article aria-label={m.subject}>
              <h2 className="font-bold">{m.subject || '(no subject)'}</h2>
              <p className="text-xs text-slate-600 dark:text-slate-400">
                To {m.to.join(', ')} · {formatWhen(m.receivedAt)}
              </p>
              <p className="mt-3 whitespace-pre-wrap text-sm text-slate-800 dark:text-slate-200">
                <LinkifiedText text={m.text} />
              </p>
            </article>
          </li>
        ))}
      </ol>
    </>
  );
}
