import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ColumnSettingsInput, VersionSummaryDto } from '@shared/datasets';
import { api } from '@/lib/api';
import { datasetsQueryOptions } from './datasets';
import { versionUrl } from './version';

/** POST .../versions/:number/column-settings: makes the next version with these column types. */
export function useChangeColumnSettings(workspaceId: string, datasetId: string, number: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: ColumnSettingsInput) => api.post<VersionSummaryDto>(`${versionUrl(workspaceId, datasetId, number)}/column-settings`, input),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: datasetsQueryOptions(workspaceId).queryKey }),
  });
}
