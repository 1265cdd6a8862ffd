// Starts the identifier registration agency fake alone: `npm run fake:identifiers`.
import { loadConfig } from '../../server/config';
import { startIdentifierRegistry } from './server';

const config = loadConfig();
const registry = await startIdentifierRegistry({
  port: Number(new URL(config.identifiers.registryUrl).port),
  file: `${config.dataDir}/identifiers/registry.json`,
  user: config.identifiers.user,
  password: config.identifiers.password,
});
console.log(`Identifier registration agency (local fake) at ${registry.url}`);
process.on('SIGINT', () => void registry.close().then(() => process.exit(0)));
