import path from 'node:path';
import type { Logger } from 'pino';
import type { Config } from '../config';
import type { Database } from '../db/client';
import { AppError } from '../errors';
import type { ObjectStore } from '../storage/object-store';
import { writeBackup } from '../backup/create-backup';
import { BackupError } from '../backup/manifest';

/**
 * Online backups: the running server writes the backup itself, because on the
 * embedded default it is the only process that may read its database. The
 * image is taken between two queries (PGlite runs one at a time) and the
 * objects are copied after it, so requests go on while it runs.
 */
export function createBackupService(d: { config: Config; database: Database; store: ObjectStore; log: Logger }) {
  let running = false;
  return {
    async backupNow() {
      if (running) throw new AppError('backup_running', 'A backup is already being written; wait for it to finish.', 409);
      running = true;
      // A new folder per backup, named by its time (sortable, no colons for other file systems).
      const folder = path.resolve(d.config.backupDir, new Date().toISOString().replace(/[:.]/g, '-'));
      try {
        const postgresUrl = d.config.database.kind === 'postgres' ? d.config.database.url : undefined;
        const m = await writeBackup({ database: d.database, store: d.store, postgresUrl, log: d.log }, folder);
        d.log.info({ folder, objects: m.objects.length }, 'backup written');
        return { folder, createdAt: m.createdAt, engine: m.engine, migrationLevel: m.migrationLevel, counts: m.counts };
      } catch (e) {
        if (e instanceof BackupError) throw new AppError('backup_failed', e.message, 500);
        throw e;
      } finally {
        running = false;
      }
    },
  };
}

export type BackupService = ReturnType<typeof createBackupService>;
