import { useEffect, useState } from 'react';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { Page, Section } from '../../components/page';
import { QueryState } from '../../components/query-state';
import { FormAlert } from '../../components/form';
import { Badge } from '../../components/badge';
import { Button } from '../../components/button';
import { useLab } from '../../features/labs/api/get-lab';
import { useLabBilling } from '../../features/billing/api/get-lab-billing';
import { usePlans } from '../../features/billing/api/get-plans';
import { useLabInvoices } from '../../features/billing/api/get-lab-invoices';
import { useOpenBillingPortal } from '../../features/billing/api/open-billing-portal';
import { UsageMeter } from '../../features/billing/components/usage-meter';
import { PlanPicker } from '../../features/billing/components/plan-picker';
import { InvoiceList } from '../../features/billing/components/invoice-list';
import { labRoleCan } from '../../../shared/lab-roles';
import { formatBytes, formatMoney } from '../../../shared/billing-format';
import type { LabBillingView } from '../../../shared/contracts';
import { RequireSession } from '../require-session';
import { paths } from '../paths';

export function Component() {
  return <RequireSession>{() => <LabStorage />}</RequireSession>;
}

const WAIT_MS = 30_000;

function LabStorage() {
  const { slug = '' } = useParams();
  const lab = useLab(slug);
  return (
    <QueryState query={lab}>
      {(l) =>
        labRoleCan(l.myRole, { billing: ['manage'] }) ? (
          <StorageAndBilling slug={slug} labName={l.name} />
        ) : (
          <Page title="Storage and billing">
            <p>Only the lab lead of {l.name} manages its storage plan and billing.</p>
            <p className="mt-4"><Link to={paths.lab(slug)}>Back to {l.name}</Link></p>
          </Page>
        )
      }
    </QueryState>
  );
}

function StorageAndBilling({ slug, labName }: { slug: string; labName: string }) {
  const [search, setSearch] = useSearchParams();
  const returned = search.get('checkout');
  // After paying (or changing plan), wait for the provider's webhook to confirm the plan.
  const [awaiting, setAwaiting] = useState<{ planId: string; since: number } | null>(() =>
    returned === 'success' && search.get('plan') ? { planId: search.get('plan')!, since: Date.now() } : null,
  );
  const billing = useLabBilling(slug, awaiting ? 1000 : false);
  const plans = usePlans();
  const invoices = useLabInvoices(slug);
  const portal = useOpenBillingPortal(slug);
  const [notice, setNotice] = useState<{ tone: 'success' | 'info' | 'error'; text: string } | null>(() =>
    returned === 'cancelled' ? { tone: 'info', text: 'Checkout was cancelled. Nothing was charged and your plan is unchanged.' } : null,
  );

  const confirmedPlan = billing.data?.currentPlan?.id;
  useEffect(() => {
    if (!awaiting) return;
    if (confirmedPlan === awaiting.planId) {
      setNotice({ tone: 'success', text: `The payment provider confirmed it: ${labName} is now on ${billing.data!.currentPlan!.name}.` });
      setAwaiting(null);
      void invoices.refetch();
      if (search.has('checkout')) setSearch({}, { replace: true });
    } else if (Date.now() - awaiting.since > WAIT_MS) {
      setNotice({ tone: 'info', text: 'The payment provider has not confirmed the change yet. This page will show it once it does; reload in a minute.' });
      setAwaiting(null);
    }
  }, [awaiting, confirmedPlan, billing.dataUpdatedAt]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <Page
      wide
      title="Storage and billing"
      lead={
        <span>
          <Link to={paths.lab(slug)}>{labName}</Link>: space used, the storage plan, payments and invoices.
        </span>
      }
    >
      <QueryState query={billing}>
        {(b) => (
          <>
            {b.testMode ? (
              <div className="mb-4">
                <Badge tone="plum" icon="◇">Test mode</Badge>{' '}
                <span className="text-sm text-ink/80">Payments on this installation run in the provider’s test mode: no real money moves.</span>
              </div>
            ) : null}
            <div className="mb-6 flex flex-col gap-3" aria-live="polite">
              {awaiting ? <FormAlert tone="info">Payment accepted by the provider. Waiting for its confirmation to reach Cohesia…</FormAlert> : null}
              {notice ? <FormAlert tone={notice.tone}>{notice.text}</FormAlert> : null}
              <PaymentAlert billing={b} />
            </div>
            <Section title="Usage">
              <UsageMeter usage={b.usage} />
            </Section>
            <Section title="Current plan">
              <CurrentPlan billing={b} />
              {b.hasBillingAccount ? (
                <div className="mt-3 flex flex-wrap items-center gap-3">
                  <Button
                    variant="secondary"
                    busy={portal.isPending}
                    onClick={() => portal.mutate(undefined, { onSuccess: (r) => window.location.assign(r.url) })}
                  >
                    Open the billing portal
                  </Button>
                  <span className="text-xs text-ink/70">Update the payment method, cancel the plan or download invoices at the payment provider.</span>
                </div>
              ) : null}
              {portal.isError ? <div className="mt-2"><FormAlert>{portal.error.message}</FormAlert></div> : null}
            </Section>
            <Section title={b.currentPlan ? 'Change plan' : 'Choose a plan'}>
              <QueryState query={plans}>
                {(p) => (
                  <PlanPicker
                    slug={slug}
                    plans={p}
                    currentPlanId={b.currentPlan?.id ?? null}
                    freeTierBytes={b.freeTierBytes}
                    takenBytes={b.usage.usedBytes + b.usage.reservedBytes}
                    onChanged={(planId) => {
                      setNotice(null);
                      setAwaiting({ planId, since: Date.now() });
                    }}
                  />
                )}
              </QueryState>
            </Section>
            <Section title="Invoices">
              <QueryState query={invoices}>{(i) => <InvoiceList invoices={i} />}</QueryState>
            </Section>
          </>
        )}
      </QueryState>
    </Page>
  );
}

function CurrentPlan({ billing: b }: { billing: LabBillingView }) {
  if (!b.currentPlan) {
    return (
      <p className="rounded-lg border border-mist bg-white p-4">
        <span className="font-semibold">Free tier</span> — {formatBytes(b.freeTierBytes)} at no charge.
        {b.subscription?.status === 'canceled' ? <span className="ml-2"><Badge icon="▪">Plan cancelled</Badge></span> : null}
      </p>
    );
  }
  const s = b.subscription;
  return (
    <div className="rounded-lg border border-mist bg-white p-4">
      <p className="flex flex-wrap items-center gap-2">
        <span className="font-semibold">{b.currentPlan.name}</span>
        <span className="tabular-nums">{formatBytes(b.currentPlan.quotaBytes)}</span>
        <span className="tabular-nums text-ink/80">{formatMoney(b.currentPlan.monthlyPriceMinor, b.currentPlan.currency)} per month</span>
        {s?.status === 'past_due' ? <Badge tone="ember" icon="!">Payment due</Badge> : <Badge tone="reed" icon="✓">Active</Badge>}
      </p>
      {s?.currentPeriodEnd ? (
        <p className="mt-1 text-sm text-ink/75">
          {s.cancelAtPeriodEnd ? 'Ends' : 'Renews'} on {new Date(s.currentPeriodEnd).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric' })}.
        </p>
      ) : null}
    </div>
  );
}

function PaymentAlert({ billing: b }: { billing: LabBillingView }) {
  if (!b.payment.failedAt) return null;
  const graceEnds = b.payment.graceEndsAt ? new Date(b.payment.graceEndsAt).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric' }) : '';
  return (
    <FormAlert>
      {b.payment.uploadsBlocked
        ? 'A payment failed and the grace period has ended: new uploads are paused until a payment succeeds. '
        : `A payment failed. Please update the payment details in the billing portal by ${graceEnds}; after that new uploads are paused. `}
      Nothing already stored or published is removed or hidden, and published releases stay downloadable.
    </FormAlert>
  );
}
