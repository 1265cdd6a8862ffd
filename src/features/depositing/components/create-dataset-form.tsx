import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { createDatasetInput, type CreateDatasetInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextArea, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useCreateDataset, type CreatedDataset } from '../api/create-dataset';

export function CreateDatasetForm({ slug, onCreated }: { slug: string; onCreated: (d: CreatedDataset) => void }) {
  const form = useForm<CreateDatasetInput>({ resolver: zodResolver(createDatasetInput) as never, defaultValues: { title: '', summary: '' } });
  const create = useCreateDataset(slug);
  const [message, setMessage] = useState<string | null>(null);
  const submit = form.handleSubmit(async (values) => {
    try {
      onCreated(await create.mutateAsync(values));
    } catch (e) {
      setMessage(applyServerErrors(e, form.setError));
    }
  });
  return (
    <form onSubmit={submit} noValidate className="flex max-w-xl flex-col gap-4">
      {message ? <FormAlert>{message}</FormAlert> : null}
      <TextField label="Title" hint="You can change it until the first release." error={form.formState.errors.title?.message} {...form.register('title')} />
      <TextArea label="Short description" error={form.formState.errors.summary?.message} {...form.register('summary')} />
      <p className="text-sm text-ink/75">
        The dataset gets its all-versions identifier now; it is registered when the first version is published.
      </p>
      <div>
        <Button type="submit" busy={create.isPending}>Create dataset and open its draft</Button>
      </div>
    </form>
  );
}
