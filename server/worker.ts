// `npm run worker`: a worker-only process (no HTTP) for a PostgreSQL server deployment;
// run as many as the background work needs, beside API instances started with JOB_WORKER=off.
import { ConfigError, loadConfig } from './config';
import { startCohesia } from './runtime';

try {
  const config = loadConfig();
  if (config.database.kind !== 'postgres') {
    throw new ConfigError('A separate worker needs a PostgreSQL server (DATABASE_URL); on the embedded default `npm start` runs the jobs itself.');
  }
  const running = await startCohesia({ config, client: 'none', serve: false, workers: true });
  console.log(`Cohesia worker ${running.jobs.workerId} is taking jobs. Press Ctrl-C to stop.`);
  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal}: the worker finishes its current job and stops…`);
    await running.close();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
} catch (e) {
  if (e instanceof ConfigError) {
    console.error(`\nThe worker did not start.\n${e.message}\n`);
    process.exit(1);
  }
  throw e;
}
