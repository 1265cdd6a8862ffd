import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { signUpInput, type SignUpInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useSignUp } from '../api/sign-up';

export function SignUpForm({ onSignedUp }: { onSignedUp: (email: string) => void }) {
  const form = useForm<SignUpInput>({ resolver: zodResolver(signUpInput) });
  const signUp = useSignUp();
  const [message, setMessage] = useState<string | null>(null);
  const { errors } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      await signUp.mutateAsync(values);
      onSignedUp(values.email);
    } catch (e) {
      setMessage(applyServerErrors(e, form.setError));
    }
  });

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      {message ? <FormAlert>{message}</FormAlert> : null}
      <TextField label="Full name" autoComplete="name" hint="As it should appear in citations of your data." error={errors.name?.message} {...form.register('name')} />
      <TextField label="E-mail address" type="email" autoComplete="email" hint="Use your institutional address if you have one." error={errors.email?.message} {...form.register('email')} />
      <TextField label="Password" type="password" autoComplete="new-password" hint="At least 10 characters." error={errors.password?.message} {...form.register('password')} />
      <p className="text-xs text-ink/70">
        We keep your name and address to run your account and to credit your data. Your lab and your institution may have their own rules on
        personal data; they apply too.
      </p>
      <div>
        <Button type="submit" busy={signUp.isPending}>Create account</Button>
      </div>
    </form>
  );
}
