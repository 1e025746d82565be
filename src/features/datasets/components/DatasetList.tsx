import { Link } from 'react-router';
import type { DatasetDto } from '@shared/datasets';
import { paths } from '@/app/paths';
import { EmptyState } from '@/components/EmptyState';
import { countFormat, formatBytes, formatWhen } from './format';

/** Every dataset in the workspace with its latest version's size and who uploaded it when. */
export function DatasetList({ workspaceId, datasets }: { workspaceId: string; datasets: DatasetDto[] }) {
  if (datasets.length === 0) {
    return (
      <EmptyState title="No datasets yet">
        <p>Upload a CSV file or import one of the open datasets below. Each upload is kept as an immutable version with its checksum.</p>
      </EmptyState>
    );
  }
  return (
    <table className="w-full text-left text-sm">
      <caption className="sr-only">Datasets</caption>
      <thead className="border-b border-slate-300 dark:border-slate-700">
        <tr>
          <th className="py-2">Name</th>
          <th>Versions</th>
          <th>Rows × columns</th>
          <th>File size</th>
          <th>Uploaded by</th>
          <th>When</th>
        </tr>
      </thead>
      <tbody>
        {datasets.map((d) => (
          <tr key={d.id} className="border-b border-slate-200 dark:border-slate-800">
            <td className="py-2">
              <Link className="font-bold text-lariat-800 underline dark:text-lariat-200" to={paths.workspace.dataset.getHref(workspaceId, d.id)}>
                {d.name}
              </Link>
            </td>
            <td>{d.versionCount}</td>
            <td>
              {countFormat.format(d.latest.rowCount)} × {d.latest.columnCount}
            </td>
            <td>{formatBytes(d.latest.sizeBytes)}</td>
            <td>{d.latest.createdBy.name}</td>
            <td>{formatWhen(d.latest.createdAt)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
