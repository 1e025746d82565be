/**
 * POST .../datasets/uploads?ingest=<id> with XMLHttpRequest (fetch has no upload progress), while
 * GET .../ingests/<id> is polled for the server's parsing and storing progress
 * (docs/decisions/0004-upload-progress.md). Polling starts once the file is sent: the server
 * registers the id as it starts reading the request, so an earlier poll could ask before it knows
 * the id (a 404); while sending, the browser's own transfer progress is what there is to show.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { IngestProgressDto, UploadResultDto } from '@shared/datasets';
import { api, ApiError, CSRF_HEADER, csrfToken } from '@/lib/api';

export interface UploadFields {
  name?: string;
  description?: string;
  datasetId?: string;
  missing?: string;
  /** "no": the first row is data (columns become column_1, ...). */
  headerRow?: 'yes' | 'no';
}

export interface UploadHandle {
  ingestId: string;
  result: Promise<UploadResultDto>;
  abort(): void;
}

export function uploadDataset(
  workspaceId: string,
  file: File,
  fields: UploadFields,
  onTransfer: (loaded: number, total: number) => void,
  onSent: () => void = () => undefined,
): UploadHandle {
  const ingestId = crypto.randomUUID();
  const xhr = new XMLHttpRequest();
  const form = new FormData();
  for (const [key, value] of Object.entries(fields)) if (value !== undefined && value !== '') form.append(key, value);
  form.append('file', file, file.name); // after the fields: the server reads them first
  const result = new Promise<UploadResultDto>((resolve, reject) => {
    xhr.upload.onprogress = (e) => onTransfer(e.loaded, e.lengthComputable ? e.total : file.size);
    xhr.upload.onload = () => onSent();
    xhr.onload = () => {
      const body = JSON.parse(xhr.responseText || '{}') as UploadResultDto & { error?: { message: string; field?: string } };
      if (xhr.status >= 200 && xhr.status < 300) resolve(body);
      else reject(new ApiError(xhr.status, body.error?.message ?? `The server answered ${xhr.status}.`, body.error?.field));
    };
    xhr.onerror = () => reject(new ApiError(0, `The upload of ${file.name} was interrupted. Check your connection and try again.`));
    xhr.onabort = () => reject(new ApiError(0, `The upload of ${file.name} was cancelled.`));
  });
  xhr.open('POST', `/api/workspaces/${workspaceId}/datasets/uploads?ingest=${ingestId}`);
  xhr.setRequestHeader(CSRF_HEADER, csrfToken() ?? '');
  xhr.send(form);
  return { ingestId, result, abort: () => xhr.abort() };
}

export const ingestQueryOptions = (workspaceId: string, ingestId: string) =>
  queryOptions({
    queryKey: ['workspaces', workspaceId, 'ingests', ingestId],
    queryFn: () => api.get<IngestProgressDto>(`/api/workspaces/${workspaceId}/ingests/${ingestId}`),
    retry: false,
  });

/** Polls twice a second while `active`. */
export function useIngestProgress(workspaceId: string, ingestId: string | null, active: boolean) {
  return useQuery({ ...ingestQueryOptions(workspaceId, ingestId ?? 'none'), enabled: ingestId !== null && active, refetchInterval: active ? 500 : false });
}
