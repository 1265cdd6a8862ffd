// Starts the payment stand-in alone: `npm run fake:payments`.
import { loadConfig } from '../../server/config';
import { startPaymentsStandIn } from './server';

const config = loadConfig();
const standIn = await startPaymentsStandIn({
  port: Number(new URL(config.payments.apiUrl).port),
  directory: `${config.dataDir}/payments`,
  webhookSecret: config.payments.webhookSecret,
  log: (line) => console.log(line),
});
// The app's own webhook endpoint, so events reach it when both run.
standIn.registerEndpoint(config.payments.secretKey, `${config.publicBaseUrl}/api/billing/webhook`);
console.log(`Payment stand-in (test mode) at ${standIn.url}; webhooks to ${config.publicBaseUrl}/api/billing/webhook`);
process.on('SIGINT', () => void standIn.close().then(() => process.exit(0)));
