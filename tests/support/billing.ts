import { expect } from 'vitest';
import type { TestApp } from './test-app';
import type { HttpClient } from './http-client';

// Test cards from the provider's testing documentation ([memory]).
export const CARDS = { success: '4242424242424242', declined: '4000000000000002', insufficientFunds: '4000000000009995' } as const;

/** Polls `read` until `ok` holds (webhooks arrive asynchronously). */
export async function eventually<T>(read: () => Promise<T>, ok: (v: T) => boolean, timeoutMs = 10_000): Promise<T> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const v = await read();
    if (ok(v)) return v;
    if (Date.now() > until) throw new Error(`condition not met within ${timeoutMs} ms; last value: ${JSON.stringify(v)}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** Types a card on the stand-in's hosted checkout page (a plain form POST, as the browser does). */
export function payOnHostedCheckout(url: string, card: string) {
  return fetch(url, { method: 'POST', body: new URLSearchParams({ card, expiry: '12 / 34', cvc: '123' }), redirect: 'manual' });
}

/** The stand-in's test controls for this app's account (pause, deliver, renew). */
export async function standIn(app: TestApp, method: 'GET' | 'POST', path: string, body?: unknown) {
  const res = await fetch(`${app.payments.url}/_stand-in${path}`, {
    method,
    headers: { authorization: `Bearer ${app.payments.secretKey}`, 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  return res.json();
}

/** A lab lead picks a plan and pays with `card`; returns the hosted page's answer. */
export async function checkoutWith(lead: HttpClient, slug: string, planId: string, card: string) {
  const started = await lead.post(`/api/labs/${slug}/billing/checkout`, { planId });
  expect(started.status).toBe(200);
  expect(started.json.kind).toBe('checkout');
  return payOnHostedCheckout(started.json.url, card);
}

export async function activePlans(http: HttpClient) {
  const res = await http.get('/api/plans');
  expect(res.status).toBe(200);
  return res.json as Array<{ id: string; name: string; quotaBytes: number; monthlyPriceMinor: number; currency: string }>;
}
