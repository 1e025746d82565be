import { useQuery } from '@tanstack/react-query';
import type { ComparisonDto } from '@shared/compare';
import { api } from '@/lib/api';

/** GET .../comparisons?fits=a,b,... (the first fit is the baseline). */
export const useComparison = (workspaceId: string, fitIds: string[]) =>
  useQuery({
    queryKey: ['workspaces', workspaceId, 'comparisons', fitIds.join(',')],
    queryFn: () => api.get<ComparisonDto>(`/api/workspaces/${workspaceId}/comparisons?fits=${fitIds.map(encodeURIComponent).join(',')}`),
    enabled: fitIds.length >= 2,
  });
