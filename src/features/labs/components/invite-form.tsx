import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { inviteMemberInput, type InviteMemberInput } from '../../../../shared/contracts';
import { LAB_ROLES, labRoleLabels } from '../../../../shared/lab-roles';
import { Button } from '../../../components/button';
import { FormAlert, SelectField, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useInviteMember } from '../api/invite-member';

const roleHelp = 'Depositors upload data and prepare drafts; curators also review and publish releases and decide access requests; leads also manage members and billing.';

export function InviteForm({ slug }: { slug: string }) {
  const form = useForm<InviteMemberInput>({ resolver: zodResolver(inviteMemberInput), defaultValues: { email: '', role: 'depositor' } });
  const invite = useInviteMember(slug);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { errors } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      await invite.mutateAsync(values);
      setMessage({ tone: 'success', text: `Invitation sent to ${values.email}.` });
      form.reset({ email: '', role: values.role });
    } catch (e) {
      setMessage({ tone: 'error', text: applyServerErrors(e, form.setError) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3 rounded-lg border border-mist bg-white p-4">
      {message ? <FormAlert tone={message.tone}>{message.text}</FormAlert> : null}
      <div className="grid gap-3 sm:grid-cols-[1fr_12rem]">
        <TextField label="E-mail address" type="email" error={errors.email?.message} {...form.register('email')} />
        <SelectField label="Role" error={errors.role?.message} {...form.register('role')}>
          {LAB_ROLES.map((r) => (
            <option key={r} value={r}>{labRoleLabels[r]}</option>
          ))}
        </SelectField>
      </div>
      <p className="text-xs text-ink/70">{roleHelp}</p>
      <div>
        <Button type="submit" busy={invite.isPending}>Send invitation</Button>
      </div>
    </form>
  );
}
