import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { PLAN_CURRENCIES, planFormInput, type PlanFormValues } from '../../../../shared/contracts';
import { formatMoney, toMinorUnits } from '../../../../shared/billing-format';
import { Button } from '../../../components/button';
import { FormAlert, SelectField, TextArea, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useCreatePlan } from '../api/create-plan';

type Output = ReturnType<typeof planFormInput.parse>;

/** The admin's form for a new plan: quota in GB and a monthly price, checked by the shared schema. */
export function PlanForm() {
  const form = useForm<PlanFormValues, unknown, Output>({
    resolver: zodResolver(planFormInput),
    defaultValues: { name: '', description: '', quotaGb: '', monthlyPrice: '', currency: 'EUR' },
  });
  const create = useCreatePlan();
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { errors } = form.formState;
  const price = form.watch('monthlyPrice');
  const currency = form.watch('currency');
  const minor = toMinorUnits(price ?? '', currency);

  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      const plan = await create.mutateAsync(values);
      setMessage({ tone: 'success', text: `Plan “${plan.name}” is on offer and mirrored at the payment provider.` });
      form.reset({ name: '', description: '', quotaGb: '', monthlyPrice: '', currency: values.currency });
    } catch (e) {
      setMessage({ tone: 'error', text: applyServerErrors(e, form.setError) });
    }
  });

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3 rounded-lg border border-mist bg-white p-4">
      {message ? <FormAlert tone={message.tone}>{message.text}</FormAlert> : null}
      <TextField label="Plan name" error={errors.name?.message} {...form.register('name')} />
      <TextArea label="Description" hint="Shown to lab leads beside the plan." error={errors.description?.message} {...form.register('description')} />
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField label="Storage quota (GB)" inputMode="decimal" hint="1 GB = 1 000 000 000 bytes" error={errors.quotaGb?.message} {...form.register('quotaGb')} />
        <TextField
          label="Monthly price"
          inputMode="decimal"
          hint={Number.isFinite(minor) && price ? `Shown as ${formatMoney(minor, currency)}` : 'e.g. 12.50'}
          error={errors.monthlyPrice?.message}
          {...form.register('monthlyPrice')}
        />
        <SelectField label="Currency" error={errors.currency?.message} {...form.register('currency')}>
          {PLAN_CURRENCIES.map((c) => (
            <option key={c} value={c}>{c}</option>
          ))}
        </SelectField>
      </div>
      <div>
        <Button type="submit" busy={create.isPending}>Add plan</Button>
      </div>
    </form>
  );
}
