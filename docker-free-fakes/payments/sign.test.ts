import { describe, expect, it } from 'vitest';
import Stripe from 'stripe';
import { signPayload } from './server';

// The stand-in signs its own way; the provider's SDK must accept it exactly as a real delivery.
describe('signPayload(payload, secret)', () => {
  const payload = JSON.stringify({ id: 'evt_1', object: 'event', type: 'invoice.paid', data: { object: {} }, created: 1 });

  it('produces a header the SDK verifies', () => {
    const event = Stripe.webhooks.constructEvent(payload, signPayload(payload, 'whsec_a'), 'whsec_a');
    expect(event.id).toBe('evt_1');
  });

  it('is refused by the SDK with another secret, another body or an old timestamp', () => {
    expect(() => Stripe.webhooks.constructEvent(payload, signPayload(payload, 'whsec_b'), 'whsec_a')).toThrow();
    expect(() => Stripe.webhooks.constructEvent(`${payload} `, signPayload(payload, 'whsec_a'), 'whsec_a')).toThrow();
    const old = Math.floor(Date.now() / 1000) - 600;
    expect(() => Stripe.webhooks.constructEvent(payload, signPayload(payload, 'whsec_a', old), 'whsec_a')).toThrow(/tolerance/);
  });

  it('matches the SDK’s own test header for the same timestamp', () => {
    const t = Math.floor(Date.now() / 1000);
    expect(signPayload(payload, 'whsec_a', t)).toBe(Stripe.webhooks.generateTestHeaderString({ payload, secret: 'whsec_a', timestamp: t }));
  });
});
