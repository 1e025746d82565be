import { Link } from 'react-router';
import { FAMILY_LABELS } from '@shared/models';
import { paths } from '@/app/paths';
import { Cautions } from '@/components/Cautions';
import { EmptyState } from '@/components/EmptyState';
import { Loading } from '@/components/Loading';
import { Notice } from '@/components/Notice';
import { PageHeader } from '@/components/PageHeader';
import { useCurrentWorkspace } from '@/lib/workspace-context';
import { useModels } from '../api/models';
import { FitStatusBadge } from './FitStatusBadge';
import { formatWhen } from './format';

const LINK = 'font-bold text-lariat-800 underline dark:text-lariat-200';

/** Every model in the workspace with its latest version and that version's status. */
export function ModelsPage() {
  const { workspaceId, role } = useCurrentWorkspace();
  const models = useModels(workspaceId);
  const canCreate = role === 'admin' || role === 'analyst';
  return (
    <>
      <PageHeader
        title="Models"
        description="A model is a named question: which predictors matter for an outcome in one dataset. Each run is kept as a version."
        actions={
          canCreate && (
            <Link to={paths.workspace.newModel.getHref(workspaceId)} className="rounded-md bg-lariat-700 px-4 py-2 text-sm font-bold text-white hover:bg-lariat-800 dark:bg-lariat-300 dark:text-lariat-950">
              New model
            </Link>
          )
        }
      />
      <div className="space-y-6">
        {models.isPending ? (
          <Loading label="Loading models…" />
        ) : models.error ? (
          <Notice tone="error">{models.error.message}</Notice>
        ) : models.data.length === 0 ? (
          <EmptyState title="No models yet">
            <p>A model names a dataset, the outcome and the family (a number or a yes/no). Each fit of it is kept as version 1, 2 and so on, with its full settings, the dataset version and the seed, so any fit can be repeated exactly.</p>
            <p>{canCreate ? 'Start with “New model”.' : 'Analysts and admins create models; you will see them here.'}</p>
          </EmptyState>
        ) : (
          <table className="w-full text-left text-sm">
            <caption className="sr-only">Models</caption>
            <thead className="border-b border-slate-300 dark:border-slate-700">
              <tr>
                <th className="py-2">Model</th>
                <th>Dataset</th>
                <th>Outcome</th>
                <th>Family</th>
                <th>Latest version</th>
                <th>Status</th>
                <th>Created</th>
              </tr>
            </thead>
            <tbody>
              {models.data.map((m) => (
                <tr key={m.id} className="border-b border-slate-200 dark:border-slate-800" data-model={m.name}>
                  <td className="py-2">
                    <Link className={LINK} to={paths.workspace.model.getHref(workspaceId, m.id)}>
                      {m.name}
                    </Link>
                  </td>
                  <td>{m.datasetName}</td>
                  <td className="font-mono text-xs">{m.outcome}</td>
                  <td>{FAMILY_LABELS[m.family]}</td>
                  <td>
                    {m.latest ? (
                      <Link className={LINK} to={paths.workspace.fit.getHref(workspaceId, m.latest.id)}>
                        Version {m.latest.version}
                      </Link>
                    ) : (
                      'None yet'
                    )}
                  </td>
                  <td>{m.latest ? <FitStatusBadge status={m.latest.status} unconverged={m.latest.unconverged} /> : '–'}</td>
                  <td>
                    {m.createdBy.name}, {formatWhen(m.createdAt)}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        <Cautions />
      </div>
    </>
  );
}
