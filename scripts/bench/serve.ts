// The app alone in its own process for the load benchmark, so the load generator does not share its event loop.
import pino from 'pino';
import { loadConfig } from '../../server/config';
import { startCohesia } from '../../server/runtime';

const config = loadConfig();
const running = await startCohesia({ config, client: 'none', startFakes: true, workers: config.jobWorker, log: pino({ level: config.logLevel }) });
console.log(`LISTENING ${running.url}`);
const stop = async () => {
  await running.close();
  process.exit(0);
};
process.on('SIGTERM', () => void stop());
process.on('SIGINT', () => void stop());
