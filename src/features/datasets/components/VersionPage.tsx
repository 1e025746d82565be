import { Link, useParams } from 'react-router';
import { paths } from '@/app/paths';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { usePreview } from '../api/preview';
import { useVersion, versionUrl } from '../api/version';
import { ColumnsPanel } from './ColumnsPanel';
import { countFormat, formatBytes, formatWhen } from './format';
import { ParseReport } from './ParseReport';
import { PreviewTable } from './PreviewTable';

/** One immutable version: file facts, downloads, columns with types and summaries, report, preview. */
export function VersionPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const { datasetId = '', number: raw = '' } = useParams();
  const number = Number(raw);
  const version = useVersion(workspaceId, datasetId, number);
  const preview = usePreview(workspaceId, datasetId, number);
  if (version.isPending) return <Loading label="Loading the version…" />;
  if (version.error) return <Notice tone="error">{version.error.message}</Notice>;
  const v = version.data;
  const base = versionUrl(workspaceId, datasetId, number);
  return (
    <>
      <PageHeader
        title={`${v.datasetName}, version ${v.number}`}
        description={`${v.fileName} · ${formatBytes(v.sizeBytes)} · ${countFormat.format(v.rowCount)} rows × ${v.columnCount} columns · by ${v.createdBy.name}, ${formatWhen(v.createdAt)}`}
        actions={
          <div className="flex flex-wrap gap-3 text-sm">
            <Link className="font-bold text-lariat-800 underline dark:text-lariat-200" to={paths.workspace.dataset.getHref(workspaceId, datasetId)}>
              All versions
            </Link>
            <a className="font-bold text-lariat-800 underline dark:text-lariat-200" href={`${base}/original`} download>
              Download the original file
            </a>
            <a className="font-bold text-lariat-800 underline dark:text-lariat-200" href={`${base}/cleaned.csv`} download>
              Download the cleaned table (CSV)
            </a>
          </div>
        }
      />
      <div className="space-y-8">
        <p className="font-mono text-xs text-slate-600 dark:text-slate-400">SHA-256 {v.sha256}</p>
        {v.origin === 'column-settings' && <Notice>This version changes the column settings of version {v.basedOn}; it shares that version’s file.</Notice>}
        <ColumnsPanel workspaceId={workspaceId} datasetId={datasetId} number={number} columns={v.columns} canEdit={role === 'admin' || role === 'analyst'} />
        <ParseReport report={v.report} />
        {preview.data ? <PreviewTable preview={preview.data} /> : preview.error ? <Notice tone="error">{preview.error.message}</Notice> : <Loading label="Loading rows…" />}
      </div>
    </>
  );
}
