import { useMutation, useQueryClient } from '@tanstack/react-query';
import { authCall, authClient } from '../../../lib/auth-client';
import type { SignInInput } from '../../../../shared/contracts';

export const signIn = (input: SignInInput) => authCall(authClient.signIn.email({ email: input.email, password: input.password }));

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: signIn, onSuccess: () => qc.invalidateQueries() });
}
