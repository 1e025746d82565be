import { useMutation } from '@tanstack/react-query';
import { ApiError, CSRF_COOKIE, CSRF_HEADER } from '@/lib/api';
import { fitUrl } from './fit';

/** GET .../fits/:fitId/predictions?datasetVersionId=...: a CSV the browser downloads from a plain link. */
export const predictionsUrl = (workspaceId: string, fitId: string, datasetVersionId: string) =>
  `${fitUrl(workspaceId, fitId)}/predictions?datasetVersionId=${encodeURIComponent(datasetVersionId)}`;

export interface PredictionsFile {
  blob: Blob;
  fileName: string;
  rowErrors: number;
}

function csrfToken(): string | undefined {
  const part = document.cookie.split(';').find((p) => p.trim().startsWith(`${CSRF_COOKIE}=`));
  return part ? decodeURIComponent(part.trim().slice(CSRF_COOKIE.length + 1)) : undefined;
}

/** POST .../fits/:fitId/predictions with a CSV file (multipart field `file`): the predictions CSV back. */
export async function predictFile(workspaceId: string, fitId: string, file: File): Promise<PredictionsFile> {
  const body = new FormData();
  body.append('file', file);
  const token = csrfToken();
  let response: Response;
  try {
    response = await fetch(`${fitUrl(workspaceId, fitId)}/predictions`, { method: 'POST', body, credentials: 'same-origin', headers: token ? { [CSRF_HEADER]: token } : {} });
  } catch {
    throw new ApiError(0, 'Lariat could not reach the server. Check your connection and try again.');
  }
  if (!response.ok) {
    const error = (await response.json().catch(() => ({}))) as { error?: { message?: string; field?: string } };
    throw new ApiError(response.status, error.error?.message ?? `The server answered ${response.status}.`, error.error?.field);
  }
  const stem = file.name.replace(/\.[^.]+$/, '');
  return { blob: await response.blob(), fileName: `${stem}-predictions.csv`, rowErrors: Number(response.headers.get('X-Lariat-Row-Errors') ?? 0) };
}

export const usePredictFile = (workspaceId: string, fitId: string) => useMutation({ mutationFn: (file: File) => predictFile(workspaceId, fitId, file) });
