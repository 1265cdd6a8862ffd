import { useMutation } from '@tanstack/react-query';
import { authCall, authClient } from '../../../lib/auth-client';
import { paths } from '../../../app/paths';

export const sendVerification = (email: string) =>
  authCall(authClient.sendVerificationEmail({ email, callbackURL: paths.account }));

export const useSendVerification = () => useMutation({ mutationFn: sendVerification });
