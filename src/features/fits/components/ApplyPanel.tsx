/**
 * Apply the fit to a table: a dataset version of this workspace (a download link) or a CSV file
 * uploaded here (posted, then saved). Rows that cannot be scored carry their reason in the `error` column.
 */
import { useState } from 'react';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';
import { countFormat } from '@/lib/numbers';
import { predictionsUrl, usePredictFile } from '../api/predictions';
import { useVersionOptions } from '../api/dataset-versions';

function save(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = fileName;
  a.click();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export function ApplyPanel({ workspaceId, fitId, binomial }: { workspaceId: string; fitId: string; binomial: boolean }) {
  const versions = useVersionOptions(workspaceId);
  const [versionId, setVersionId] = useState('');
  const [file, setFile] = useState<File | null>(null);
  const predict = usePredictFile(workspaceId, fitId);
  const chosenVersion = versionId || versions.data?.[0]?.id || '';
  return (
    <section aria-labelledby="apply-heading" className="space-y-3 rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="apply-heading" className="text-lg font-bold">
        Apply to a table
      </h2>
      <p className="text-sm text-slate-700 dark:text-slate-300">
        Predictions at the chosen lambda as CSV: the linear predictor{binomial ? ' and the probability' : ''} per row, with a reason in the <code>error</code> column for a row that cannot be scored (a missing value, an unseen category, text where a number belongs).
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-bold">Dataset version</span>
          <select value={chosenVersion} onChange={(e) => setVersionId(e.target.value)} className="max-w-md rounded-md border border-slate-400 px-2 py-1.5 dark:border-slate-500 dark:bg-slate-900">
            {(versions.data ?? []).map((v) => (
              <option key={v.id} value={v.id}>
                {v.label}
              </option>
            ))}
          </select>
        </label>
        {chosenVersion && (
          <a href={predictionsUrl(workspaceId, fitId, chosenVersion)} download className="rounded-md bg-lariat-700 px-4 py-2 text-sm font-bold text-white hover:bg-lariat-800 dark:bg-lariat-300 dark:text-lariat-950">
            Download predictions
          </a>
        )}
      </div>
      {versions.error && <Notice tone="error">{versions.error.message}</Notice>}
      <form
        className="flex flex-wrap items-end gap-3 border-t border-slate-200 pt-3 dark:border-slate-800"
        onSubmit={(e) => {
          e.preventDefault();
          if (file) predict.mutate(file, { onSuccess: (r) => save(r.blob, r.fileName) });
        }}
      >
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-bold">Or a CSV file</span>
          <input type="file" accept=".csv,.tsv,text/csv" onChange={(e) => setFile(e.target.files?.[0] ?? null)} className="text-sm" />
        </label>
        <Button type="submit" variant="secondary" disabled={!file} busy={predict.isPending} busyLabel="Scoring…">
          Score the file
        </Button>
      </form>
      {predict.data && (
        <Notice tone={predict.data.rowErrors > 0 ? 'info' : 'success'}>
          Saved {predict.data.fileName}.{predict.data.rowErrors > 0 ? ` ${countFormat.format(predict.data.rowErrors)} rows could not be scored; see their error column.` : ' Every row was scored.'}
        </Notice>
      )}
      {predict.error && <Notice tone="error">{predict.error.message}</Notice>}
    </section>
  );
}
