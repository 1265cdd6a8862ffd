import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { updateProfileInput, type Profile, type UpdateProfileInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useUpdateProfile } from '../api/update-profile';
import { OrcidIdentifier } from '../../../components/identifier';

export function ProfileForm({ profile }: { profile: Profile }) {
  const form = useForm<UpdateProfileInput>({
    resolver: zodResolver(updateProfileInput) as never,
    defaultValues: { name: profile.name, orcid: profile.orcid ?? '' },
  });
  const update = useUpdateProfile();
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { errors } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      const saved = await update.mutateAsync(values);
      form.reset({ name: saved.name, orcid: saved.orcid ?? '' });
      setMessage({ tone: 'success', text: 'Your profile is saved.' });
    } catch (e) {
      setMessage({ tone: 'error', text: applyServerErrors(e, form.setError) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="flex max-w-xl flex-col gap-4">
      {message ? <FormAlert tone={message.tone}>{message.text}</FormAlert> : null}
      <TextField label="E-mail address" value={profile.email} readOnly disabled hint="Your sign-in address." />
      <TextField label="Full name" autoComplete="name" hint="As it should appear in citations of your data." error={errors.name?.message} {...form.register('name')} />
      <TextField
        label="ORCID iD"
        placeholder="0000-0002-1825-0097"
        hint="Optional. Your persistent researcher identifier; we check its last digit."
        error={errors.orcid?.message}
        {...form.register('orcid')}
      />
      {profile.orcid ? (
        <p className="-mt-2 text-sm">
          <OrcidIdentifier orcid={profile.orcid} label="Your public ORCID record:" />
        </p>
      ) : null}
      <div>
        <Button type="submit" busy={update.isPending}>Save profile</Button>
      </div>
    </form>
  );
}
