import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import Stripe from 'stripe';
import { createPaymentsClient } from '../../server/payments/stripe-client';

// Conformance of the payment stand-in: every call Cohesia makes, through the
// provider's real SDK, over HTTP, against the stand-in started for this run.
// Test cards: the provider's testing documentation ([memory]):
// 4242424242424242 succeeds, 4000000000000002 is declined, 4000000000009995 has insufficient funds.

const base = () => inject('paymentsUrl');
const secret = 'whsec_cohesia_local';
let stripe: Stripe;
let key: string;
let hook: http.Server;
let hookUrl: string;
const received: Array<{ event: Stripe.Event; verified: boolean }> = [];

beforeAll(async () => {
  key = `sk_test_conformance_${Date.now().toString(36)}`;
  stripe = createPaymentsClient({ secretKey: key, apiUrl: base() });
  hook = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const raw = Buffer.concat(chunks);
      try {
        received.push({ event: Stripe.webhooks.constructEvent(raw, String(req.headers['stripe-signature']), secret), verified: true });
        res.writeHead(200).end('{}');
      } catch {
        res.writeHead(400).end();
      }
    });
  });
  await new Promise<void>((r) => hook.listen(0, '127.0.0.1', () => r()));
  hookUrl = `http://127.0.0.1:${(hook.address() as AddressInfo).port}/hook`;
  await stripe.webhookEndpoints.create({ url: hookUrl, enabled_events: ['*'] });
});
afterAll(async () => {
  await new Promise<void>((r) => hook?.close(() => r()));
});

async function waitForEvent(type: string, match: (o: any) => boolean = () => true) {
  for (let i = 0; i < 100; i++) {
    const hit = received.find((r) => r.event.type === type && match(r.event.data.object));
    if (hit) return hit.event;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no ${type} event arrived`);
}

async function payOnHostedPage(url: string, card: string) {
  return fetch(url, { method: 'POST', body: new URLSearchParams({ card, expiry: '12 / 34', cvc: '123' }), redirect: 'manual' });
}

async function planWithPrice(amount = 1900) {
  const product = await stripe.products.create({ name: `Conformance plan ${amount}`, metadata: { cohesia_plan_id: 'p1' } });
  const price = await stripe.prices.create({ product: product.id, unit_amount: amount, currency: 'eur', recurring: { interval: 'month' } });
  return { product, price };
}

describe('payment stand-in through the provider SDK', () => {
  it('creates, reads, updates and lists products and prices in the SDK object shapes', async () => {
    const { product, price } = await planWithPrice();
    expect(product).toMatchObject({ object: 'product', active: true, name: 'Conformance plan 1900', metadata: { cohesia_plan_id: 'p1' } });
    expect(product.id).toMatch(/^prod_/);
    expect(price).toMatchObject({ object: 'price', product: product.id, unit_amount: 1900, currency: 'eur', type: 'recurring', recurring: { interval: 'month' } });
    expect((await stripe.products.retrieve(product.id)).name).toBe(product.name);
    expect((await stripe.products.update(product.id, { name: 'Renamed', active: false })).active).toBe(false);
    expect((await stripe.prices.update(price.id, { active: false })).active).toBe(false);
    const prices = await stripe.prices.list({ product: product.id });
    expect(prices.object).toBe('list');
    expect(prices.data.map((p) => p.id)).toEqual([price.id]);
  });

  it('answers errors in the SDK error shapes: missing object, missing parameter, missing key', async () => {
    const missing = await stripe.customers.retrieve('cus_nothere').catch((e) => e);
    expect(missing).toBeInstanceOf(Stripe.errors.StripeInvalidRequestError);
    expect(missing).toMatchObject({ statusCode: 404, code: 'resource_missing' });
    const noName = await stripe.products.create({} as Stripe.ProductCreateParams).catch((e) => e);
    expect(noName).toMatchObject({ statusCode: 400, code: 'parameter_missing', param: 'name' });
    const res = await fetch(`${base()}/v1/products`);
    expect(res.status).toBe(401);
    expect((await res.json()).error.type).toBe('invalid_request_error');
  });

  it('honours idempotency keys: a retry returns the first answer, other parameters are refused', async () => {
    const a = await stripe.customers.create({ email: 'lead@lab.example', name: 'Lab' }, { idempotencyKey: 'cust-once' });
    const b = await stripe.customers.create({ email: 'lead@lab.example', name: 'Lab' }, { idempotencyKey: 'cust-once' });
    expect(b.id).toBe(a.id);
    const c = await stripe.customers.create({ email: 'other@lab.example' }, { idempotencyKey: 'cust-once' }).catch((e) => e);
    expect(c).toBeInstanceOf(Stripe.errors.StripeIdempotencyError);
  });

  it('runs a subscription checkout on the hosted page: decline changes nothing, the success card subscribes', async () => {
    const { price } = await planWithPrice(400);
    const customer = await stripe.customers.create({ email: 'okafor@lab.example', metadata: { cohesia_lab_id: 'lab-1' } });
    const session = await stripe.checkout.sessions.create({
      mode: 'subscription',
      customer: customer.id,
      line_items: [{ price: price.id, quantity: 1 }],
      metadata: { cohesia_lab_id: 'lab-1' },
      subscription_data: { metadata: { cohesia_lab_id: 'lab-1' } },
      success_url: 'http://cohesia.test/back?checkout=success&session_id={CHECKOUT_SESSION_ID}',
      cancel_url: 'http://cohesia.test/back?checkout=cancelled',
    });
    expect(session).toMatchObject({ object: 'checkout.session', status: 'open', payment_status: 'unpaid', amount_total: 400, currency: 'eur' });
    expect(session.url).toBe(`${base()}/checkout/${session.id}`);

    const page = await (await fetch(session.url!)).text();
    expect(page).toContain('Payment stand-in — test mode');
    expect(page).toContain('No real payment happens');

    for (const [card, message] of [['4000000000000002', 'Your card was declined.'], ['4000 0000 0000 9995', 'Your card has insufficient funds.'], ['1234123412341234', 'test card numbers']]) {
      const declined = await payOnHostedPage(session.url!, card);
      expect(declined.status).toBe(402);
      expect(await declined.text()).toContain(message);
    }
    expect((await stripe.checkout.sessions.retrieve(session.id)).status).toBe('open');
    expect((await stripe.subscriptions.list({ customer: customer.id })).data).toHaveLength(0);

    const paid = await payOnHostedPage(session.url!, '4242 4242 4242 4242');
    expect(paid.status).toBe(303);
    expect(paid.headers.get('location')).toBe(`http://cohesia.test/back?checkout=success&session_id=${session.id}`);
    const done = await stripe.checkout.sessions.retrieve(session.id);
    expect(done).toMatchObject({ status: 'complete', payment_status: 'paid', customer: customer.id });

    const sub = await stripe.subscriptions.retrieve(done.subscription as string);
    expect(sub).toMatchObject({ object: 'subscription', status: 'active', customer: customer.id, metadata: { cohesia_lab_id: 'lab-1' } });
    expect(sub.items.data[0].price.id).toBe(price.id);
    expect(sub.items.data[0].current_period_end).toBeGreaterThan(sub.items.data[0].current_period_start);
    const invoices = await stripe.invoices.list({ customer: customer.id });
    expect(invoices.data).toHaveLength(1);
    expect(invoices.data[0]).toMatchObject({ object: 'invoice', status: 'paid', total: 400, amount_paid: 400, currency: 'eur' });
    expect((await stripe.invoices.retrieve(invoices.data[0].id)).number).toMatch(/^STANDIN-/);

    // Signed events reach the endpoint and verify with the SDK.
    const completed = await waitForEvent('checkout.session.completed', (o) => o.id === session.id);
    expect(completed.data.object).toMatchObject({ subscription: sub.id });
    await waitForEvent('customer.subscription.created', (o) => o.id === sub.id);
    await waitForEvent('invoice.paid', (o) => o.customer === customer.id);
    expect(received.every((r) => r.verified)).toBe(true);

    // Change plan, then cancel.
    const { price: bigger } = await planWithPrice(1900);
    const updated = await stripe.subscriptions.update(sub.id, { items: [{ id: sub.items.data[0].id, price: bigger.id }], proration_behavior: 'create_prorations' });
    expect(updated.items.data[0].price.id).toBe(bigger.id);
    const upd = await waitForEvent('customer.subscription.updated', (o) => o.id === sub.id);
    expect((upd.data as { previous_attributes?: unknown }).previous_attributes).toBeTruthy();

    const portal = await stripe.billingPortal.sessions.create({ customer: customer.id, return_url: 'http://cohesia.test/back' });
    expect(portal).toMatchObject({ object: 'billing_portal.session', customer: customer.id });
    expect(await (await fetch(portal.url)).text()).toContain('Billing portal stand-in — test mode');

    const canceled = await stripe.subscriptions.cancel(sub.id);
    expect(canceled.status).toBe('canceled');
    await waitForEvent('customer.subscription.deleted', (o) => o.id === sub.id);
    expect((await stripe.subscriptions.list({ customer: customer.id, status: 'all' })).data[0].status).toBe('canceled');
  });

  it('replays and reorders events on command, and simulates a failed renewal', async () => {
    const { price } = await planWithPrice(700);
    const customer = await stripe.customers.create({ email: 'vell@lab.example' });
    const session = await stripe.checkout.sessions.create({ mode: 'subscription', customer: customer.id, line_items: [{ price: price.id, quantity: 1 }], success_url: 'http://cohesia.test/ok' });
    await payOnHostedPage(session.url!, '4242424242424242');
    const subId = (await stripe.checkout.sessions.retrieve(session.id)).subscription as string;

    const control = (path: string, body: unknown = {}) =>
      fetch(`${base()}/_stand-in${path}`, { method: 'POST', headers: { authorization: `Bearer ${key}`, 'content-type': 'application/json' }, body: JSON.stringify(body) }).then((r) => r.json());
    const renewal = await control(`/subscriptions/${subId}/renew`, { outcome: 'failed' });
    expect(renewal.subscription.status).toBe('past_due');
    const failed = await waitForEvent('invoice.payment_failed', (o) => o.customer === customer.id);
    // The renewal emits several events; count from the moment the last of them has arrived.
    await expect.poll(async () => (await (await fetch(`${base()}/_stand-in/deliveries`, { headers: { authorization: `Bearer ${key}` } })).json()).inFlight, { timeout: 10_000 }).toBe(0);

    const before = received.length;
    const events = await stripe.events.list({ limit: 3 });
    const ids = events.data.map((e) => e.id); // newest first: delivered in reverse order of creation
    const out = await control('/events/deliver', { ids: [...ids, failed.id] });
    expect(out.delivered.map((d: { status: number }) => d.status)).toEqual([200, 200, 200, 200]);
    expect(received.slice(before).map((r) => r.event.id)).toEqual([...ids, failed.id]);
  });
});
