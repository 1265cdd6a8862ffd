import type { Config } from '../config';
import { startObjectStorage } from '../../docker-free-fakes/object-storage/server';

/**
 * On the embedded default the object store is the local fake that the server
 * runs itself, so it is down while the instance is stopped: backup and restore
 * start it on its configured port and folder for the time they need it.
 */
export async function withLocalStore<T>(config: Config, work: () => Promise<T>): Promise<T> {
  if (!(config.fakes && config.database.kind === 'pglite')) return work();
  const storage = await startObjectStorage({ port: Number(new URL(config.s3.endpoint).port), directory: `${config.dataDir}/s3`, bucket: config.s3.bucket });
  try {
    return await work();
  } finally {
    await storage.close();
  }
}
