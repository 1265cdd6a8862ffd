import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { PLAN_CURRENCIES, planFormInput, type PlanFormValues, type StoragePlanView } from '../../../../shared/contracts';
import { currencyDigits, formatMoney, toMinorUnits } from '../../../../shared/billing-format';
import { Button } from '../../../components/button';
import { FormAlert, SelectField, TextArea, TextField } from '../../../components/form';
import { applyServerErrors } from '../../../lib/form-errors';
import { useCreatePlan } from '../api/create-plan';
import { useUpdatePlan } from '../api/update-plan';

type Output = ReturnType<typeof planFormInput.parse>;

const toForm = (p: StoragePlanView): PlanFormValues => ({
  name: p.name,
  description: p.description ?? '',
  quotaGb: String(p.quotaBytes / 1e9),
  monthlyPrice: (p.monthlyPriceMinor / 10 ** currencyDigits(p.currency)).toFixed(currencyDigits(p.currency)),
  currency: p.currency as PlanFormValues['currency'],
});

/** The admin's form for a new plan, or for changing one: quota in GB and a monthly price, checked by the shared schema. */
export function PlanForm({ plan, onDone }: { plan?: StoragePlanView; onDone?: () => void } = {}) {
  const form = useForm<PlanFormValues, unknown, Output>({
    resolver: zodResolver(planFormInput),
    defaultValues: plan ? toForm(plan) : { name: '', description: '', quotaGb: '', monthlyPrice: '', currency: 'EUR' },
  });
  const create = useCreatePlan();
  const update = useUpdatePlan();
  const [message, setMessage] = useState<{ tone: 'error' | 'success'; text: string } | null>(null);
  const { errors } = form.formState;
  const price = form.watch('monthlyPrice');
  const currency = form.watch('currency');
  const minor = toMinorUnits(price ?? '', currency);

  const submit = form.handleSubmit(async (values) => {
    setMessage(null);
    try {
      if (plan) {
        await update.mutateAsync({ id: plan.id, input: values });
        onDone?.();
        return;
      }
      const created = await create.mutateAsync(values);
      setMessage({ tone: 'success', text: `Plan “${created.name}” is on offer and mirrored at the payment provider.` });
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
      {plan ? <p className="text-xs text-ink/70">A new price applies to new subscriptions; labs already on the plan keep theirs until they change plan.</p> : null}
      <div className="flex gap-2">
        <Button type="submit" busy={create.isPending || update.isPending}>{plan ? 'Save changes' : 'Add plan'}</Button>
        {plan ? <Button type="button" variant="secondary" onClick={onDone}>Cancel</Button> : null}
      </div>
    </form>
  );
}
