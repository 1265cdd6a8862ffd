import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import type { InvitationView } from '../../../../shared/contracts';

export const getInvitation = (id: string) => api.get<InvitationView>(`/api/invitations/${encodeURIComponent(id)}`);
export const invitationQueryOptions = (id: string) => queryOptions({ queryKey: ['invitations', id], queryFn: () => getInvitation(id) });
export const useInvitation = (id: string, enabled: boolean) => useQuery({ ...invitationQueryOptions(id), enabled });
