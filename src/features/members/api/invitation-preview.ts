import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationPreviewDto } from '@shared/members';
import { api } from '@/lib/api';

/** GET /api/invitations/:token: which workspace and role the link offers, before accepting. */
export const getInvitationPreview = (token: string) => api.get<InvitationPreviewDto>(`/api/invitations/${encodeURIComponent(token)}`);

export const invitationPreviewQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['invitations', 'detail', token], queryFn: () => getInvitationPreview(token) });

export const useInvitationPreview = (token: string) => useQuery(invitationPreviewQueryOptions(token));
