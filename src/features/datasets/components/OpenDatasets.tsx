/** The bundled open datasets, each importable in one click, with where it comes from. */
import { Link } from 'react-router';
import { paths } from '@/app/paths';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';
import { useImportOpenDataset, useOpenDatasets } from '../api/open-datasets';

export function OpenDatasets({ workspaceId, canImport }: { workspaceId: string; canImport: boolean }) {
  const open = useOpenDatasets(workspaceId);
  const importer = useImportOpenDataset(workspaceId);
  if (!open.data) return null;
  return (
    <section aria-labelledby="open-heading" className="space-y-3">
      <h2 id="open-heading" className="text-lg font-bold">
        Open datasets
      </h2>
      <p className="text-sm text-slate-700 dark:text-slate-300">Classic public tables that ship with Lariat, ready to try lasso paths and logistic models on.</p>
      <ul className="grid gap-4 md:grid-cols-2">
        {open.data.map((o) => (
          <li key={o.key} className="space-y-2 rounded-lg border border-slate-200 bg-white p-4 text-sm dark:border-slate-800 dark:bg-slate-900">
            <h3 className="font-bold">{o.title}</h3>
            <p>{o.description}</p>
            <p className="text-xs text-slate-600 dark:text-slate-400">
              <span className="font-bold">Source:</span> {o.citation} <span className="font-bold">Licence:</span> {o.licence}
            </p>
            {o.importedAs ? (
              <Link className="font-bold text-lariat-800 underline dark:text-lariat-200" to={paths.workspace.dataset.getHref(workspaceId, o.importedAs)}>
                Open the imported copy
              </Link>
            ) : (
              canImport && (
                <Button onClick={() => importer.mutate(o.key)} busy={importer.isPending && importer.variables === o.key} busyLabel="Importing…">
                  Import {o.fileName}
                </Button>
              )
            )}
          </li>
        ))}
      </ul>
      {importer.error && <Notice tone="error">{importer.error.message}</Notice>}
    </section>
  );
}
