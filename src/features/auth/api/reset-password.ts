import { useMutation } from '@tanstack/react-query';
import { authCall, authClient } from '../../../lib/auth-client';
import { paths } from '../../../app/paths';

export const requestPasswordReset = (email: string) =>
  authCall(authClient.requestPasswordReset({ email, redirectTo: paths.resetPassword }));

export const resetPassword = ({ token, password }: { token: string; password: string }) =>
  authCall(authClient.resetPassword({ newPassword: password, token }));

export const useRequestPasswordReset = () => useMutation({ mutationFn: requestPasswordReset });
export const useResetPassword = () => useMutation({ mutationFn: resetPassword });
