import fs from 'node:fs';
import { PGlite } from '@electric-sql/pglite';
import { drizzle as drizzlePglite } from 'drizzle-orm/pglite';
import { migrate as migratePglite } from 'drizzle-orm/pglite/migrator';
import { drizzle as drizzlePg } from 'drizzle-orm/node-postgres';
import { migrate as migratePg } from 'drizzle-orm/node-postgres/migrator';
import type { PgDatabase, PgQueryResultHKT } from 'drizzle-orm/pg-core';
import pg from 'pg';
import { watchCatalogueGeneration } from '../repositories/catalogue-generation';
import * as schema from './schema';

export type Schema = typeof schema;
/** One Drizzle type for both engines; repositories only see this. */
export type Db = PgDatabase<PgQueryResultHKT, Schema>;

export type Database = {
  db: Db;
  kind: 'pglite' | 'postgres';
  migrate(): Promise<void>;
  /** Serialises start-up work (migrations, seeding) across processes sharing one database. */
  startupLock(): Promise<{ release(): Promise<void> }>;
  close(): Promise<void>;
  // PGlite only: an image of the whole database (test templates, backups).
  dumpDataDir?: () => Promise<Blob>;
};

// Any fixed 64-bit number; only Cohesia's start-up takes it.
const STARTUP_LOCK_KEY = 4_217_300_912;
const migrationsFolder = new URL('../../drizzle', import.meta.url).pathname;

/** PGlite on disk (or in memory, or from a migrated template for tests). */
export async function openPglite(opts: { dir?: string; template?: Blob }): Promise<Database> {
  if (opts.dir) fs.mkdirSync(opts.dir, { recursive: true }); // PGlite does not create parents
  const client = await PGlite.create({ dataDir: opts.dir, loadDataDir: opts.template });
  const db = drizzlePglite(client, { schema, casing: 'snake_case' });
  // This process alone owns the folder: the catalogue's generation is kept in memory from the triggers' notifications.
  watchCatalogueGeneration(db as unknown as Db, (onValue) => client.listen('cohesia_catalogue', onValue));
  return {
    db: db as unknown as Db,
    kind: 'pglite',
    migrate: () => migratePglite(db, { migrationsFolder }),
    // One process owns a PGlite folder (the data-folder lock), so there is nobody to wait for.
    startupLock: async () => ({ release: async () => {} }),
    close: () => client.close(),
    dumpDataDir: () => client.dumpDataDir('none'),
  };
}

/** A PostgreSQL server, through the same schema and migrations. */
export async function openPostgres(url: string): Promise<Database> {
  const pool = new pg.Pool({ connectionString: url, max: 10 });
  // An idle connection the server closed (restart, failover) is dropped from the pool; without a
  // listener node-postgres would throw it as an uncaught error and stop the process.
  pool.on('error', () => {});
  // The same for a connection that is checked out (inside a transaction) when the server goes away:
  // the query waiting on it fails and the request answers 503; the event must not stop the process.
  pool.on('connect', (client) => client.on('error', () => {}));
  const db = drizzlePg(pool, { schema, casing: 'snake_case' });
  return {
    db: db as unknown as Db,
    kind: 'postgres',
    migrate: () => migratePg(db, { migrationsFolder }),
    startupLock: async () => {
      // A session-level advisory lock on its own connection, held until release.
      const lockClient = new pg.Client({ connectionString: url });
      lockClient.on('error', () => {}); // a server restart ends the lock with the session; start-up then fails on its own query
      await lockClient.connect();
      await lockClient.query('select pg_advisory_lock($1)', [STARTUP_LOCK_KEY]);
      let held = true;
      return {
        release: async () => {
          if (!held) return;
          held = false;
          await lockClient.query('select pg_advisory_unlock($1)', [STARTUP_LOCK_KEY]).catch(() => {});
          await lockClient.end().catch(() => {});
        },
      };
    },
    close: () => pool.end(),
  };
}

export { schema };
