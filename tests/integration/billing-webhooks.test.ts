import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { activePlans, CARDS, checkoutWith, eventually, standIn } from '../support/billing';
import { createPaymentsClient } from '../../server/payments/stripe-client';

let app: TestApp;
let stripe: Stripe;
beforeAll(async () => {
  app = await startTestApp();
  stripe = createPaymentsClient({ secretKey: app.payments.secretKey, apiUrl: app.payments.url });
});
afterAll(async () => {
  await app?.close();
});

const hookUrl = () => `${app.url}/api/billing/webhook`;

function signed(event: object, opts: { secret?: string; timestamp?: number } = {}) {
  const payload = JSON.stringify(event);
  const header = Stripe.webhooks.generateTestHeaderString({ payload, secret: opts.secret ?? app.payments.webhookSecret, timestamp: opts.timestamp });
  return { payload, header };
}

function post(payload: string, header?: string) {
  return fetch(hookUrl(), { method: 'POST', headers: { 'content-type': 'application/json', ...(header ? { 'stripe-signature': header } : {}) }, body: payload }).then(async (r) => ({
    status: r.status,
    json: await r.json(),
  }));
}

const event = (type: string, object: object, created = Math.floor(Date.now() / 1000)) => ({
  id: `evt_test_${Math.random().toString(36).slice(2)}`,
  object: 'event',
  api_version: '2026-10-28.endive',
  created,
  data: { object },
  livemode: false,
  pending_webhooks: 1,
  request: { id: null, idempotency_key: null },
  type,
});

describe('webhook signature', () => {
  it('accepts a valid signature and acknowledges an unknown event type without acting on it', async () => {
    const { payload, header } = signed(event('balance.available', { object: 'balance' }));
    const res = await post(payload, header);
    expect(res.status).toBe(200);
    expect(res.json).toMatchObject({ received: true, outcome: 'ignored' });
  });

  it('rejects a wrong secret, a stale timestamp, a tampered body and a missing header with 400', async () => {
    const e = event('customer.subscription.updated', { id: 'sub_x', object: 'subscription' });
    const wrong = signed(e, { secret: 'whsec_not_the_one' });
    expect((await post(wrong.payload, wrong.header)).status).toBe(400);

    const stale = signed(e, { timestamp: Math.floor(Date.now() / 1000) - 3600 });
    const staleRes = await post(stale.payload, stale.header);
    expect(staleRes.status).toBe(400);
    expect(staleRes.json.code).toBe('invalid_signature');

    const good = signed(e);
    const tampered = good.payload.replace('sub_x', 'sub_y');
    expect((await post(tampered, good.header)).status).toBe(400);
    expect((await post(good.payload)).status).toBe(400);
    // None of them was recorded: the genuine one is still new.
    expect((await post(good.payload, good.header)).json.outcome).not.toBe('duplicate');
  });
});

describe('webhook idempotency and order', () => {
  it('applies each event once: a replay changes nothing and sends no second e-mail', async () => {
    const lead = await signInDemo(app, 'tomas.okafor-lind@tidewater.example');
    const plan = (await activePlans(lead))[0];
    expect((await checkoutWith(lead, 'tidewater-schooling', plan.id, CARDS.success)).status).toBe(303);
    const billing = await eventually(() => lead.get('/api/labs/tidewater-schooling/billing'), (r) => r.json.subscription?.status === 'active');
    expect(billing.json.payment.failedAt).toBeNull();

    const subs = await stripe.subscriptions.list({ limit: 1 });
    const sub = subs.data[0];
    await standIn(app, 'POST', `/subscriptions/${sub.id}/renew`, { outcome: 'failed' });
    const failedState = await eventually(() => lead.get('/api/labs/tidewater-schooling/billing'), (r) => r.json.payment.failedAt !== null && r.json.subscription.status === 'past_due');
    expect(failedState.json.payment.graceEndsAt).toBeTruthy();
    expect(failedState.json.payment.uploadsBlocked).toBe(false); // 7-day grace by default
    const mail = await app.mail.waitFor('tomas.okafor-lind@tidewater.example', /Payment failed for Tidewater Schooling Lab/);
    expect(mail.text).toMatch(/Nothing already stored or published is removed/);
    expect(mail.text).toContain(`${app.url}/labs/tidewater-schooling/storage`);

    // Replay the failed-payment event (the stand-in re-sends the same event id).
    const failedEvent = (await stripe.events.list({ type: 'invoice.payment_failed', limit: 1 })).data[0];
    const replay = await standIn(app, 'POST', '/events/deliver', { ids: [failedEvent.id, failedEvent.id] });
    expect(replay.delivered.map((d: { status: number }) => d.status)).toEqual([200, 200]);
    await new Promise((r) => setTimeout(r, 300));
    const mails = (await app.mail.messagesTo('tomas.okafor-lind@tidewater.example')).filter((m) => /Payment failed/.test(m.subject));
    expect(mails).toHaveLength(1);
    const again = await lead.get('/api/labs/tidewater-schooling/billing');
    expect(again.json.payment.failedAt).toBe(failedState.json.payment.failedAt);

    // A paid renewal clears the failure.
    await standIn(app, 'POST', `/subscriptions/${sub.id}/renew`, { outcome: 'paid' });
    await eventually(() => lead.get('/api/labs/tidewater-schooling/billing'), (r) => r.json.payment.failedAt === null && r.json.subscription.status === 'active');

    // The lab's audit log shows the plan taken and the status changes, each once, with the provider's event.
    type Shown = { action: string; actor: unknown; fromState: string | null; toState: string | null; detail: { providerEvent?: string } };
    const audit: Shown[] = (await lead.get('/api/labs/tidewater-schooling/audit?limit=200')).json.events;
    const planChanges = audit.filter((e) => e.action === 'storage_plan.changed');
    expect(planChanges).toHaveLength(1);
    expect(planChanges[0]).toMatchObject({ actor: null, fromState: 'Free tier', toState: plan.name });
    expect(planChanges[0].detail.providerEvent).toMatch(/^evt_/);
    const statuses = audit.filter((e) => e.action === 'subscription.status_changed').map((e) => `${e.fromState}→${e.toState}`).reverse();
    expect(statuses).toEqual(['Active→Payment due', 'Payment due→Active']);
  });

  it('ends in the newest state when subscription.updated events arrive in reverse order', async () => {
    const lead = await signInDemo(app, 'ilse.marten@fenmoor.example');
    const [small, medium, large] = await activePlans(lead);
    expect((await checkoutWith(lead, 'fenmoor-swarm-ecology', small.id, CARDS.success)).status).toBe(303);
    await eventually(() => lead.get('/api/labs/fenmoor-swarm-ecology/billing'), (r) => r.json.currentPlan?.id === small.id);

    await standIn(app, 'POST', '/deliveries/pause');
    expect((await lead.post('/api/labs/fenmoor-swarm-ecology/billing/checkout', { planId: medium.id })).json.kind).toBe('changed');
    // The provider's event times are in whole seconds: make the second change visibly newer.
    await new Promise((r) => setTimeout(r, 1100));
    expect((await lead.post('/api/labs/fenmoor-swarm-ecology/billing/checkout', { planId: large.id })).json.kind).toBe('changed');
    const updates = (await stripe.events.list({ type: 'customer.subscription.updated', limit: 2 })).data; // newest first
    expect(updates).toHaveLength(2);
    expect(updates[0].created).toBeGreaterThan(updates[1].created);

    // Newest first, then the older one: the older one must not win.
    const out = await standIn(app, 'POST', '/events/deliver', { ids: [updates[0].id, updates[1].id] });
    expect(out.delivered.map((d: { status: number }) => d.status)).toEqual([200, 200]);
    const state = await lead.get('/api/labs/fenmoor-swarm-ecology/billing');
    expect(state.json.currentPlan.id).toBe(large.id);
    expect(state.json.usage.quotaBytes).toBe(large.quotaBytes);

    // A forged-looking but validly signed older event about the same subscription is acknowledged and ignored.
    const sub = updates[0].data.object as Stripe.Subscription;
    const old = signed(event('customer.subscription.updated', sub, updates[1].created - 60));
    expect((await post(old.payload, old.header)).json.outcome).toBe('stale');
    expect((await lead.get('/api/labs/fenmoor-swarm-ecology/billing')).json.currentPlan.id).toBe(large.id);

    // Releasing the queue delivers the paused events once more: nothing changes.
    await standIn(app, 'POST', '/deliveries/resume');
    await new Promise((r) => setTimeout(r, 300));
    expect((await lead.get('/api/labs/fenmoor-swarm-ecology/billing')).json.currentPlan.id).toBe(large.id);
  });

  it('answers 500 while it cannot apply an event, so the provider retries it later', async () => {
    // A subscription the provider does not know: retrieving it fails, so the event is not finished.
    const e = event('customer.subscription.updated', { id: 'sub_unknown_to_provider', object: 'subscription' });
    const { payload, header } = signed(e);
    const first = await post(payload, header);
    expect(first.status).toBe(500);
    expect((await post(payload, header)).status).toBe(500); // not marked processed: retried for real
  });
});
