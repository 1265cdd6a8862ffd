import { useState } from 'react';
import type { StoragePlanView } from '../../../../shared/contracts';
import { formatBytes, formatMoney } from '../../../../shared/billing-format';
import { Button } from '../../../components/button';
import { FormAlert } from '../../../components/form';
import { Badge } from '../../../components/badge';
import { useStartCheckout } from '../api/start-checkout';

/** The plans on offer; choosing one opens the provider's hosted checkout, or changes the plan in place. */
export function PlanPicker({ slug, plans, currentPlanId, freeTierBytes, takenBytes, onChanged }: { slug: string; plans: StoragePlanView[]; currentPlanId: string | null; freeTierBytes: number; takenBytes: number; onChanged: (planId: string) => void }) {
  const checkout = useStartCheckout(slug);
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState<string | null>(null);

  async function choose(plan: StoragePlanView) {
    setError(null);
    setPending(plan.id);
    try {
      const r = await checkout.mutateAsync({ planId: plan.id });
      if (r.kind === 'checkout' && r.url) window.location.assign(r.url);
      else onChanged(plan.id);
    } catch (e) {
      setError(e instanceof Error ? e.message : 'The plan could not be changed.');
    } finally {
      setPending(null);
    }
  }

  return (
    <div className="flex flex-col gap-3">
      {error ? <FormAlert>{error}</FormAlert> : null}
      <ul className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <li className="flex flex-col rounded-lg border border-mist bg-white p-4">
          <p className="font-semibold">Free tier</p>
          <p className="text-2xl font-bold tabular-nums">{formatBytes(freeTierBytes)}</p>
          <p className="text-sm text-ink/75">No charge. Applies whenever no plan is paid.</p>
          <div className="mt-auto pt-3">{currentPlanId === null ? <Badge tone="reed" icon="✓">Current</Badge> : null}</div>
        </li>
        {plans.map((p) => (
          <li key={p.id} className={`flex flex-col rounded-lg border bg-white p-4 ${p.id === currentPlanId ? 'border-reed' : 'border-mist'}`}>
            <p className="font-semibold">{p.name}</p>
            <p className="text-2xl font-bold tabular-nums">{formatBytes(p.quotaBytes)}</p>
            <p className="text-sm tabular-nums">{formatMoney(p.monthlyPriceMinor, p.currency)} per month</p>
            {p.description ? <p className="mt-1 text-sm text-ink/75">{p.description}</p> : null}
            <div className="mt-auto pt-3">
              {p.id === currentPlanId ? (
                <Badge tone="reed" icon="✓">Current</Badge>
              ) : p.quotaBytes < takenBytes ? (
                <p className="text-xs text-ink/70">Smaller than what the lab already stores ({formatBytes(takenBytes)}).</p>
              ) : (
                <Button variant={currentPlanId ? 'secondary' : 'primary'} busy={pending === p.id} disabled={pending !== null} onClick={() => void choose(p)} aria-label={`Choose ${p.name}`}>
                  {currentPlanId ? 'Switch to this plan' : 'Choose and pay'}
                </Button>
              )}
            </div>
          </li>
        ))}
      </ul>
      <p className="text-xs text-ink/70">
        Prices are per month, before any taxes the payment provider adds; the invoice shows what is charged. Paying follows your lab’s and institution’s own finance rules and the law where you work.
      </p>
    </div>
  );
}
