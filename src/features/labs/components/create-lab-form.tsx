import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createLabInput, type CreateLabInput, type LabSummary } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextArea, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useCreateLab } from '../api/create-lab';

const slugify = (s: string) => s.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 48);

export function CreateLabForm({ onCreated }: { onCreated: (lab: LabSummary) => void }) {
  const form = useForm<CreateLabInput>({ resolver: zodResolver(createLabInput) as never, defaultValues: { name: '', slug: '', institution: '', rorId: '', description: '' } });
  const create = useCreateLab();
  const [message, setMessage] = useState<string | null>(null);
  const { errors, dirtyFields } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      onCreated(await create.mutateAsync(values));
    } catch (e) {
      setMessage(applyServerErrors(e, form.setError));
    }
  });

  const name = form.register('name', {
    onChange: (e) => {
      if (!dirtyFields.slug) form.setValue('slug', slugify(e.target.value));
    },
  });

  return (
    <form onSubmit={submit} noValidate className="flex max-w-xl flex-col gap-4">
      {message ? <FormAlert>{message}</FormAlert> : null}
      <TextField label="Lab name" error={errors.name?.message} {...name} />
      <TextField label="Short name" hint="Used in the lab's web address: lower-case letters, digits and hyphens." error={errors.slug?.message} {...form.register('slug')} />
      <TextField label="Institution" error={errors.institution?.message} {...form.register('institution')} />
      <TextField label="ROR id of the institution" placeholder="https://ror.org/05dxps055" hint="Optional: the Research Organization Registry identifier." error={errors.rorId?.message} {...form.register('rorId')} />
      <TextArea label="What the lab studies" error={errors.description?.message} {...form.register('description')} />
      <p className="text-sm text-ink/75">You become the lab's lead: you can invite members and choose their roles.</p>
      <div>
        <Button type="submit" busy={create.isPending}>Create lab</Button>
      </div>
    </form>
  );
}
