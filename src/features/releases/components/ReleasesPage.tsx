/**
 * Releases: each model's current release (what consumers receive) and its earlier releases, which stay
 * readable and can be restored; publishing an approved fit (admins and analysts); the audit log (admins).
 */
import { useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router';
import type { ReleaseDto } from '@shared/reviews';
import { paths } from '@/app/paths';
import { Button } from '@/components/Button';
import { TextField } from '@/components/Field';
import { EmptyState } from '@/components/EmptyState';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useReleases } from '../api/releases';
import { useRestoreRelease } from '../api/restore-release';
import { AuditLogPanel } from './AuditLogPanel';
import { PublishReleaseForm } from './PublishReleaseForm';
import { formatWhen } from '@/lib/dates';

export function ReleasesPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const [params] = useSearchParams();
  const only = params.get('model');
  const releases = useReleases(workspaceId);
  const canRelease = role === 'admin' || role === 'analyst';
  const byModel = useMemo(() => {
    const m = new Map<string, ReleaseDto[]>();
    for (const r of releases.data ?? []) if (!only || r.modelId === only) m.set(r.modelId, [...(m.get(r.modelId) ?? []), r]);
    for (const list of m.values()) list.sort((a, b) => b.number - a.number);
    return [...m.values()];
  }, [releases.data, only]);
  return (
    <>
      <PageHeader title="Releases" description="The fit that dashboards, scoring services and other teams receive for each model: its current release. Only an approved fit can be released." />
      <div className="space-y-6">
        {canRelease && <PublishReleaseForm workspaceId={workspaceId} />}
        {releases.isPending && <Loading label="Loading releases…" />}
        {releases.error && <Notice tone="error">{releases.error.message}</Notice>}
        {releases.data?.length === 0 && (
          <EmptyState title="No releases yet">
            <p>Once a reviewer approves a fit, an analyst or admin can release it here.</p>
          </EmptyState>
        )}
        {only && (
          <p className="text-sm">
            Showing one model. <Link className="underline" to={paths.workspace.releases.getHref(workspaceId)}>Show all models</Link>
          </p>
        )}
        {byModel.map((list) => (
          <ModelReleases key={list[0].modelId} workspaceId={workspaceId} list={list} canRestore={canRelease} />
        ))}
        {role === 'admin' && <AuditLogPanel workspaceId={workspaceId} />}
      </div>
    </>
  );
}

function ModelReleases({ workspaceId, list, canRestore }: { workspaceId: string; list: ReleaseDto[]; canRestore: boolean }) {
  return (
    <section aria-label={`Releases of ${list[0].modelName}`} className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <h2 className="text-base font-bold">{list[0].modelName}</h2>
      <ul className="mt-2 space-y-3">
        {list.map((r) => (
          <li key={r.id} className="border-t border-slate-100 pt-2 text-sm dark:border-slate-800">
            <div className="flex flex-wrap items-center gap-2">
              <strong>Release {r.number}</strong>
              {r.current && <span className="rounded bg-lariat-700 px-2 text-xs font-bold text-white">Current</span>}
              <Link className="underline" to={paths.workspace.fit.getHref(workspaceId, r.fitId)}>
                version {r.fitVersion}
              </Link>
              <span className="text-slate-500">
                lambda position {r.lambdaIndex + 1} · by {r.releasedBy.name ?? 'a former member'} on {formatWhen(r.releasedAt)}
              </span>
              {r.restoredFrom && <span className="text-slate-500">· restores release {r.restoredFrom.number}</span>}
              {r.reviewId && (
                <Link className="underline" to={paths.workspace.review.getHref(workspaceId, r.reviewId)}>
                  the approval
                </Link>
              )}
            </div>
            <p className="whitespace-pre-wrap">{r.notes}</p>
            {canRestore && !r.current && <RestoreForm workspaceId={workspaceId} release={r} />}
          </li>
        ))}
      </ul>
    </section>
  );
}

function RestoreForm({ workspaceId, release }: { workspaceId: string; release: ReleaseDto }) {
  const [open, setOpen] = useState(false);
  const [notes, setNotes] = useState('');
  const restore = useRestoreRelease(workspaceId);
  if (!open)
    return (
      <Button variant="quiet" onClick={() => setOpen(true)}>
        Restore release {release.number}
      </Button>
    );
  return (
    <form
      className="mt-2 flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        restore.mutate({ releaseId: release.id, notes }, { onSuccess: () => setOpen(false) });
      }}
    >
      <TextField label={`Why release ${release.number} comes back`} value={notes} onChange={(e) => setNotes(e.target.value)} />
      <Button type="submit" disabled={!notes.trim()} busy={restore.isPending}>
        Restore as a new release
      </Button>
      {restore.error && <Notice tone="error">{restore.error.message}</Notice>}
    </form>
  );
}
