import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { labDescriptionInput, type LabDescriptionInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextArea } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useSetLabDescription } from '../api/set-lab-description';

/** The lab lead's description of the lab, shown on its public page. */
export function LabDescriptionForm({ slug, description }: { slug: string; description: string | null }) {
  const form = useForm<LabDescriptionInput>({ resolver: zodResolver(labDescriptionInput), defaultValues: { description: description ?? '' } });
  const save = useSetLabDescription(slug);
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      await save.mutateAsync(values.description);
      setMessage({ tone: 'success', text: 'Description saved; it shows on the lab’s public page.' });
    } catch (e) {
      setMessage({ tone: 'error', text: applyServerErrors(e, form.setError) });
    }
  });
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3 rounded-lg border border-mist bg-white p-4">
      {message ? <FormAlert tone={message.tone}>{message.text}</FormAlert> : null}
      <TextArea label="Description of the lab" hint="What the lab studies and how it records; up to 2,000 characters." error={form.formState.errors.description?.message} {...form.register('description')} />
      <div>
        <Button type="submit" busy={save.isPending}>Save description</Button>
      </div>
    </form>
  );
}
