import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { resetPasswordInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { paths } from '../../../app/paths';
import { useResetPassword } from '../api/reset-password';

export function ResetPasswordForm({ token }: { token: string }) {
  const form = useForm<{ password: string; confirm: string }>({ resolver: zodResolver(resetPasswordInput) });
  const reset = useResetPassword();
  const [done, setDone] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const { errors } = form.formState;

  const submit = form.handleSubmit(async ({ password }) => {
    setMessage(null);
    try {
      await reset.mutateAsync({ token, password });
      setDone(true);
    } catch (e) {
      const text = applyServerErrors(e, form.setError);
      setMessage(/token/i.test(text) ? 'This link has expired or was already used. Ask for a new one.' : text);
    }
  });

  if (done) {
    return (
      <FormAlert tone="success">
        Your password has been changed. <Link to={paths.signIn}>Sign in</Link> with the new one.
      </FormAlert>
    );
  }
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      {message ? (
        <FormAlert>
          {message} <Link to={paths.forgotPassword}>Ask for a new link</Link>
        </FormAlert>
      ) : null}
      <TextField label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." error={errors.password?.message} {...form.register('password')} />
      <TextField label="New password again" type="password" autoComplete="new-password" error={errors.confirm?.message} {...form.register('confirm')} />
      <div>
        <Button type="submit" busy={reset.isPending}>Save the new password</Button>
      </div>
    </form>
  );
}
