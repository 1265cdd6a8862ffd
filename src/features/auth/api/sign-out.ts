import { useMutation, useQueryClient } from '@tanstack/react-query';
import { authCall, authClient } from '../../../lib/auth-client';

export const signOut = () => authCall(authClient.signOut());

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: signOut, onSuccess: () => qc.resetQueries() });
}
