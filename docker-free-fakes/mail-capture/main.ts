// Starts the SMTP capture alone: `npm run fake:mail`.
import { loadConfig } from '../../server/config';
import { startMailCapture } from './server';

const config = loadConfig();
const capture = await startMailCapture({
  smtpPort: Number(new URL(config.mail.smtpUrl).port),
  httpPort: Number(new URL(config.mail.captureUrl).port),
  directory: `${config.dataDir}/mail`,
});
console.log(`SMTP capture on port ${capture.smtpPort}; messages at ${capture.httpUrl}/messages`);
process.on('SIGINT', () => void capture.close().then(() => process.exit(0)));
