import { useQuery } from '@tanstack/react-query';
import type { AuditEventDto } from '@shared/reviews';
import { api } from '@/lib/api';

/** The whole log as CSV (admins): a plain download link. */
export const auditCsvUrl = (workspaceId: string) => `/api/workspaces/${workspaceId}/audit.csv`;

/** GET .../audit (admins): the latest 200 changes of state. */
export const useAuditLog = (workspaceId: string, enabled: boolean) =>
  useQuery({ queryKey: ['workspaces', workspaceId, 'audit'], queryFn: () => api.get<AuditEventDto[]>(`/api/workspaces/${workspaceId}/audit`), enabled });
