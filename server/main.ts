// `npm start` / `npm run dev`: the whole product on one port.
import { ConfigError, loadConfig } from './config';
import { DataDirInUseError } from './db/data-dir-lock';
import { startCohesia, type ClientMode } from './runtime';

const startedAt = performance.now();
const mode: ClientMode = process.argv.includes('--dev') ? 'vite' : 'dist';

try {
  const config = loadConfig();
  const running = await startCohesia({ config, client: mode, startFakes: true, workers: config.jobWorker });
  const base = config.publicBaseUrl;
  const lines = [
    '',
    `Cohesia is running at ${base}  (started in ${((performance.now() - startedAt) / 1000).toFixed(1)} s, ${config.database.kind === 'pglite' ? `embedded database in ${config.database.dir}` : 'PostgreSQL server'})`,
  ];
  if (config.fakes) lines.push(`Mailbox of the local mail capture: ${base}/dev/mailbox`);
  if (running.demoAccounts?.length) {
    lines.push('', 'Demo accounts (synthetic people; all data here is demo data):');
    for (const a of running.demoAccounts) lines.push(`  ${a.role.padEnd(28)} ${a.email.padEnd(36)} password: ${a.password}`);
  }
  lines.push('', 'Press Ctrl-C to stop.', '');
  console.log(lines.join('\n'));

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`\n${signal}: stopping Cohesia…`);
    await running.close();
    process.exit(0);
  };
  process.on('SIGINT', () => void stop('SIGINT'));
  process.on('SIGTERM', () => void stop('SIGTERM'));
} catch (e) {
  if (e instanceof ConfigError || e instanceof DataDirInUseError) {
    console.error(`\nCohesia did not start.\n${e.message}\n`);
    process.exit(1);
  }
  if ((e as NodeJS.ErrnoException).code === 'EADDRINUSE') {
    console.error(`\nCohesia did not start: port ${(e as { port?: number }).port ?? ''} is already in use. Set PORT (or the fakes' ports) to free ones.\n`);
    process.exit(1);
  }
  throw e;
}
