import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../support/test-app';
import { httpClient } from '../support/http-client';
import { signInDemo } from '../support/accounts';
import { activePlans, CARDS, checkoutWith, eventually, payOnHostedCheckout } from '../support/billing';
import { createPaymentsClient } from '../../server/payments/stripe-client';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app?.close();
});

const ADMIN = 'nell.ashby@harrowgate-rds.example';
const FENMOOR_LEAD = 'ilse.marten@fenmoor.example';
const FENMOOR_CURATOR = 'rafael.quist@fenmoor.example';
const slug = 'fenmoor-swarm-ecology';

describe('plan catalogue', () => {
  it('lets the platform admin add a plan, mirrored as a product and monthly price at the provider', async () => {
    const admin = await signInDemo(app, ADMIN);
    const created = await admin.post('/api/admin/plans', { name: 'Mayfly 25 GB', description: 'Test plan', quotaBytes: 25e9, monthlyPriceMinor: 1250, currency: 'EUR' });
    expect(created.status).toBe(201);
    expect(created.json).toMatchObject({ name: 'Mayfly 25 GB', quotaBytes: 25e9, monthlyPriceMinor: 1250, currency: 'EUR', status: 'active', mirrored: true });

    // The mirror exists at the provider (this app's account), read back through the SDK.
    const stripe = createPaymentsClient({ secretKey: app.payments.secretKey, apiUrl: app.payments.url });
    const products = await stripe.products.list({ limit: 100 });
    const product = products.data.find((p) => p.metadata.cohesia_plan_id === created.json.id)!;
    expect(product.name).toBe('Mayfly 25 GB');
    const prices = await stripe.prices.list({ product: product.id });
    expect(prices.data[0]).toMatchObject({ unit_amount: 1250, currency: 'eur', recurring: { interval: 'month' } });

    expect((await admin.post('/api/admin/plans', { name: 'Mayfly 25 GB', quotaBytes: 1, monthlyPriceMinor: 1, currency: 'EUR' })).status).toBe(409);
    const bad = await admin.post('/api/admin/plans', { name: 'X', quotaBytes: -5, monthlyPriceMinor: 1.5, currency: 'XYZ' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.json.fields).sort()).toEqual(['currency', 'monthlyPriceMinor', 'name', 'quotaBytes']);

    // Re-pricing makes a new price and archives the old one; archiving hides the plan from the offer.
    const repriced = await admin.patch(`/api/admin/plans/${created.json.id}`, { monthlyPriceMinor: 1500 });
    expect(repriced.json.monthlyPriceMinor).toBe(1500);
    const pricesAfter = await stripe.prices.list({ product: product.id, limit: 10 });
    expect(pricesAfter.data.map((p) => [p.unit_amount, p.active]).sort()).toEqual([[1250, false], [1500, true]]);
    const archived = await admin.patch(`/api/admin/plans/${created.json.id}`, { status: 'archived' });
    expect(archived.json.status).toBe('archived');
    expect((await stripe.products.retrieve(product.id)).active).toBe(false);
    const offered = await activePlans(httpClient(app.url));
    expect(offered.map((p) => p.name)).not.toContain('Mayfly 25 GB');
    expect(offered.map((p) => p.name)).toEqual(['Swarmlet 10 GB', 'Field season 100 GB', 'Colony archive 1 TB']);
    expect((await admin.get('/api/admin/plans')).json.map((p: { name: string }) => p.name)).toContain('Mayfly 25 GB');
  });

  it('keeps the catalogue to platform admins', async () => {
    const lead = await signInDemo(app, FENMOOR_LEAD);
    expect((await lead.post('/api/admin/plans', { name: 'Sneaky plan', quotaBytes: 1e12, monthlyPriceMinor: 0, currency: 'EUR' })).status).toBe(403);
    expect((await lead.get('/api/admin/plans')).status).toBe(403);
    expect((await httpClient(app.url).post('/api/admin/plans', {})).status).toBe(401);
  });
});

describe('a lab lead picks a plan and pays through hosted checkout', () => {
  it('starts on the free tier; a declined card changes nothing; the success card upgrades after the webhook', async () => {
    const lead = await signInDemo(app, FENMOOR_LEAD);
    const before = await lead.get(`/api/labs/${slug}/billing`);
    expect(before.status).toBe(200);
    expect(before.json).toMatchObject({ currentPlan: null, subscription: null, hasBillingAccount: false, testMode: true });
    expect(before.json.usage).toMatchObject({ planName: 'Free tier', onFreeTier: true, quotaBytes: 1e9, usedBytes: 0 });

    // Curators and depositors do not manage billing.
    const curator = await signInDemo(app, FENMOOR_CURATOR);
    expect((await curator.get(`/api/labs/${slug}/billing`)).status).toBe(403);
    expect((await curator.post(`/api/labs/${slug}/billing/checkout`, { planId: before.json.usage.planName })).status).toBe(403);

    const plans = await activePlans(lead);
    const fieldSeason = plans.find((p) => p.name === 'Field season 100 GB')!;
    const colony = plans.find((p) => p.name === 'Colony archive 1 TB')!;

    for (const card of [CARDS.declined, CARDS.insufficientFunds]) {
      const declined = await checkoutWith(lead, slug, fieldSeason.id, card);
      expect(declined.status).toBe(402);
      expect(await declined.text()).toMatch(/declined|insufficient funds/);
    }
    const unchanged = await lead.get(`/api/labs/${slug}/billing`);
    expect(unchanged.json).toMatchObject({ currentPlan: null, subscription: null });
    expect(unchanged.json.usage.quotaBytes).toBe(1e9);

    const paid = await checkoutWith(lead, slug, fieldSeason.id, CARDS.success);
    expect(paid.status).toBe(303);
    const back = new URL(paid.headers.get('location')!);
    expect(back.origin + back.pathname).toBe(`${app.url}/labs/${slug}/storage`);
    expect(back.searchParams.get('checkout')).toBe('success');

    const after = await eventually(() => lead.get(`/api/labs/${slug}/billing`), (r) => r.json.currentPlan?.id === fieldSeason.id);
    expect(after.json.subscription).toMatchObject({ status: 'active', cancelAtPeriodEnd: false });
    expect(after.json.usage).toMatchObject({ planName: 'Field season 100 GB', quotaBytes: 100e9, onFreeTier: false });
    expect((await lead.get(`/api/labs/${slug}/storage`)).json.quotaBytes).toBe(100e9);

    const invoices = await lead.get(`/api/labs/${slug}/billing/invoices`);
    expect(invoices.status).toBe(200);
    expect(invoices.json).toHaveLength(1);
    expect(invoices.json[0]).toMatchObject({ status: 'paid', total: 1900, currency: 'eur', amountPaid: 1900 });
    expect(invoices.json[0].hostedUrl).toContain('/invoices/');

    const portal = await lead.post(`/api/labs/${slug}/billing/portal`);
    expect(portal.status).toBe(200);
    expect(await (await fetch(portal.json.url)).text()).toContain('Billing portal stand-in');

    // Choosing the same plan again is refused; a larger plan changes in place, confirmed by webhook.
    expect((await lead.post(`/api/labs/${slug}/billing/checkout`, { planId: fieldSeason.id })).json.code).toBe('already_on_plan');
    const change = await lead.post(`/api/labs/${slug}/billing/checkout`, { planId: colony.id });
    expect(change.json).toEqual({ kind: 'changed', url: null });
    await eventually(() => lead.get(`/api/labs/${slug}/billing`), (r) => r.json.currentPlan?.id === colony.id);

    // Cancelling in the provider's portal returns the lab to the free tier.
    const portalPage = await lead.post(`/api/labs/${slug}/billing/portal`);
    const html = await (await fetch(portalPage.json.url)).text();
    const cancelAction = /action="([^"]+\/cancel)"/.exec(html)![1];
    expect((await fetch(new URL(cancelAction, app.payments.url), { method: 'POST', redirect: 'manual' })).status).toBe(303);
    const freeAgain = await eventually(() => lead.get(`/api/labs/${slug}/billing`), (r) => r.json.currentPlan === null);
    expect(freeAgain.json.subscription.status).toBe('canceled');
    expect(freeAgain.json.usage).toMatchObject({ planName: 'Free tier', quotaBytes: 1e9 });
  });

  it('refuses an archived or unknown plan and a portal without a billing account', async () => {
    const lead = await signInDemo(app, 'tomas.okafor-lind@tidewater.example');
    const admin = await signInDemo(app, ADMIN);
    const retired = (await admin.get('/api/admin/plans')).json.find((p: { name: string }) => p.name === 'Pilot 2 GB (retired)');
    const res = await lead.post('/api/labs/tidewater-schooling/billing/checkout', { planId: retired.id });
    expect(res.status).toBe(409);
    expect(res.json.code).toBe('plan_unavailable');
    expect((await lead.post('/api/labs/tidewater-schooling/billing/checkout', { planId: 'not-a-uuid' })).status).toBe(400);
    const portal = await lead.post('/api/labs/tidewater-schooling/billing/portal');
    expect(portal.status).toBe(409);
    expect(portal.json.code).toBe('no_billing_account');
    expect((await lead.get('/api/labs/tidewater-schooling/billing/invoices')).json).toEqual([]);
  });

  it('a checkout page left open after cancelling elsewhere still cannot be paid twice', async () => {
    const lead = await signInDemo(app, 'priya.vell@northgate-poly.example');
    const plan = (await activePlans(lead))[0];
    const started = await lead.post('/api/labs/rookery-roof-array/billing/checkout', { planId: plan.id });
    expect((await payOnHostedCheckout(started.json.url, CARDS.success)).status).toBe(303);
    // Paying the completed session again only redirects back; no second subscription.
    expect((await payOnHostedCheckout(started.json.url, CARDS.success)).status).toBe(303);
    await eventually(() => lead.get('/api/labs/rookery-roof-array/billing'), (r) => r.json.currentPlan?.id === plan.id);
    const invoices = await lead.get('/api/labs/rookery-roof-array/billing/invoices');
    expect(invoices.json).toHaveLength(1);
  });
});
