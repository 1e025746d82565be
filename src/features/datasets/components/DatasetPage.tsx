import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { paths } from '@/app/paths';
import { Button } from '@/components/Button';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useDataset } from '../api/dataset';
import { useDatasets } from '../api/datasets';
import { useDeleteDataset } from '../api/delete-dataset';
import { countFormat, formatBytes, formatWhen } from './format';
import { UploadPanel } from './UploadPanel';

const ORIGIN: Record<string, string> = { upload: 'Upload', 'column-settings': 'Column settings', 'open-dataset': 'Open dataset' };

/** One dataset: its versions (newest last), a new-version upload, and deletion. */
export function DatasetPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const { datasetId = '' } = useParams();
  const navigate = useNavigate();
  const canEdit = role === 'admin' || role === 'analyst';
  const dataset = useDataset(workspaceId, datasetId);
  const limits = useDatasets(workspaceId);
  const remove = useDeleteDataset(workspaceId);
  const [confirming, setConfirming] = useState(false);
  if (dataset.isPending) return <Loading label="Loading the dataset…" />;
  if (dataset.error) return <Notice tone="error">{dataset.error.message}</Notice>;
  const d = dataset.data;
  return (
    <>
      <PageHeader title={d.name} description={d.description || undefined} />
      <div className="space-y-8">
        <table className="w-full text-left text-sm">
          <caption className="mb-2 text-left text-lg font-bold">Versions</caption>
          <thead className="border-b border-slate-300 dark:border-slate-700">
            <tr>
              <th className="py-2">Version</th>
              <th>Made by</th>
              <th>File</th>
              <th>Rows × columns</th>
              <th>SHA-256</th>
              <th>By</th>
              <th>When</th>
            </tr>
          </thead>
          <tbody>
            {d.versions.map((v) => (
              <tr key={v.id} className="border-b border-slate-200 dark:border-slate-800">
                <td className="py-2">
                  <Link className="font-bold text-lariat-800 underline dark:text-lariat-200" to={paths.workspace.datasetVersion.getHref(workspaceId, d.id, v.number)}>
                    Version {v.number}
                  </Link>
                </td>
                <td>{ORIGIN[v.origin]}{v.basedOn ? ` (from version ${v.basedOn})` : ''}</td>
                <td>
                  {v.fileName} ({formatBytes(v.sizeBytes)})
                </td>
                <td>
                  {countFormat.format(v.rowCount)} × {v.columnCount}
                </td>
                <td className="font-mono text-xs" title={v.sha256}>
                  {v.sha256.slice(0, 12)}…
                </td>
                <td>{v.createdBy.name}</td>
                <td>{formatWhen(v.createdAt)}</td>
              </tr>
            ))}
          </tbody>
        </table>
        {canEdit && limits.data && <UploadPanel workspaceId={workspaceId} uploadLimitBytes={limits.data.uploadLimitBytes} datasetId={d.id} />}
        {canEdit && (
          <section className="space-y-2">
            {!confirming ? (
              <Button variant="danger" onClick={() => setConfirming(true)}>
                Delete this dataset
              </Button>
            ) : (
              <div className="flex flex-wrap items-center gap-3">
                <span className="text-sm">Delete “{d.name}” and all {d.versions.length} of its versions? This cannot be undone.</span>
                <Button variant="danger" busy={remove.isPending} onClick={() => remove.mutate(d.id, { onSuccess: () => navigate(paths.workspace.datasets.getHref(workspaceId)) })}>
                  Yes, delete
                </Button>
                <Button variant="secondary" onClick={() => setConfirming(false)}>
                  Keep it
                </Button>
              </div>
            )}
            {remove.error && <Notice tone="error">{remove.error.message}</Notice>}
          </section>
        )}
      </div>
    </>
  );
}
