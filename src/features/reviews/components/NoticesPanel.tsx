/** My notices in this workspace (reviews asked for and decided, new releases), with a link each. */
import { Link } from 'react-router';
import { NOTICE_KIND_LABELS } from '@shared/reviews';
import { Button } from '@/components/Button';
import { useMarkNoticesRead } from '../api/mark-notices-read';
import { useNotices } from '../api/notices';
import { formatWhen } from '@/lib/dates';

export function NoticesPanel({ workspaceId }: { workspaceId: string }) {
  const notices = useNotices(workspaceId);
  const markRead = useMarkNoticesRead(workspaceId);
  const list = notices.data ?? [];
  const unread = list.filter((n) => !n.read).length;
  if (list.length === 0) return null;
  return (
    <section aria-labelledby="notices-heading" className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <div className="flex items-center justify-between gap-3">
        <h2 id="notices-heading" className="text-base font-bold">
          Notices {unread > 0 && <span className="ml-1 rounded bg-lariat-700 px-2 text-xs text-white">{unread} new</span>}
        </h2>
        {unread > 0 && (
          <Button variant="quiet" busy={markRead.isPending} onClick={() => markRead.mutate(undefined)}>
            Mark all read
          </Button>
        )}
      </div>
      <ul className="mt-2 space-y-1 text-sm">
        {list.slice(0, 8).map((n) => (
          <li key={n.id} className={n.read ? 'text-slate-500' : 'font-bold'}>
            <span className="mr-2 text-xs uppercase text-slate-500">{NOTICE_KIND_LABELS[n.kind]}</span>
            <Link className="underline" to={n.link}>
              {n.title}
            </Link>
            <span className="ml-2 text-xs text-slate-500">{formatWhen(n.createdAt)}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
