import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { forgotPasswordInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useRequestPasswordReset } from '../api/reset-password';

export function ForgotPasswordForm() {
  const form = useForm<{ email: string }>({ resolver: zodResolver(forgotPasswordInput) });
  const request = useRequestPasswordReset();
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);

  const submit = form.handleSubmit(async ({ email }) => {
    try {
      await request.mutateAsync(email);
      // The same answer whether or not the address has an account.
      setMessage({ tone: 'success', text: 'If an account uses this address, a link to choose a new password is on its way.' });
    } catch (e) {
      setMessage({ tone: 'error', text: applyServerErrors(e, form.setError) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      {message ? <FormAlert tone={message.tone}>{message.text}</FormAlert> : null}
      <TextField label="E-mail address" type="email" autoComplete="email" error={form.formState.errors.email?.message} {...form.register('email')} />
      <div>
        <Button type="submit" busy={request.isPending}>Send the link</Button>
      </div>
    </form>
  );
}
