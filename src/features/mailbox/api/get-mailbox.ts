import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type MailboxMessage = { id: string; receivedAt: string; from: string; to: string[]; subject: string; text: string; html: string | null };

export const getMailbox = () => api.get<MailboxMessage[]>('/api/dev/mailbox');
export const mailboxQueryOptions = () => queryOptions({ queryKey: ['mailbox'], queryFn: getMailbox, refetchInterval: 3000, staleTime: 0 });
export const useMailbox = () => useQuery(mailboxQueryOptions());
