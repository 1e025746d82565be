import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useDatasets } from '../api/datasets';
import { DatasetList } from './DatasetList';
import { OpenDatasets } from './OpenDatasets';
import { UploadPanel } from './UploadPanel';

/** Datasets of the workspace; analysts and admins upload and import (the server checks again). */
export function DatasetsPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const canEdit = role === 'admin' || role === 'analyst';
  const list = useDatasets(workspaceId);
  return (
    <>
      <PageHeader title="Datasets" description="The tables your models learn from. Every upload is kept as an immutable version with its checksum." />
      <div className="space-y-8">
        {list.isPending && <Loading label="Loading datasets…" />}
        {list.error && <Notice tone="error">{list.error.message}</Notice>}
        {list.data && <DatasetList workspaceId={workspaceId} datasets={list.data.datasets} />}
        {list.data && canEdit && <UploadPanel workspaceId={workspaceId} uploadLimitBytes={list.data.uploadLimitBytes} />}
        {!canEdit && <Notice>Analysts and admins upload and import datasets; you can read every dataset here.</Notice>}
        <OpenDatasets workspaceId={workspaceId} canImport={canEdit} />
      </div>
    </>
  );
}
