import fs from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { createHmac, randomBytes } from 'node:crypto';
import type { AddressInfo } from 'node:net';
import { parseForm, type FormValue } from './form';
import { checkoutPage, invoicePage, messagePage, money, portalPage } from './pages';

/**
 * Payment stand-in: a local HTTP server answering the subset of the payment
 * provider's REST API (`/v1/…`) that Cohesia calls through the official SDK,
 * with the SDK's object shapes and error bodies, form-encoded requests and
 * idempotency keys. It also serves a hosted checkout page, a billing portal
 * page and invoice pages, and sends signed webhook events.
 *
 * Accounts: every secret key is its own account (like a provider account),
 * so several apps (one per test file) can share one stand-in without seeing
 * each other's objects or events. An account's webhook endpoints are created
 * through the provider's own API (`POST /v1/webhook_endpoints`); events go
 * only to the endpoints of the account whose objects changed.
 *
 * Test controls (not part of the provider's API), authorised by the same key,
 * under `/_stand-in/`: pause/resume deliveries, deliver given events in a given
 * order (replay, reorder), simulate a renewal that is paid or fails, and list
 * delivery attempts with the number still on their way. State persists as JSON under `directory`.
 */

type Obj = Record<string, any>;
type Endpoint = { id: string; object: 'webhook_endpoint'; url: string; enabled_events: string[]; status: 'enabled'; secret: string; created: number; livemode: false; metadata: Obj };
type Delivery = { eventId: string; type: string; endpoint: string; attempt: number; status: number | 'network-error'; at: number };
type Account = {
  products: Record<string, Obj>;
  prices: Record<string, Obj>;
  customers: Record<string, Obj>;
  sessions: Record<string, Obj>;
  subscriptions: Record<string, Obj>;
  invoices: Record<string, Obj>;
  portalSessions: Record<string, Obj>;
  endpoints: Record<string, Endpoint>;
  events: Obj[];
  idempotency: Record<string, { fingerprint: string; status: number; body: unknown }>;
  deliveries: Delivery[];
  invoiceSeq: number;
  paused: boolean;
  queued: string[];
};
type State = { accounts: Record<string, Account> };

export type PaymentsStandIn = {
  url: string;
  port: number;
  /** Registers (or finds) a webhook endpoint of the account `secretKey` without going over HTTP. */
  registerEndpoint(secretKey: string, url: string): Endpoint;
  close(): Promise<void>;
};

export type StandInOptions = {
  port: number;
  directory: string;
  host?: string;
  /** Secret each webhook endpoint signs with (the app's STRIPE_WEBHOOK_SECRET). */
  webhookSecret?: string;
  /** Delays between delivery retries, in ms (the provider retries for days; locally seconds). */
  retryDelaysMs?: number[];
  log?: (line: string) => void;
};

const API_VERSION = '2026-10-28.endive';
const nowS = () => Math.floor(Date.now() / 1000);
const MONTH_S = 30 * 24 * 3600;

class ApiErr extends Error {
  constructor(readonly status: number, readonly type: string, message: string, readonly extra: Obj = {}) {
    super(message);
  }
}
const notFoundErr = (what: string, id: string, param = 'id') =>
  new ApiErr(404, 'invalid_request_error', `No such ${what}: '${id}'`, { code: 'resource_missing', param });
const missingParam = (param: string) => new ApiErr(400, 'invalid_request_error', `Missing required param: ${param}.`, { code: 'parameter_missing', param });

const str = (v: FormValue | undefined): string | undefined => (typeof v === 'string' ? v : undefined);
const bool = (v: FormValue | undefined): boolean | undefined => (v === 'true' ? true : v === 'false' ? false : undefined);
const record = (v: FormValue | undefined): Obj => (v && typeof v === 'object' && !Array.isArray(v) ? (v as Obj) : {});
const list = (v: FormValue | undefined): FormValue[] => (Array.isArray(v) ? v : v && typeof v === 'object' ? Object.values(v) : []);

function newAccount(): Account {
  return {
    products: {}, prices: {}, customers: {}, sessions: {}, subscriptions: {}, invoices: {}, portalSessions: {},
    endpoints: {}, events: [], idempotency: {}, deliveries: [], invoiceSeq: 0, paused: false, queued: [],
  };
}

/** The provider's signature header: `t=<seconds>,v1=HMAC-SHA256(secret, "<t>.<payload>")`. */
export function signPayload(payload: string, secret: string, timestamp = nowS()) {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

export async function startPaymentsStandIn(opts: StandInOptions): Promise<PaymentsStandIn> {
  const host = opts.host ?? '127.0.0.1';
  const webhookSecret = opts.webhookSecret ?? 'whsec_cohesia_local';
  const retryDelays = opts.retryDelaysMs ?? [500, 2000, 5000, 15000];
  const log = opts.log ?? (() => {});
  fs.mkdirSync(opts.directory, { recursive: true });
  const stateFile = path.join(opts.directory, 'state.json');
  const state: State = fs.existsSync(stateFile) ? JSON.parse(fs.readFileSync(stateFile, 'utf8')) : { accounts: {} };
  const save = () => fs.writeFileSync(stateFile, JSON.stringify(state));
  const timers = new Set<NodeJS.Timeout>();
  const chains = new Map<string, Promise<void>>();
  /** Deliveries waiting in an account's chain or on the wire, so a test can wait until all have arrived. */
  const inFlight = new Map<string, number>();
  let baseUrl = '';
  let closed = false;

  const account = (key: string) => (state.accounts[key] ??= newAccount());
  const id = (prefix: string) => `${prefix}_${randomBytes(12).toString('base64url').replace(/[-_]/g, 'x')}`;
  const publicView = (o: Obj) => Object.fromEntries(Object.entries(o).filter(([k]) => !k.startsWith('_')));
  const listOf = (data: Obj[], url: string, limit = 10) => ({ object: 'list', data: data.slice(0, limit).map(publicView), has_more: data.length > limit, url });

  // ---- events and webhook delivery ---------------------------------------
  function emit(acct: Account, key: string, type: string, object: Obj, previous?: Obj) {
    const event = {
      id: id('evt'),
      object: 'event',
      api_version: API_VERSION,
      created: nowS(),
      data: { object: structuredClone(publicView(object)), ...(previous ? { previous_attributes: previous } : {}) },
      livemode: false,
      pending_webhooks: Object.keys(acct.endpoints).length,
      request: { id: null, idempotency_key: null },
      type,
    };
    acct.events.push(event);
    if (acct.paused) acct.queued.push(event.id);
    else for (const ep of Object.values(acct.endpoints)) enqueue(key, event, ep, 1);
    return event;
  }

  function enqueue(key: string, event: Obj, ep: Endpoint, attempt: number): Promise<number | 'network-error'> {
    if (!ep.enabled_events.includes('*') && !ep.enabled_events.includes(event.type)) return Promise.resolve(204);
    // One delivery at a time per account, in the order asked for.
    let result!: Promise<number | 'network-error'>;
    const prev = chains.get(key) ?? Promise.resolve();
    inFlight.set(key, (inFlight.get(key) ?? 0) + 1);
    const next = prev.then(() => {
      result = deliverOnce(key, event, ep, attempt);
      return result.then(() => {});
    }).finally(() => inFlight.set(key, (inFlight.get(key) ?? 1) - 1));
    chains.set(key, next.catch(() => {}));
    return next.then(() => result);
  }

  async function deliverOnce(key: string, event: Obj, ep: Endpoint, attempt: number): Promise<number | 'network-error'> {
    if (closed) return 'network-error';
    const payload = JSON.stringify(event, null, 2);
    let status: number | 'network-error';
    try {
      const res = await fetch(ep.url, {
        method: 'POST',
        headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': signPayload(payload, ep.secret), 'user-agent': 'Payment-Stand-In/1.0' },
        body: payload,
        signal: AbortSignal.timeout(10_000),
      });
      await res.arrayBuffer();
      status = res.status;
    } catch {
      status = 'network-error';
    }
    const acct = account(key);
    acct.deliveries.push({ eventId: event.id, type: event.type, endpoint: ep.url, attempt, status, at: Date.now() });
    if (acct.deliveries.length > 1000) acct.deliveries.splice(0, acct.deliveries.length - 1000);
    save();
    const ok = typeof status === 'number' && status >= 200 && status < 300;
    if (!ok) {
      log(`webhook ${event.type} ${event.id} → ${ep.url} failed (${status}), attempt ${attempt}`);
      const delay = retryDelays[attempt - 1];
      if (delay !== undefined && !closed) {
        const t = setTimeout(() => {
          timers.delete(t);
          void enqueue(key, event, ep, attempt + 1);
        }, delay);
        t.unref();
        timers.add(t);
      }
    }
    return status;
  }

  // ---- object builders ---------------------------------------------------
  function priceOf(acct: Account, priceId: string) {
    const p = acct.prices[priceId];
    if (!p) throw notFoundErr('price', priceId, 'line_items[0][price]');
    return p;
  }

  function newInvoice(acct: Account, sub: Obj, reason: string, paid: boolean) {
    const item = sub.items.data[0];
    const price = item.price;
    const product = acct.products[price.product];
    const amount = price.unit_amount * item.quantity;
    const customer = acct.customers[sub.customer];
    const created = nowS();
    const invId = id('in');
    acct.invoiceSeq += 1;
    const inv = {
      id: invId,
      object: 'invoice',
      account_country: 'GB',
      account_name: 'Payment stand-in (test mode)',
      amount_due: amount,
      amount_paid: paid ? amount : 0,
      amount_remaining: paid ? 0 : amount,
      attempt_count: 1,
      attempted: true,
      auto_advance: !paid,
      billing_reason: reason,
      collection_method: 'charge_automatically',
      created,
      currency: price.currency,
      customer: sub.customer,
      customer_email: customer?.email ?? null,
      customer_name: customer?.name ?? null,
      description: null,
      hosted_invoice_url: `${baseUrl}/invoices/${invId}`,
      invoice_pdf: null,
      lines: {
        object: 'list',
        data: [
          {
            id: id('il'),
            object: 'line_item',
            amount,
            currency: price.currency,
            description: `1 × ${product?.name ?? price.product} (at ${money(price.unit_amount, price.currency)} / month)`,
            period: { start: item.current_period_start, end: item.current_period_end },
            quantity: item.quantity,
            pricing: { type: 'price_details', price_details: { price: price.id, product: price.product } },
          },
        ],
        has_more: false,
        url: `/v1/invoices/${invId}/lines`,
      },
      livemode: false,
      metadata: {},
      number: `STANDIN-${String(acct.invoiceSeq).padStart(4, '0')}`,
      parent: { type: 'subscription_details', subscription_details: { subscription: sub.id, metadata: sub.metadata } },
      period_end: item.current_period_end,
      period_start: item.current_period_start,
      status: paid ? 'paid' : 'open',
      status_transitions: { finalized_at: created, paid_at: paid ? created : null, voided_at: null, marked_uncollectible_at: null },
      subtotal: amount,
      total: amount,
      total_taxes: [],
    };
    acct.invoices[invId] = inv;
    return inv;
  }

  function createSubscription(acct: Account, customerId: string, priceId: string, metadata: Obj) {
    const price = priceOf(acct, priceId);
    const start = nowS();
    const subId = id('sub');
    const sub = {
      id: subId,
      object: 'subscription',
      billing_cycle_anchor: start,
      cancel_at: null,
      cancel_at_period_end: false,
      canceled_at: null,
      collection_method: 'charge_automatically',
      created: start,
      currency: price.currency,
      customer: customerId,
      ended_at: null,
      items: {
        object: 'list',
        data: [{ id: id('si'), object: 'subscription_item', created: start, current_period_start: start, current_period_end: start + MONTH_S, metadata: {}, price, quantity: 1, subscription: subId }],
        has_more: false,
        total_count: 1,
        url: `/v1/subscription_items?subscription=${subId}`,
      },
      latest_invoice: null as string | null,
      livemode: false,
      metadata,
      start_date: start,
      status: 'active',
      trial_end: null,
      trial_start: null,
    };
    acct.subscriptions[subId] = sub;
    return sub;
  }

  function cancelSubscription(acct: Account, key: string, sub: Obj) {
    if (sub.status === 'canceled') return sub;
    const at = nowS();
    const previous = { status: sub.status, canceled_at: null, ended_at: null };
    Object.assign(sub, { status: 'canceled', canceled_at: at, ended_at: at, cancel_at_period_end: false });
    emit(acct, key, 'customer.subscription.deleted', sub, previous);
    return sub;
  }

  function renew(acct: Account, key: string, sub: Obj, outcome: 'paid' | 'failed') {
    if (sub.status === 'canceled') throw new ApiErr(400, 'invalid_request_error', 'This subscription is canceled.');
    const item = sub.items.data[0];
    const previous = { status: sub.status, items: structuredClone(sub.items), latest_invoice: sub.latest_invoice };
    item.current_period_start = item.current_period_end;
    item.current_period_end = item.current_period_start + MONTH_S;
    const inv = newInvoice(acct, sub, 'subscription_cycle', outcome === 'paid');
    sub.latest_invoice = inv.id;
    sub.status = outcome === 'paid' ? 'active' : 'past_due';
    emit(acct, key, outcome === 'paid' ? 'invoice.paid' : 'invoice.payment_failed', inv);
    emit(acct, key, 'customer.subscription.updated', sub, previous);
    return { subscription: sub, invoice: inv };
  }

  // ---- the provider's REST API ---------------------------------------------
  type Ctx = { acct: Account; key: string; params: Record<string, FormValue>; m: RegExpExecArray };
  type Handler = (c: Ctx) => Obj;
  const routes: Array<[string, RegExp, Handler]> = [];
  const on = (method: string, pattern: string, h: Handler) => routes.push([method, new RegExp(`^${pattern.replace(/:(\w+)/g, '([^/]+)')}$`), h]);
  const get = (coll: Record<string, Obj>, what: string, oid: string) => {
    const o = coll[oid];
    if (!o) throw notFoundErr(what, oid);
    return o;
  };
  const filterList = (items: Obj[], params: Record<string, FormValue>, fields: string[]) =>
    items
      .filter((o) => fields.every((f) => params[f] === undefined || String(o[f]) === params[f]))
      .sort((a, b) => b.created - a.created);
  const limitOf = (p: Record<string, FormValue>) => Math.min(100, Math.max(1, Number(str(p.limit) ?? 10) || 10));

  on('POST', '/v1/products', ({ acct, params }) => {
    const name = str(params.name);
    if (!name) throw missingParam('name');
    const pid = id('prod');
    const t = nowS();
    acct.products[pid] = { id: pid, object: 'product', active: bool(params.active) ?? true, created: t, updated: t, default_price: null, description: str(params.description) ?? null, livemode: false, metadata: record(params.metadata), name, type: 'service', url: null };
    return acct.products[pid];
  });
  on('GET', '/v1/products', ({ acct, params }) => listOf(filterList(Object.values(acct.products), params, ['active']), '/v1/products', limitOf(params)));
  on('GET', '/v1/products/:id', ({ acct, m }) => get(acct.products, 'product', m[1]));
  on('POST', '/v1/products/:id', ({ acct, m, params }) => {
    const p = get(acct.products, 'product', m[1]);
    if (str(params.name)) p.name = str(params.name);
    if (params.description !== undefined) p.description = str(params.description) || null;
    if (bool(params.active) !== undefined) p.active = bool(params.active);
    if (params.metadata) p.metadata = { ...p.metadata, ...record(params.metadata) };
    p.updated = nowS();
    return p;
  });

  on('POST', '/v1/prices', ({ acct, params }) => {
    const product = str(params.product);
    if (!product) throw missingParam('product');
    if (!acct.products[product]) throw notFoundErr('product', product, 'product');
    const currency = str(params.currency)?.toLowerCase();
    if (!currency) throw missingParam('currency');
    const unit = Number(str(params.unit_amount));
    if (!Number.isInteger(unit) || unit < 0) throw new ApiErr(400, 'invalid_request_error', 'Invalid integer: unit_amount', { param: 'unit_amount' });
    const recurring = record(params.recurring);
    const pid = id('price');
    acct.prices[pid] = {
      id: pid, object: 'price', active: bool(params.active) ?? true, billing_scheme: 'per_unit', created: nowS(), currency, livemode: false, lookup_key: null,
      metadata: record(params.metadata), nickname: str(params.nickname) ?? null, product,
      recurring: recurring.interval ? { interval: recurring.interval, interval_count: Number(recurring.interval_count ?? 1), usage_type: 'licensed', meter: null, trial_period_days: null } : null,
      tax_behavior: 'unspecified', type: recurring.interval ? 'recurring' : 'one_time', unit_amount: unit, unit_amount_decimal: String(unit),
    };
    return acct.prices[pid];
  });
  on('GET', '/v1/prices', ({ acct, params }) => listOf(filterList(Object.values(acct.prices), params, ['product', 'active']), '/v1/prices', limitOf(params)));
  on('GET', '/v1/prices/:id', ({ acct, m }) => get(acct.prices, 'price', m[1]));
  on('POST', '/v1/prices/:id', ({ acct, m, params }) => {
    const p = get(acct.prices, 'price', m[1]);
    if (bool(params.active) !== undefined) p.active = bool(params.active);
    if (params.metadata) p.metadata = { ...p.metadata, ...record(params.metadata) };
    if (params.nickname !== undefined) p.nickname = str(params.nickname) || null;
    return p;
  });

  on('POST', '/v1/customers', ({ acct, key, params }) => {
    const cid = id('cus');
    acct.customers[cid] = { id: cid, object: 'customer', created: nowS(), email: str(params.email) ?? null, name: str(params.name) ?? null, livemode: false, metadata: record(params.metadata), currency: null, delinquent: false, description: str(params.description) ?? null };
    emit(acct, key, 'customer.created', acct.customers[cid]);
    return acct.customers[cid];
  });
  on('GET', '/v1/customers/:id', ({ acct, m }) => get(acct.customers, 'customer', m[1]));
  on('POST', '/v1/customers/:id', ({ acct, m, params }) => {
    const c = get(acct.customers, 'customer', m[1]);
    if (str(params.email)) c.email = str(params.email);
    if (str(params.name)) c.name = str(params.name);
    if (params.metadata) c.metadata = { ...c.metadata, ...record(params.metadata) };
    return c;
  });

  on('POST', '/v1/checkout/sessions', ({ acct, params }) => {
    const mode = str(params.mode);
    if (mode !== 'subscription') throw new ApiErr(400, 'invalid_request_error', 'This stand-in supports only mode=subscription.', { param: 'mode' });
    const successUrl = str(params.success_url);
    if (!successUrl) throw missingParam('success_url');
    const items = list(params.line_items).map((li) => ({ price: str((li as Obj).price), quantity: Number(str((li as Obj).quantity) ?? 1) }));
    if (items.length !== 1 || !items[0].price) throw new ApiErr(400, 'invalid_request_error', 'Give exactly one line item with a price.', { param: 'line_items' });
    const price = priceOf(acct, items[0].price);
    if (!price.active) throw new ApiErr(400, 'invalid_request_error', `The price specified is inactive: '${price.id}'.`, { param: 'line_items[0][price]' });
    if (!price.recurring) throw new ApiErr(400, 'invalid_request_error', 'A subscription needs a recurring price.', { param: 'line_items[0][price]' });
    const customer = str(params.customer);
    if (customer && !acct.customers[customer]) throw notFoundErr('customer', customer, 'customer');
    const sid = `cs_test_${randomBytes(24).toString('base64url').replace(/[-_]/g, 'x')}`;
    const created = nowS();
    const amount = price.unit_amount * items[0].quantity;
    acct.sessions[sid] = {
      id: sid, object: 'checkout.session', amount_subtotal: amount, amount_total: amount, cancel_url: str(params.cancel_url) ?? null,
      client_reference_id: str(params.client_reference_id) ?? null, created, currency: price.currency, customer: customer ?? null,
      customer_email: str(params.customer_email) ?? (customer ? acct.customers[customer].email : null), expires_at: created + 24 * 3600,
      invoice: null, livemode: false, metadata: record(params.metadata), mode, payment_status: 'unpaid', status: 'open', subscription: null,
      success_url: successUrl, url: `${baseUrl}/checkout/${sid}`,
      _line_items: items, _subscription_metadata: record(record(params.subscription_data).metadata),
    };
    return acct.sessions[sid];
  });
  on('GET', '/v1/checkout/sessions/:id', ({ acct, m }) => get(acct.sessions, 'checkout.session', m[1]));
  on('POST', '/v1/checkout/sessions/:id/expire', ({ acct, m }) => {
    const s = get(acct.sessions, 'checkout.session', m[1]);
    if (s.status !== 'open') throw new ApiErr(400, 'invalid_request_error', `Only open sessions can be expired; this one is ${s.status}.`);
    s.status = 'expired';
    return s;
  });

  on('GET', '/v1/subscriptions', ({ acct, params }) => {
    const status = str(params.status);
    const subs = filterList(Object.values(acct.subscriptions), params, ['customer']).filter((s) =>
      status === 'all' ? true : status ? s.status === status : s.status !== 'canceled',
    );
    return listOf(subs, '/v1/subscriptions', limitOf(params));
  });
  on('GET', '/v1/subscriptions/:id', ({ acct, m }) => get(acct.subscriptions, 'subscription', m[1]));
  on('POST', '/v1/subscriptions/:id', ({ acct, key, m, params }) => {
    const sub = get(acct.subscriptions, 'subscription', m[1]);
    if (sub.status === 'canceled') throw new ApiErr(400, 'invalid_request_error', 'A canceled subscription can only update its cancellation_details and metadata.');
    const previous: Obj = {};
    const items = list(params.items) as Obj[];
    if (items.length) {
      const wanted = items[0];
      const item = sub.items.data.find((i: Obj) => i.id === str(wanted.id)) ?? sub.items.data[0];
      if (str(wanted.price)) {
        previous.items = structuredClone(sub.items);
        item.price = priceOf(acct, str(wanted.price)!);
        sub.currency = item.price.currency;
      }
    }
    if (bool(params.cancel_at_period_end) !== undefined) {
      previous.cancel_at_period_end = sub.cancel_at_period_end;
      sub.cancel_at_period_end = bool(params.cancel_at_period_end);
      sub.cancel_at = sub.cancel_at_period_end ? sub.items.data[0].current_period_end : null;
    }
    if (params.metadata) {
      previous.metadata = structuredClone(sub.metadata);
      sub.metadata = { ...sub.metadata, ...record(params.metadata) };
    }
    if (Object.keys(previous).length) emit(acct, key, 'customer.subscription.updated', sub, previous);
    return sub;
  });
  on('DELETE', '/v1/subscriptions/:id', ({ acct, key, m }) => cancelSubscription(acct, key, get(acct.subscriptions, 'subscription', m[1])));

  on('GET', '/v1/invoices', ({ acct, params }) => {
    const subscription = str(params.subscription);
    const invs = filterList(Object.values(acct.invoices), params, ['customer', 'status']).filter(
      (i) => !subscription || i.parent?.subscription_details?.subscription === subscription,
    );
    return listOf(invs, '/v1/invoices', limitOf(params));
  });
  on('GET', '/v1/invoices/:id', ({ acct, m }) => get(acct.invoices, 'invoice', m[1]));

  on('POST', '/v1/billing_portal/sessions', ({ acct, params }) => {
    const customer = str(params.customer);
    if (!customer) throw missingParam('customer');
    if (!acct.customers[customer]) throw notFoundErr('customer', customer, 'customer');
    const pid = id('bps');
    acct.portalSessions[pid] = { id: pid, object: 'billing_portal.session', configuration: 'bpc_standin', created: nowS(), customer, livemode: false, locale: null, return_url: str(params.return_url) ?? null, url: `${baseUrl}/portal/${pid}` };
    return acct.portalSessions[pid];
  });

  on('POST', '/v1/webhook_endpoints', ({ acct, params }) => {
    const url = str(params.url);
    if (!url) throw missingParam('url');
    const events = list(params.enabled_events).map(String);
    if (!events.length) throw missingParam('enabled_events');
    return registerIn(acct, url, events);
  });
  on('GET', '/v1/webhook_endpoints', ({ acct, params }) => listOf(Object.values(acct.endpoints).map(({ secret: _s, ...e }) => e), '/v1/webhook_endpoints', limitOf(params)));

  on('GET', '/v1/events', ({ acct, params }) => {
    const type = str(params.type);
    const evs = [...acct.events].reverse().filter((e) => !type || e.type === type);
    return listOf(evs, '/v1/events', limitOf(params));
  });
  on('GET', '/v1/events/:id', ({ acct, m }) => {
    const e = acct.events.find((x) => x.id === m[1]);
    if (!e) throw notFoundErr('event', m[1]);
    return e;
  });

  function registerIn(acct: Account, url: string, events: string[]): Endpoint {
    const existing = Object.values(acct.endpoints).find((e) => e.url === url);
    if (existing) {
      existing.enabled_events = events;
      return existing;
    }
    const ep: Endpoint = { id: id('we'), object: 'webhook_endpoint', url, enabled_events: events, status: 'enabled', secret: webhookSecret, created: nowS(), livemode: false, metadata: {} };
    acct.endpoints[ep.id] = ep;
    return ep;
  }

  // ---- test controls ---------------------------------------------------------
  const controls: Array<[string, RegExp, (c: Omit<Ctx, 'params'> & { body: Obj }) => Promise<Obj> | Obj]> = [
    ['POST', /^\/_stand-in\/deliveries\/pause$/, ({ acct }) => ((acct.paused = true), { paused: true })],
    [
      'POST', /^\/_stand-in\/deliveries\/resume$/,
      ({ acct, key }) => {
        acct.paused = false;
        const queued = acct.queued.splice(0);
        for (const eid of queued) {
          const ev = acct.events.find((e) => e.id === eid)!;
          for (const ep of Object.values(acct.endpoints)) void enqueue(key, ev, ep, 1);
        }
        return { paused: false, released: queued.length };
      },
    ],
    [
      'POST', /^\/_stand-in\/events\/deliver$/,
      async ({ acct, key, body }) => {
        const ids: string[] = Array.isArray(body.ids) ? body.ids.map(String) : [];
        const results: Obj[] = [];
        for (const eid of ids) {
          const ev = acct.events.find((e) => e.id === eid);
          if (!ev) throw notFoundErr('event', eid);
          for (const ep of Object.values(acct.endpoints)) results.push({ id: eid, endpoint: ep.url, status: await enqueue(key, ev, ep, 1) });
        }
        return { delivered: results };
      },
    ],
    [
      'POST', /^\/_stand-in\/subscriptions\/([^/]+)\/renew$/,
      ({ acct, key, m, body }) => renew(acct, key, get(acct.subscriptions, 'subscription', m[1]), body.outcome === 'failed' ? 'failed' : 'paid'),
    ],
    ['GET', /^\/_stand-in\/deliveries$/, ({ acct, key }) => ({ deliveries: acct.deliveries, queued: acct.queued, inFlight: inFlight.get(key) ?? 0 })],
  ];

  // ---- hosted pages ---------------------------------------------------------
  const findAccountOf = (coll: keyof Account, oid: string): [string, Account] | undefined =>
    Object.entries(state.accounts).find(([, a]) => (a[coll] as Record<string, Obj>)[oid] !== undefined);

  function completeCheckout(key: string, acct: Account, session: Obj) {
    let customerId = session.customer as string | null;
    if (!customerId) {
      customerId = id('cus');
      acct.customers[customerId] = { id: customerId, object: 'customer', created: nowS(), email: session.customer_email, name: null, livemode: false, metadata: {}, currency: null, delinquent: false, description: null };
      emit(acct, key, 'customer.created', acct.customers[customerId]);
    }
    const sub = createSubscription(acct, customerId, session._line_items[0].price, session._subscription_metadata ?? {});
    const inv = newInvoice(acct, sub, 'subscription_create', true);
    sub.latest_invoice = inv.id;
    Object.assign(session, { status: 'complete', payment_status: 'paid', customer: customerId, subscription: sub.id, invoice: inv.id });
    emit(acct, key, 'customer.subscription.created', sub);
    emit(acct, key, 'invoice.paid', inv);
    emit(acct, key, 'invoice.payment_succeeded', inv);
    emit(acct, key, 'checkout.session.completed', session);
  }

  // The provider's documented test cards ([memory] of its testing documentation).
  const TEST_CARDS: Record<string, string | null> = {
    '4242424242424242': null,
    '4000000000000002': 'Your card was declined.',
    '4000000000009995': 'Your card has insufficient funds.',
  };

  async function hosted(req: http.IncomingMessage, res: http.ServerResponse, url: URL, body: string): Promise<boolean> {
    const html = (status: number, page: string) => {
      res.writeHead(status, { 'content-type': 'text/html; charset=utf-8', 'cache-control': 'no-store' });
      res.end(page);
      return true;
    };
    const redirect = (to: string) => {
      res.writeHead(303, { location: to });
      res.end();
      return true;
    };
    let m = /^\/checkout\/([\w]+)$/.exec(url.pathname);
    if (m) {
      const found = findAccountOf('sessions', m[1]);
      if (!found) return html(404, messagePage('No such checkout', 'This checkout session does not exist on this stand-in.'));
      const [key, acct] = found;
      const s = acct.sessions[m[1]];
      const price = acct.prices[s._line_items[0].price];
      const view = { id: s.id, planName: acct.products[price.product]?.name ?? price.id, amount: s.amount_total, currency: s.currency, email: s.customer_email, cancelUrl: s.cancel_url };
      if (s.status === 'complete') return redirect(s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id));
      if (s.status === 'expired' || s.expires_at < nowS()) return html(410, messagePage('Checkout expired', 'This checkout session has expired. Start again from the site.'));
      if (req.method === 'GET') return html(200, checkoutPage(view));
      if (req.method === 'POST') {
        const form = parseForm(body);
        const card = (str(form.card) ?? '').replace(/\D/g, '');
        if (!(card in TEST_CARDS)) {
          return html(402, checkoutPage({ ...view, card, error: 'Use one of the test card numbers listed below: this stand-in accepts no other cards.' }));
        }
        const decline = TEST_CARDS[card];
        if (decline) {
          log(`checkout ${s.id}: card declined`);
          return html(402, checkoutPage({ ...view, card, error: `${decline} No subscription was created; try another card.` }));
        }
        completeCheckout(key, acct, s);
        save();
        return redirect(s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id));
      }
    }
    m = /^\/portal\/([\w]+)(?:\/subscriptions\/([\w]+)\/(cancel|renew))?$/.exec(url.pathname);
    if (m) {
      const found = findAccountOf('portalSessions', m[1]);
      if (!found) return html(404, messagePage('No such portal session', 'This billing portal session does not exist on this stand-in.'));
      const [key, acct] = found;
      const ps = acct.portalSessions[m[1]];
      if (req.method === 'POST' && m[2]) {
        const sub = acct.subscriptions[m[2]];
        if (!sub || sub.customer !== ps.customer) return html(404, messagePage('No such subscription', 'This subscription is not this customer’s.'));
        if (m[3] === 'cancel') cancelSubscription(acct, key, sub);
        else renew(acct, key, sub, str(parseForm(body).outcome) === 'failed' ? 'failed' : 'paid');
        save();
        return redirect(`/portal/${ps.id}`);
      }
      const subs = Object.values(acct.subscriptions).filter((s) => s.customer === ps.customer).sort((a, b) => b.created - a.created);
      const invs = Object.values(acct.invoices).filter((i) => i.customer === ps.customer).sort((a, b) => b.created - a.created);
      return html(200, portalPage({
        id: ps.id,
        returnUrl: ps.return_url,
        subscriptions: subs.map((s) => {
          const item = s.items.data[0];
          return { id: s.id, status: s.status, planName: acct.products[item.price.product]?.name ?? item.price.id, amount: item.price.unit_amount, currency: item.price.currency, periodEnd: item.current_period_end, cancelAtPeriodEnd: s.cancel_at_period_end };
        }),
        invoices: invs.map((i) => ({ id: i.id, number: i.number, status: i.status, total: i.total, currency: i.currency, created: i.created })),
      }));
    }
    m = /^\/invoices\/([\w]+)$/.exec(url.pathname);
    if (m && req.method === 'GET') {
      const found = findAccountOf('invoices', m[1]);
      if (!found) return html(404, messagePage('No such invoice', 'This invoice does not exist on this stand-in.'));
      const i = found[1].invoices[m[1]];
      return html(200, invoicePage({ number: i.number, status: i.status, total: i.total, subtotal: i.subtotal, currency: i.currency, created: i.created, lines: i.lines.data }));
    }
    return false;
  }

  // ---- HTTP ---------------------------------------------------------------
  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      void handle(req, res, Buffer.concat(chunks).toString('utf8')).catch((e) => {
        log(`stand-in error: ${(e as Error).stack}`);
        if (!res.headersSent) res.writeHead(500, { 'content-type': 'application/json' });
        res.end(JSON.stringify({ error: { type: 'api_error', message: 'The stand-in failed; see its log.' } }));
      });
    });
  });

  async function handle(req: http.IncomingMessage, res: http.ServerResponse, body: string) {
    const url = new URL(req.url ?? '/', 'http://stand-in');
    const requestId = id('req');
    const json = (status: number, payload: unknown, headers: Record<string, string> = {}) => {
      res.writeHead(status, { 'content-type': 'application/json', 'request-id': requestId, 'stripe-version': API_VERSION, ...headers });
      res.end(JSON.stringify(payload, null, 2));
    };
    const errBody = (e: ApiErr) => ({ error: { type: e.type, message: e.message, request_log_url: null, ...e.extra } });

    const api = url.pathname.startsWith('/v1/');
    const control = url.pathname.startsWith('/_stand-in/');
    if (!api && !control) {
      if (await hosted(req, res, url, body)) return;
      if (url.pathname === '/' || url.pathname === '/health') return json(200, { standIn: 'payments', mode: 'test' });
      return json(404, { error: { type: 'invalid_request_error', message: `Unrecognized request URL (${req.method}: ${url.pathname}).` } });
    }
    // Bearer (the SDK) or Basic with the key as user name (curl -u sk_test_…:), as the provider accepts.
    const header = req.headers.authorization ?? '';
    const basic = /^Basic (\S+)$/.exec(header);
    const given = basic ? Buffer.from(basic[1], 'base64').toString('utf8').split(':')[0] : /^Bearer (\S+)$/.exec(header)?.[1];
    const key = given && /^sk_(test|live)_\S+$/.test(given) ? given : null;
    if (!key) {
      return json(401, { error: { type: 'invalid_request_error', message: 'You did not provide an API key. You need to provide your API key in the Authorization header, using Bearer auth (e.g. \'Authorization: Bearer YOUR_SECRET_KEY\').' } });
    }
    const acct = account(key);

    if (control) {
      const hit = controls.find(([method, re]) => method === req.method && re.test(url.pathname));
      if (!hit) return json(404, { error: { type: 'invalid_request_error', message: `No stand-in control ${req.method} ${url.pathname}.` } });
      try {
        const out = await hit[2]({ acct, key, m: hit[1].exec(url.pathname)!, body: body ? JSON.parse(body) : {} });
        save();
        return json(200, out);
      } catch (e) {
        if (e instanceof ApiErr) return json(e.status, errBody(e));
        throw e;
      }
    }

    const params = req.method === 'GET' || req.method === 'DELETE' ? parseForm(url.search.slice(1) + (body ? `&${body}` : '')) : parseForm(body);
    const idemKey = req.method === 'POST' ? (req.headers['idempotency-key'] as string | undefined) : undefined;
    const fingerprint = `${req.method} ${url.pathname} ${body}`;
    if (idemKey) {
      const seen = acct.idempotency[idemKey];
      if (seen) {
        if (seen.fingerprint !== fingerprint) {
          return json(400, errBody(new ApiErr(400, 'idempotency_error', `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idemKey}' if you meant to execute a different request.`)));
        }
        return json(seen.status, seen.body, { 'idempotent-replayed': 'true' });
      }
    }
    let status = 200;
    let out: unknown;
    const hit = routes.find(([method, re]) => method === req.method && re.test(url.pathname));
    try {
      if (!hit) throw new ApiErr(404, 'invalid_request_error', `Unrecognized request URL (${req.method}: ${url.pathname}). This stand-in answers only the calls Cohesia makes.`);
      out = publicView(hit[2]({ acct, key, params, m: hit[1].exec(url.pathname)! }));
    } catch (e) {
      if (!(e instanceof ApiErr)) throw e;
      status = e.status;
      out = errBody(e);
    }
    if (idemKey) acct.idempotency[idemKey] = { fingerprint, status, body: out };
    save();
    json(status, out);
  }

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  baseUrl = `http://${host}:${port}`;
  return {
    url: baseUrl,
    port,
    registerEndpoint(secretKey, url) {
      const ep = registerIn(account(secretKey), url, ['*']);
      save();
      return ep;
    },
    close: async () => {
      closed = true;
      for (const t of timers) clearTimeout(t);
      await new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      });
    },
  };
}
