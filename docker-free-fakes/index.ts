import type { Config } from '../server/config';
import { startMailCapture, type MailCapture } from './mail-capture/server';
import { startObjectStorage, type ObjectStorageFake } from './object-storage/server';
import { startIdentifierRegistry, type IdentifierRegistryFake } from './identifier-registry/server';
import { startPaymentsStandIn, type PaymentsStandIn } from './payments/server';

export type Fakes = { storage: ObjectStorageFake; mail: MailCapture; identifiers: IdentifierRegistryFake; payments: PaymentsStandIn; close(): Promise<void> };

/** Starts every local stand-in on the ports named by the configuration. */
export async function startFakes(config: Config): Promise<Fakes> {
  const storage = await startObjectStorage({
    port: Number(new URL(config.s3.endpoint).port),
    directory: `${config.dataDir}/s3`,
    bucket: config.s3.bucket,
  });
  const mail = await startMailCapture({
    smtpPort: Number(new URL(config.mail.smtpUrl).port),
    httpPort: Number(new URL(config.mail.captureUrl).port),
    directory: `${config.dataDir}/mail`,
  });
  const identifiers = await startIdentifierRegistry({
    port: Number(new URL(config.identifiers.registryUrl).port),
    file: `${config.dataDir}/identifiers/registry.json`,
    user: config.identifiers.user,
    password: config.identifiers.password,
  });
  const payments = await startPaymentsStandIn({
    port: Number(new URL(config.payments.apiUrl).port),
    directory: `${config.dataDir}/payments`,
    webhookSecret: config.payments.webhookSecret,
  });
  // The stand-in sends this installation's events to its webhook endpoint.
  payments.registerEndpoint(config.payments.secretKey, `${config.publicBaseUrl}/api/billing/webhook`);
  return {
    storage,
    mail,
    identifiers,
    payments,
    close: async () => {
      await payments.close();
      await identifiers.close();
      await mail.close();
      await storage.close();
    },
  };
}
