import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { signInInput, type SignInInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextField } from '../../../components/form';
import { ApiRequestError } from '../../../lib/api-client';
import { applyServerErrors } from '../../../lib/form-errors';
import { paths } from '../../../app/paths';
import { useSignIn } from '../api/sign-in';
import { useSendVerification } from '../api/send-verification';

export function SignInForm({ onSignedIn }: { onSignedIn: () => void }) {
  const form = useForm<SignInInput>({ resolver: zodResolver(signInInput) });
  const signIn = useSignIn();
  const resend = useSendVerification();
  const [message, setMessage] = useState<string | null>(null);
  const [unverified, setUnverified] = useState(false);
  const { errors } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    setUnverified(false);
    try {
      await signIn.mutateAsync(values);
      onSignedIn();
    } catch (e) {
      if (e instanceof ApiRequestError && e.code === 'email_not_verified') {
        setUnverified(true);
        setMessage('Please confirm your e-mail address first: we have sent you a new link.');
      } else {
        setMessage(applyServerErrors(e, form.setError));
      }
    }
  });

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      {message ? <FormAlert tone={unverified ? 'info' : 'error'}>{message}</FormAlert> : null}
      <TextField label="E-mail address" type="email" autoComplete="email" error={errors.email?.message} {...form.register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register('password')} />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Button type="submit" busy={signIn.isPending}>Sign in</Button>
        <Link to={paths.forgotPassword} className="text-sm">Forgot your password?</Link>
      </div>
      {unverified ? (
        <Button type="button" variant="quiet" onClick={() => resend.mutate(form.getValues('email'))} busy={resend.isPending}>
          Send the confirmation link again
        </Button>
      ) : null}
    </form>
  );
}
