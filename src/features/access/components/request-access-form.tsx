import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { requestAccessInput, type RequestAccessInput } from '../../../../shared/contracts';
import { Button } from '../../../components/button';
import { FormAlert, TextArea, TextField } from '../../../components/form';
import { Loading } from '../../../components/query-state';
import { applyServerErrors } from '../../../lib/form-errors';
import { useReleaseTerms } from '../api/get-release-terms';
import { useRequestAccess } from '../api/request-access';

/** Asking a lab for the files of a restricted release, with its data-use terms to accept. */
export function RequestAccessForm({ suffix }: { suffix: string }) {
  const terms = useReleaseTerms(suffix, true);
  const send = useRequestAccess(suffix);
  // The terms version is not typed by the user: it comes with the terms shown.
  const form = useForm<RequestAccessInput>({ resolver: zodResolver(requestAccessInput.omit({ termsVersion: true })) as never, defaultValues: { purpose: '', affiliation: '', scope: 'release' } });
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { errors } = form.formState;
  if (terms.isPending) return <Loading />;
  if (!terms.data) return null;

  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      await send.mutateAsync({ ...values, termsVersion: terms.data.version });
      setMessage({ tone: 'success', text: `Your request is with ${terms.data.labName}. You get an e-mail when they decide; your account page shows its state.` });
    } catch (e) {
      setMessage({ tone: 'error', text: applyServerErrors(e, form.setError) });
    }
  });

  if (message?.tone === 'success') return <FormAlert tone="success">{message.text}</FormAlert>;
  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4 rounded-lg border border-mist bg-white p-4" aria-label="Request access">
      <h3 className="font-serif text-lg font-bold">Request access to the files</h3>
      {message ? <FormAlert>{message.text}</FormAlert> : null}
      <TextArea label="What you will use the data for" error={errors.purpose?.message} {...form.register('purpose')} />
      <TextField label="Your affiliation" error={errors.affiliation?.message} {...form.register('affiliation')} />
      <fieldset className="flex flex-col gap-1 text-sm">
        <legend className="font-medium">What you ask for</legend>
        <label className="flex items-center gap-2"><input type="radio" value="release" {...form.register('scope')} /> This version</label>
        <label className="flex items-center gap-2"><input type="radio" value="dataset" {...form.register('scope')} /> All versions of this dataset</label>
      </fieldset>
      <div>
        <p className="text-sm font-medium">Data-use terms of {terms.data.labName} (version {terms.data.version})</p>
        <pre className="mt-1 max-h-48 overflow-auto whitespace-pre-wrap rounded border border-mist bg-paper p-2 font-sans text-sm" data-testid="terms">{terms.data.body}</pre>
      </div>
      <label className="flex items-start gap-2 text-sm">
        <input type="checkbox" className="mt-1" {...form.register('acceptTerms')} />
        <span>I accept these terms.</span>
      </label>
      {errors.acceptTerms ? <p role="alert" className="text-sm text-[#9a4a1c]">⚠ {errors.acceptTerms.message}</p> : null}
      <p className="text-xs text-ink/70">
        Your request, with your name, e-mail address, affiliation and stated purpose, is seen by the lab's curators and kept with the
        accepted terms. The lab's own policies and the data-protection law that applies to it govern how they handle it.
      </p>
      <div>
        <Button type="submit" busy={send.isPending}>Send the request</Button>
      </div>
    </form>
  );
}
