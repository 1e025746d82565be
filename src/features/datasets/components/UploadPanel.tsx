/**
 * Drag a CSV/TSV file here or pick one; optional name and missing-value markers; then two progress
 * bars: the transfer (XHR upload progress) and the server's parsing and storing (polled).
 */
import { useQueryClient } from '@tanstack/react-query';
import { useRef, useState, type DragEvent } from 'react';
import { useNavigate } from 'react-router';
import { DEFAULT_MISSING_MARKERS, type UploadResultDto } from '@shared/datasets';
import { paths } from '@/app/paths';
import { Button } from '@/components/Button';
import { Notice } from '@/components/Notice';
import { datasetsQueryOptions } from '../api/datasets';
import { uploadDataset, useIngestProgress, type UploadHandle } from '../api/upload';
import { formatBytes } from './format';
import { ProgressBar } from './ProgressBar';

interface Props {
  workspaceId: string;
  uploadLimitBytes: number;
  /** Upload a new version of this dataset instead of a new dataset. */
  datasetId?: string;
}

export function UploadPanel({ workspaceId, uploadLimitBytes, datasetId }: Props) {
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [name, setName] = useState('');
  const [missing, setMissing] = useState(DEFAULT_MISSING_MARKERS.join(', '));
  const [firstRowIsData, setFirstRowIsData] = useState(false);
  const [dragging, setDragging] = useState(false);
  const [handle, setHandle] = useState<UploadHandle | null>(null);
  const [transfer, setTransfer] = useState(0);
  // The server's progress is asked for only once the file is sent (see uploadDataset).
  const [sent, setSent] = useState(false);
  const [outcome, setOutcome] = useState<{ error?: string; result?: UploadResultDto } | null>(null);
  const progress = useIngestProgress(workspaceId, handle?.ingestId ?? null, handle !== null && sent);

  const choose = (f: File | undefined) => {
    setOutcome(null);
    if (!f) return;
    if (f.size > uploadLimitBytes) {
      setOutcome({ error: `${f.name} is ${formatBytes(f.size)}; the upload limit is ${formatBytes(uploadLimitBytes)}.` });
      return;
    }
    setFile(f);
    if (!name && !datasetId) setName(f.name.replace(/\.(csv|tsv|txt)$/i, ''));
  };

  const start = async () => {
    if (!file) return;
    const markers = missing.split(',').map((m) => m.trim());
    const h = uploadDataset(workspaceId, file, { name: datasetId ? undefined : name, datasetId, missing: markers.join(','), headerRow: firstRowIsData ? 'no' : undefined }, (loaded, total) => setTransfer(loaded / Math.max(1, total)), () => setSent(true));
    setHandle(h);
    try {
      const result = await h.result;
      setOutcome({ result });
      await queryClient.invalidateQueries({ queryKey: datasetsQueryOptions(workspaceId).queryKey });
      if (!result.duplicate) navigate(paths.workspace.datasetVersion.getHref(workspaceId, result.datasetId, result.version.number));
    } catch (error) {
      setOutcome({ error: (error as Error).message });
    } finally {
      setHandle(null);
      setTransfer(0);
      setSent(false);
    }
  };

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    choose(e.dataTransfer.files[0]);
  };

  const server = progress.data;
  return (
    <section aria-labelledby="upload-heading" className="space-y-4 rounded-lg border border-slate-200 bg-white p-5 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="upload-heading" className="text-lg font-bold">
        {datasetId ? 'Upload a new version' : 'Upload a dataset'}
      </h2>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        data-testid="drop-zone"
        className={`rounded-md border-2 border-dashed p-6 text-center text-sm ${dragging ? 'border-lariat-600 bg-lariat-50 dark:bg-slate-800' : 'border-slate-300 dark:border-slate-700'}`}
      >
        <p>{file ? `${file.name} (${formatBytes(file.size)})` : 'Drop a CSV or TSV file here, or'}</p>
        <Button variant="secondary" className="mt-2" onClick={() => input.current?.click()}>
          {file ? 'Choose another file' : 'Choose a file'}
        </Button>
        <input ref={input} type="file" accept=".csv,.tsv,.txt,text/csv,text/tab-separated-values" aria-label="CSV or TSV file" className="sr-only" onChange={(e) => choose(e.target.files?.[0])} />
        <p className="mt-2 text-xs text-slate-600 dark:text-slate-400">UTF-8 text, usually with a header row; comma, tab, semicolon, | or runs of spaces between fields. Limit {formatBytes(uploadLimitBytes)}.</p>
      </div>
      <div className="grid gap-4 sm:grid-cols-2">
        {!datasetId && (
          <label className="text-sm">
            <span className="font-bold">Dataset name</span>
            <input value={name} onChange={(e) => setName(e.target.value)} className="mt-1 w-full rounded border border-slate-300 px-2 py-1 dark:border-slate-700 dark:bg-slate-950" />
          </label>
        )}
        <label className="text-sm">
          <span className="font-bold">Missing-value markers</span>
          <input value={missing} onChange={(e) => setMissing(e.target.value)} className="mt-1 w-full rounded border border-slate-300 px-2 py-1 dark:border-slate-700 dark:bg-slate-950" />
          <span className="text-xs text-slate-600 dark:text-slate-400">Comma-separated; an empty entry means blank cells. Case is ignored.</span>
        </label>
        <label className="flex items-start gap-2 text-sm sm:col-span-2">
          <input type="checkbox" checked={firstRowIsData} onChange={(e) => setFirstRowIsData(e.target.checked)} className="mt-1" />
          <span>
            <span className="font-bold">The first row is data, not column names</span>
            <span className="block text-xs text-slate-600 dark:text-slate-400">Columns are then named column_1, column_2, and so on.</span>
          </span>
        </label>
      </div>
      <div className="flex gap-3">
        <Button onClick={() => void start()} disabled={!file || handle !== null || (!datasetId && name.trim() === '')} busy={handle !== null} busyLabel="Uploading…">
          Upload
        </Button>
        {handle && (
          <Button variant="secondary" onClick={() => handle.abort()}>
            Cancel
          </Button>
        )}
      </div>
      {handle && (
        <div className="space-y-3" data-testid="upload-progress">
          <ProgressBar label="Transfer" value={transfer} />
          <ProgressBar
            label={server?.phase === 'storing' ? 'Storing' : server?.phase === 'queued' ? 'Waiting for the server to finish other uploads' : 'Reading and checking'}
            value={server?.phase === 'parsing' || server?.phase === 'storing' ? server.fraction : server?.phase === 'done' ? 1 : 0}
            detail={server && server.rowsParsed > 0 ? `${server.rowsParsed.toLocaleString()} rows` : undefined}
          />
        </div>
      )}
      {outcome?.error && <Notice tone="error">{outcome.error}</Notice>}
      {outcome?.result && <Notice tone={outcome.result.duplicate ? 'info' : 'success'}>{outcome.result.message}</Notice>}
    </section>
  );
}
