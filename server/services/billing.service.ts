import type { Logger } from 'pino';
import type Stripe from 'stripe';
import { AppError, notFound } from '../errors';
import type { AuditRepository } from '../repositories/audit.repository';
import type { BillingRepository, LabBillingRow, PlanRow } from '../repositories/billing.repository';
import type { LabsRepository } from '../repositories/labs.repository';
import type { LabContext } from '../middleware/authorize';
import { FREE_TIER_NAME, type QuotaService } from './quota.service';
import type { Mailer } from '../mail/mailer';
import { verifyWebhook, type PaymentsClient } from '../payments/stripe-client';
import { billingMail } from '../mail/billing-templates';
import { paths } from '../../shared/paths';
import { subscriptionStatusWords } from '../../shared/billing-format';
import type { CheckoutResult, CreatePlanInput, InvoiceView, LabBillingView, StoragePlanView, UpdatePlanInput } from '../../shared/contracts';

type Deps = {
  billing: BillingRepository;
  labs: LabsRepository;
  quota: QuotaService;
  payments: PaymentsClient;
  webhookSecret: string;
  publicBaseUrl: string;
  graceDays: number;
  testMode: boolean;
  mailer?: Pick<Mailer, 'send'>;
  log: Logger;
  /** The lab's audit log: plan and subscription changes from the provider's events. */
  audit?: Pick<AuditRepository, 'record'>;
};

const LIVE = new Set(['active', 'trialing', 'past_due']);
const iso = (d: Date | null | undefined) => (d ? d.toISOString() : null);
const fromSeconds = (s: number | null | undefined) => (s ? new Date(s * 1000) : null);

export const planView = (p: PlanRow): StoragePlanView => ({
  id: p.id,
  name: p.name,
  description: p.description,
  quotaBytes: p.quotaBytes,
  monthlyPriceMinor: p.monthlyPriceMinor,
  currency: p.currency,
  status: p.status,
  mirrored: !!p.providerPriceId,
});

// The provider refuses unknown ids with a 404 "resource_missing"; anything else is ours to report.
const providerFailed = (e: unknown): never => {
  const err = e as { type?: string; message?: string };
  throw new AppError('payment_provider_error', `The payment provider refused the request: ${err.message ?? 'no reason given'}.`, 502);
};

/**
 * The plan catalogue (mirrored at the payment provider), each lab's plan and
 * subscription, hosted checkout and portal, invoices, and the provider's
 * webhooks (signature-checked, idempotent by event id, order-independent).
 */
export function createBillingService(d: Deps) {
  const { billing, payments } = d;
  const abs = (p: string) => `${d.publicBaseUrl}${p}`;

  async function mirror(plan: PlanRow): Promise<PlanRow> {
    if (plan.providerPriceId) return plan;
    // Idempotency keys make a retried mirror of the same plan version create nothing twice.
    const version = `${plan.id}-${plan.monthlyPriceMinor}-${plan.currency}`;
    const product = plan.providerProductId
      ? { id: plan.providerProductId }
      : await payments.products
          .create({ name: plan.name, description: plan.description || undefined, metadata: { cohesia_plan_id: plan.id } }, { idempotencyKey: `plan-product-${plan.id}` })
          .catch(providerFailed);
    const price = await payments.prices
      .create(
        { product: product.id, unit_amount: plan.monthlyPriceMinor, currency: plan.currency.toLowerCase(), recurring: { interval: 'month' }, metadata: { cohesia_plan_id: plan.id } },
        { idempotencyKey: `plan-price-${version}` },
      )
      .catch(providerFailed);
    return billing.updatePlan(plan.id, { providerProductId: product.id, providerPriceId: price.id });
  }

  async function subscriptionValues(sub: Stripe.Subscription) {
    const item = sub.items.data[0];
    const plan = (item && (await billing.findPlanByPrice(item.price.id))) ?? (sub.metadata?.cohesia_plan_id ? await billing.findPlan(sub.metadata.cohesia_plan_id) : undefined);
    return {
      planId: plan?.id ?? null,
      providerSubscriptionId: sub.id,
      subscriptionStatus: sub.status,
      currentPeriodEnd: fromSeconds(item?.current_period_end),
      cancelAtPeriodEnd: sub.cancel_at_period_end,
      providerCustomerId: typeof sub.customer === 'string' ? sub.customer : sub.customer.id,
    };
  }

  async function labOfSubscription(sub: Stripe.Subscription): Promise<LabBillingRow | undefined> {
    const customer = typeof sub.customer === 'string' ? sub.customer : sub.customer.id;
    const byCustomer = await billing.findByCustomer(customer);
    if (byCustomer) return byCustomer;
    const labId = sub.metadata?.cohesia_lab_id;
    return labId && (await d.labs.findById(labId)) ? billing.labBilling(labId) : undefined;
  }

  /** Applies the provider's current view of a subscription, if the event is not older than what we hold. */
  async function syncSubscription(subscriptionId: string, eventAt: number, eventId: string): Promise<{ labId: string | null; outcome: string }> {
    const sub = await payments.subscriptions.retrieve(subscriptionId);
    const row = await labOfSubscription(sub);
    if (!row) return { labId: null, outcome: 'unknown-lab' };
    // A late event of an older, ended subscription must not replace a newer live one.
    if (row.providerSubscriptionId && row.providerSubscriptionId !== sub.id && LIVE.has(row.subscriptionStatus) && !LIVE.has(sub.status)) {
      return { labId: row.labId, outcome: 'other-subscription' };
    }
    if (eventAt < row.providerEventAt) return { labId: row.labId, outcome: 'stale' };
    const values = await subscriptionValues(sub);
    const applied = await billing.applySubscriptionIfNewer(row.labId, eventAt, values);
    if (applied) await auditSubscription(row, values, eventId);
    return { labId: row.labId, outcome: applied ? 'applied' : 'stale' };
  }

  /**
   * A change of plan or of the subscription's status goes to the lab's audit log (no actor: the payment
   * provider's event; its id in the detail). Recorded after the change is applied, not in its
   * transaction: a crash in between leaves the change without its event, and a replay is not applied
   * again (idempotent by event id), so no event is recorded twice.
   */
  async function auditSubscription(before: LabBillingRow, after: { planId: string | null; subscriptionStatus: string }, eventId: string) {
    if (!d.audit) return;
    const planName = async (id: string | null) => (id ? ((await billing.findPlan(id))?.name ?? id) : FREE_TIER_NAME);
    const detail = { labId: before.labId, providerEvent: eventId, status: after.subscriptionStatus };
    if (before.planId !== after.planId) {
      await d.audit.record({ actorId: null, action: 'storage_plan.changed', subjectType: 'lab', subjectId: before.labId, fromState: await planName(before.planId), toState: await planName(after.planId), detail });
    } else if (before.subscriptionStatus !== after.subscriptionStatus) {
      await d.audit.record({ actorId: null, action: 'subscription.status_changed', subjectType: 'lab', subjectId: before.labId, fromState: subscriptionStatusWords(before.subscriptionStatus), toState: subscriptionStatusWords(after.subscriptionStatus), detail });
    }
  }

  async function leads(labId: string) {
    return (await d.labs.members(labId)).filter((m) => m.role === 'lead');
  }

  async function handleEvent(event: Stripe.Event): Promise<{ labId: string | null; outcome: string; after?: () => Promise<void> }> {
    switch (event.type) {
      case 'checkout.session.completed': {
        const s = event.data.object;
        const labId = s.metadata?.cohesia_lab_id ?? s.client_reference_id;
        if (!labId || !(await d.labs.findById(labId))) return { labId: null, outcome: 'unknown-lab' };
        await billing.labBilling(labId);
        const customer = typeof s.customer === 'string' ? s.customer : s.customer?.id;
        if (customer) await billing.claimCustomer(labId, customer);
        const subId = typeof s.subscription === 'string' ? s.subscription : s.subscription?.id;
        return subId ? syncSubscription(subId, event.created, event.id) : { labId, outcome: 'no-subscription' };
      }
      case 'customer.subscription.created':
      case 'customer.subscription.updated':
      case 'customer.subscription.deleted':
        return syncSubscription(event.data.object.id, event.created, event.id);
      case 'invoice.paid':
      case 'invoice.payment_failed': {
        const inv = event.data.object;
        const customer = typeof inv.customer === 'string' ? inv.customer : inv.customer?.id;
        const row = customer ? await billing.findByCustomer(customer) : undefined;
        if (!row) return { labId: null, outcome: 'unknown-lab' };
        const failed = event.type === 'invoice.payment_failed';
        const { applied } = await billing.applyPaymentIfNewer(row.labId, event.created, failed);
        if (!applied) return { labId: row.labId, outcome: 'stale' };
        if (!failed) return { labId: row.labId, outcome: 'applied' };
        return {
          labId: row.labId,
          outcome: 'applied',
          after: async () => {
            const lab = (await d.labs.findById(row.labId))!;
            const state = await billing.labBilling(row.labId);
            const graceEnds = new Date((state.paymentFailedAt ?? new Date()).getTime() + d.graceDays * 86_400_000);
            for (const lead of await leads(row.labId)) {
              await d.mailer?.send(billingMail.paymentFailed(lead.email, lead.name, lab.name, graceEnds, abs(paths.labStorage(lab.slug)), d.testMode));
            }
          },
        };
      }
      default:
        return { labId: null, outcome: 'ignored' };
    }
  }

  return {
    // ---- catalogue ---------------------------------------------------------
    async plans(opts: { activeOnly?: boolean } = {}): Promise<StoragePlanView[]> {
      return (await billing.listPlans(opts)).map(planView);
    },

    async createPlan(input: Required<CreatePlanInput>): Promise<StoragePlanView> {
      if (await billing.findPlanByName(input.name)) throw new AppError('plan_name_taken', 'Another plan already has this name.', 409, { name: 'Another plan already has this name' });
      const plan = await billing.insertPlan({ ...input, currency: input.currency.toUpperCase() });
      return planView(await mirror(plan));
    },

    async updatePlan(id: string, input: UpdatePlanInput): Promise<StoragePlanView> {
      const plan = await billing.findPlan(id);
      if (!plan) throw notFound('The plan');
      if (input.name && input.name !== plan.name && (await billing.findPlanByName(input.name))) {
        throw new AppError('plan_name_taken', 'Another plan already has this name.', 409, { name: 'Another plan already has this name' });
      }
      const priceChanged =
        (input.monthlyPriceMinor !== undefined && input.monthlyPriceMinor !== plan.monthlyPriceMinor) ||
        (input.currency !== undefined && input.currency.toUpperCase() !== plan.currency);
      let updated = await billing.updatePlan(id, { ...input, ...(input.currency ? { currency: input.currency.toUpperCase() } : {}) });
      if (plan.providerProductId && (input.name || input.description !== undefined || input.status)) {
        await payments.products
          .update(plan.providerProductId, { name: updated.name, description: updated.description || '', active: updated.status === 'active' })
          .catch(providerFailed);
      }
      // Prices are immutable at the provider: a new price replaces the old one for new checkouts;
      // labs already subscribed keep the old price until they change plan.
      if (priceChanged && plan.providerPriceId) {
        await payments.prices.update(plan.providerPriceId, { active: false }).catch(providerFailed);
        updated = await mirror(await billing.updatePlan(id, { providerPriceId: null }));
      }
      return planView(updated);
    },

    // ---- a lab's billing ---------------------------------------------------
    async overview(lab: LabContext): Promise<LabBillingView> {
      const row = await billing.labBilling(lab.id);
      const usage = await d.quota.usage(lab.id);
      const plan = row.planId ? await billing.findPlan(row.planId) : undefined;
      const live = LIVE.has(row.subscriptionStatus);
      return {
        usage,
        currentPlan: plan && live ? planView(plan) : null,
        subscription: row.providerSubscriptionId
          ? { status: row.subscriptionStatus, currentPeriodEnd: iso(row.currentPeriodEnd), cancelAtPeriodEnd: row.cancelAtPeriodEnd }
          : null,
        payment: {
          failedAt: iso(row.paymentFailedAt),
          graceEndsAt: row.paymentFailedAt ? new Date(row.paymentFailedAt.getTime() + d.graceDays * 86_400_000).toISOString() : null,
          uploadsBlocked: usage.uploadsBlocked,
        },
        freeTierBytes: d.quota.freeTierBytes,
        hasBillingAccount: !!row.providerCustomerId,
        testMode: d.testMode,
      };
    },

    async checkout(lab: LabContext, caller: { email: string }, planId: string): Promise<CheckoutResult> {
      const found = await billing.findPlan(planId);
      if (!found || found.status !== 'active') throw new AppError('plan_unavailable', 'This plan is not offered any more; choose another.', 409, { planId: 'Choose a plan that is offered' });
      const plan = await mirror(found);
      const row = await billing.labBilling(lab.id);

      // A live subscription changes plan in place; the provider confirms it by webhook.
      if (row.providerSubscriptionId && LIVE.has(row.subscriptionStatus)) {
        if (row.planId === plan.id) throw new AppError('already_on_plan', `${lab.name} is already on ${plan.name}.`, 409);
        const sub = await payments.subscriptions.retrieve(row.providerSubscriptionId).catch(providerFailed);
        const target = plan.quotaBytes;
        const usage = await d.quota.usage(lab.id);
        if (usage.usedBytes + usage.reservedBytes > target) {
          throw new AppError('plan_too_small', `${plan.name} holds less than the lab already stores; free some space first or pick a larger plan.`, 409);
        }
        await payments.subscriptions
          .update(sub.id, { items: [{ id: sub.items.data[0].id, price: plan.providerPriceId! }], proration_behavior: 'create_prorations', metadata: { cohesia_plan_id: plan.id } })
          .catch(providerFailed);
        return { kind: 'changed', url: null };
      }

      const customer =
        row.providerCustomerId ??
        (await billing.claimCustomer(
          lab.id,
          (
            await payments.customers
              .create({ email: caller.email, name: lab.name, metadata: { cohesia_lab_id: lab.id } }, { idempotencyKey: `lab-customer-${lab.id}` })
              .catch(providerFailed)
          ).id,
        ));
      const back = abs(paths.labStorage(lab.slug));
      const session = await payments.checkout.sessions
        .create({
          mode: 'subscription',
          customer,
          line_items: [{ price: plan.providerPriceId!, quantity: 1 }],
          client_reference_id: lab.id,
          metadata: { cohesia_lab_id: lab.id, cohesia_plan_id: plan.id },
          subscription_data: { metadata: { cohesia_lab_id: lab.id, cohesia_plan_id: plan.id } },
          success_url: `${back}?checkout=success&plan=${plan.id}&session_id={CHECKOUT_SESSION_ID}`,
          cancel_url: `${back}?checkout=cancelled`,
        })
        .catch(providerFailed);
      return { kind: 'checkout', url: session.url };
    },

    async portal(lab: LabContext): Promise<{ url: string }> {
      const row = await billing.labBilling(lab.id);
      if (!row.providerCustomerId) throw new AppError('no_billing_account', 'This lab has no billing account yet: choose a plan first.', 409);
      const s = await payments.billingPortal.sessions.create({ customer: row.providerCustomerId, return_url: abs(paths.labStorage(lab.slug)) }).catch(providerFailed);
      return { url: s.url };
    },

    async invoices(lab: LabContext): Promise<InvoiceView[]> {
      const row = await billing.labBilling(lab.id);
      if (!row.providerCustomerId) return [];
      const list = await payments.invoices.list({ customer: row.providerCustomerId, limit: 24 }).catch(providerFailed);
      return list.data.map((i) => ({
        id: i.id,
        number: i.number ?? null,
        status: i.status ?? null,
        currency: i.currency,
        subtotal: i.subtotal,
        total: i.total,
        amountPaid: i.amount_paid,
        amountDue: i.amount_due,
        created: new Date(i.created * 1000).toISOString(),
        periodStart: iso(fromSeconds(i.period_start)),
        periodEnd: iso(fromSeconds(i.period_end)),
        hostedUrl: i.hosted_invoice_url ?? null,
        lines: i.lines.data.map((l) => ({ description: l.description ?? null, amount: l.amount })),
      }));
    },

    // ---- webhooks ------------------------------------------------------------
    /**
     * Verifies and applies one webhook delivery. Throws AppError 400 on a bad
     * signature; any other failure propagates (500), so the provider retries.
     */
    async receiveWebhook(rawBody: Buffer, signature: string | undefined): Promise<{ id: string; outcome: string }> {
      let event: Stripe.Event;
      try {
        event = verifyWebhook(rawBody, signature, d.webhookSecret);
      } catch (e) {
        throw new AppError('invalid_signature', `The webhook signature does not verify: ${(e as Error).message}`, 400);
      }
      const { alreadyProcessed } = await billing.claimEvent({ id: event.id, type: event.type, created: event.created });
      if (alreadyProcessed) return { id: event.id, outcome: 'duplicate' };
      const result = await handleEvent(event);
      const mine = await billing.finishEvent(event.id, result.outcome, result.labId);
      // Side effects (mail) only for the delivery that finished the event: a replay sends nothing.
      if (mine && result.after) await result.after().catch((e) => d.log.error({ err: e, event: event.id }, 'billing mail failed'));
      d.log.info({ event: event.id, type: event.type, outcome: result.outcome }, 'payment webhook');
      return { id: event.id, outcome: result.outcome };
    },
  };
}

export type BillingService = ReturnType<typeof createBillingService>;
