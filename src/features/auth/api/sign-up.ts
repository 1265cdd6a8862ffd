import { useMutation } from '@tanstack/react-query';
import { authCall, authClient } from '../../../lib/auth-client';
import type { SignUpInput } from '../../../../shared/contracts';
import { paths } from '../../../app/paths';

export const signUp = (input: SignUpInput) =>
  authCall(authClient.signUp.email({ name: input.name, email: input.email, password: input.password, callbackURL: paths.account }));

export const useSignUp = () => useMutation({ mutationFn: signUp });
