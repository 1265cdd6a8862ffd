import fs from 'node:fs';
import { inject } from 'vitest';
import pino from 'pino';
import { loadConfig } from '../../server/config';
import { startCohesia, type ClientMode, type Running } from '../../server/runtime';
import { createPaymentsClient } from '../../server/payments/stripe-client';
import { createTestDatabase } from './postgres';

export type TestApp = Running & { mail: MailboxClient; payments: { url: string; secretKey: string; webhookSecret: string } };

/** Starts the real app on a free port over a fresh copy of the migrated, seeded template. */
export async function startTestApp(opts: { client?: ClientMode; env?: Record<string, string>; workers?: boolean } = {}): Promise<TestApp> {
  const port = await freePort();
  // Against a PostgreSQL server each app gets its own database copied from the template; otherwise a PGlite image.
  const pgAdminUrl = inject('pgAdminUrl');
  const pgTemplate = inject('pgTemplate');
  const databaseUrl = opts.env?.DATABASE_URL ? null : pgAdminUrl && pgTemplate ? await createTestDatabase(pgAdminUrl, pgTemplate, `${pgTemplate}_app${port}`) : null;
  const template = databaseUrl || opts.env?.DATABASE_URL ? undefined : new Blob([fs.readFileSync(inject('templatePath'))]);
  const config = loadConfig({
    NODE_ENV: 'test',
    PORT: String(port),
    PUBLIC_BASE_URL: `http://127.0.0.1:${port}`,
    DATA_DIR: `${inject('workDir')}/app-${port}`,
    FAKES: 'on',
    S3_ENDPOINT: inject('s3Endpoint'),
    SMTP_URL: inject('smtpUrl'),
    MAIL_CAPTURE_URL: inject('mailCaptureUrl'),
    DOI_REGISTRY_URL: inject('identifierRegistryUrl'),
    DOI_REGISTRY_PASSWORD: 'registry-test-password',
    // Each app is its own account at the shared payment stand-in.
    STRIPE_API_URL: inject('paymentsUrl'),
    STRIPE_SECRET_KEY: `sk_test_app_${port}_${Date.now().toString(36)}`,
    BETTER_AUTH_SECRET: 'test-secret-that-is-long-enough-0123456789',
    LOG_LEVEL: 'silent',
    DEMO_RELEASES: 'false',
    ...(databaseUrl ? { DATABASE_URL: databaseUrl } : {}),
    ...opts.env,
  });
  const running = await startCohesia({ config, client: opts.client ?? 'none', template, log: pino({ level: process.env.COHESIA_TEST_LOG ?? 'silent' }), workers: opts.workers });
  // The stand-in sends this account's webhook events to this app (the provider's own endpoint API, through the SDK).
  await createPaymentsClient(config.payments).webhookEndpoints.create({ url: `${running.url}/api/billing/webhook`, enabled_events: ['*'] });
  const payments = { url: config.payments.apiUrl, secretKey: config.payments.secretKey, webhookSecret: config.payments.webhookSecret };
  return { ...running, mail: mailboxClient(inject('mailCaptureUrl'), config.publicBaseUrl), payments };
}

// better-auth wants the public base URL to match the origin it sees, so the
// port is chosen before the app starts.
async function freePort(): Promise<number> {
  const net = await import('node:net');
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

export type CapturedMail = { id: string; to: string[]; subject: string; text: string };
export type MailboxClient = ReturnType<typeof mailboxClient>;

/**
 * Reads the real SMTP capture over HTTP; waits for mail that is still in flight.
 * Test apps share one capture, so with `appUrl` only mail linking to that app counts
 * (every message Cohesia sends carries a link to its own address).
 */
export function mailboxClient(base: string, appUrl?: string) {
  return {
    async messagesTo(to: string): Promise<CapturedMail[]> {
      const res = await fetch(`${base}/messages?to=${encodeURIComponent(to)}`);
      const all = (await res.json()) as CapturedMail[];
      return appUrl ? all.filter((m) => m.text.includes(appUrl)) : all;
    },
    async waitFor(to: string, subject: RegExp, timeoutMs = 10_000): Promise<CapturedMail> {
      const until = Date.now() + timeoutMs;
      for (;;) {
        const found = (await this.messagesTo(to)).find((m) => subject.test(m.subject));
        if (found) return found;
        if (Date.now() > until) throw new Error(`No mail to ${to} matching ${subject} within ${timeoutMs} ms`);
        await new Promise((r) => setTimeout(r, 100));
      }
    },
  };
}

export const firstLink = (text: string): string => {
  const m = /https?:\/\/\S+/.exec(text);
  if (!m) throw new Error(`No link in: ${text}`);
  return m[0];
};

export const uniqueEmail = (who: string) => `${who}.${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}@lab.example`;
