import Stripe from 'stripe';
import type { Config } from '../config';

export type PaymentsClient = Stripe;

const REAL_PROVIDER = 'api.stripe.com';

/**
 * The provider's official SDK, pointed by configuration only: at the local
 * stand-in (`STRIPE_API_URL`, default http://127.0.0.1:12111) or, with
 * `https://api.stripe.com`, at the real provider in test or live mode (the
 * key decides which).
 */
export function createPaymentsClient(payments: Pick<Config['payments'], 'secretKey' | 'apiUrl'>): PaymentsClient {
  const u = new URL(payments.apiUrl);
  if (u.hostname === REAL_PROVIDER) return new Stripe(payments.secretKey, { maxNetworkRetries: 2, telemetry: false });
  const protocol = u.protocol === 'https:' ? 'https' : 'http';
  return new Stripe(payments.secretKey, {
    host: u.hostname,
    port: Number(u.port || (protocol === 'https' ? 443 : 80)),
    protocol,
    maxNetworkRetries: 0,
    telemetry: false,
  });
}

/** Verifies a webhook's signature over the raw body and returns the event; throws when it does not verify. */
export function verifyWebhook(rawBody: Buffer | string, signature: string | undefined, secret: string): Stripe.Event {
  return Stripe.webhooks.constructEvent(rawBody, signature ?? '', secret);
}

export { Stripe };
