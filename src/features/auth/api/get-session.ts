import { queryOptions, useQuery } from '@tanstack/react-query';
import { authClient } from '../../../lib/auth-client';

export type SessionUser = { id: string; name: string; email: string; role?: string | null; emailVerified: boolean };

export async function getSession(): Promise<SessionUser | null> {
  const { data } = await authClient.getSession();
  return (data?.user as SessionUser | undefined) ?? null;
}

export const sessionQueryOptions = () => queryOptions({ queryKey: ['session'], queryFn: getSession, staleTime: 60_000 });

export const useSession = () => useQuery(sessionQueryOptions());
