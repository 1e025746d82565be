/** The audit log (admins): the latest changes of state, and the whole log as CSV. */
import { auditCsvUrl, useAuditLog } from '../api/audit';
import { formatWhen } from '@/lib/dates';

export function AuditLogPanel({ workspaceId }: { workspaceId: string }) {
  const log = useAuditLog(workspaceId, true);
  return (
    <section aria-labelledby="audit-heading" className="overflow-x-auto rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <div className="flex items-center justify-between">
        <h2 id="audit-heading" className="text-base font-bold">
          Audit log
        </h2>
        <a className="text-sm font-bold underline" href={auditCsvUrl(workspaceId)} download>
          Download the whole log (CSV)
        </a>
      </div>
      <p className="text-xs text-slate-500">Every change of state: who, what, when and from where. Entries are never changed or removed.</p>
      <table className="mt-2 border-collapse text-xs">
        <thead>
          <tr className="text-left">
            <th className="px-2 py-1">When</th>
            <th className="px-2">Who</th>
            <th className="px-2">What</th>
            <th className="px-2">On</th>
            <th className="px-2">From</th>
          </tr>
        </thead>
        <tbody>
          {(log.data ?? []).slice(0, 50).map((e) => (
            <tr key={e.id} className="border-t border-slate-100 dark:border-slate-800">
              <td className="px-2 py-1">{formatWhen(e.at)}</td>
              <td className="px-2">{e.actor.label || e.actor.userId || e.actor.apiKeyId}</td>
              <td className="px-2 font-mono">{e.action}</td>
              <td className="px-2">
                {e.targetType} {e.targetId?.slice(0, 8)}
              </td>
              <td className="px-2">{e.ip ?? ''}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
