import { execFile } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { Readable } from 'node:stream';
import { promisify } from 'node:util';
import { GetObjectCommand, NoSuchKey } from '@aws-sdk/client-s3';
import { drizzle } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import type { Logger } from 'pino';
import type { Config } from '../config';
import { openPglite, openPostgres, schema, type Database, type Db } from '../db/client';
import { DataDirInUseError, lockDataDir } from '../db/data-dir-lock';
import { backupRepository, type ReferencedObject } from '../repositories/backup.repository';
import { createObjectStore, type ObjectStore } from '../storage/object-store';
import { BACKUP_FORMAT, BACKUP_FORMAT_VERSION, BackupError, MANIFEST_FILE, objectFile, type BackupManifest } from './manifest';
import { hashFile, writeHashed } from './files';
import { withLocalStore } from './local-store';

const run = promisify(execFile);

export type BackupSource = { database: Database; store: ObjectStore; postgresUrl?: string; log?: Logger };

type Snapshot = { database: BackupManifest['database']; referenced: ReferencedObject[]; migrationLevel: number; counts: Record<string, number> };

function assertEmptyFolder(out: string) {
  if (fs.existsSync(out) && fs.readdirSync(out).length > 0) {
    throw new BackupError(`The backup folder ${path.resolve(out)} is not empty; choose a new folder so no earlier backup is mixed in.`);
  }
  fs.mkdirSync(out, { recursive: true });
}

async function describe(db: Db) {
  const repo = backupRepository(db);
  return { referenced: await repo.referencedObjects(), migrationLevel: await repo.migrationsApplied(), counts: await repo.counts() };
}

/** PGlite: its image (taken between two queries, so a server can keep running), then the keys read from that very image. */
async function pgliteSnapshot(database: Database, out: string): Promise<Snapshot> {
  if (!database.dumpDataDir) throw new BackupError('This database cannot be dumped.');
  const file = 'database/pglite.tar';
  const blob = await database.dumpDataDir();
  const written = await writeHashed(Readable.fromWeb(blob.stream() as never), path.join(out, file));
  const image = await openPglite({ template: blob });
  try {
    return { database: { file, ...written }, ...(await describe(image.db)) };
  } finally {
    await image.close();
  }
}

/** PostgreSQL: pg_dump and the key listing share one exported snapshot, so they see the same rows. */
async function postgresSnapshot(url: string, out: string): Promise<Snapshot> {
  const file = 'database/postgres.dump';
  fs.mkdirSync(path.join(out, 'database'), { recursive: true });
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query('begin isolation level repeatable read read only');
    const { rows } = await client.query<{ id: string }>('select pg_export_snapshot() as id');
    await run('pg_dump', ['--format=custom', '--no-owner', '--no-privileges', `--snapshot=${rows[0].id}`, `--file=${path.join(out, file)}`, url]).catch(
      (e: Error & { stderr?: string }) => {
        throw new BackupError(`pg_dump failed: ${(e.stderr || e.message).trim()}`);
      },
    );
    const described = await describe(drizzle(client, { schema, casing: 'snake_case' }) as unknown as Db);
    await client.query('commit');
    return { database: { file, ...(await hashFile(path.join(out, file))) }, ...described };
  } finally {
    await client.end();
  }
}

/**
 * Writes a backup of an open database and its objects into `out`: one
 * consistent image of the database, then every object that image references,
 * each streamed from the store to a file and checked against the SHA-256 the
 * database recorded, then manifest.json last (a folder without it is not a
 * backup). Objects never change under their keys, so copying them after the
 * image is taken is consistent with it.
 */
export async function writeBackup(src: BackupSource, out: string): Promise<BackupManifest> {
  assertEmptyFolder(out);
  let snapshot: Snapshot;
  if (src.database.kind === 'pglite') snapshot = await pgliteSnapshot(src.database, out);
  else if (src.postgresUrl) snapshot = await postgresSnapshot(src.postgresUrl, out);
  else throw new BackupError('A PostgreSQL backup needs the server address (DATABASE_URL).');

  const objects: BackupManifest['objects'] = [];
  const absent: BackupManifest['absent'] = [];
  for (const ref of snapshot.referenced) {
    const file = objectFile(ref.key);
    let got;
    try {
      got = await src.store.client.send(new GetObjectCommand({ Bucket: src.store.bucket, Key: ref.key }));
    } catch (e) {
      if (e instanceof NoSuchKey || (e as { name?: string }).name === 'NoSuchKey') {
        // Only a release's objects must be there: an unfinished upload has none yet, a draft file removed since the image none any more.
        if (!ref.referencedBy.some((r) => r === 'release_file' || r === 'release_bundle')) {
          absent.push({ key: ref.key, referencedBy: ref.referencedBy });
          continue;
        }
        throw new BackupError(`The object ${ref.key} (referenced by ${ref.referencedBy.join(', ')}) is missing from the store ${src.store.bucket}; the backup was not written.`);
      }
      throw e;
    }
    const written = await writeHashed(got.Body as Readable, path.join(out, file));
    if (ref.sha256 && ref.sha256 !== written.sha256) {
      throw new BackupError(`The object ${ref.key} in the store does not match the SHA-256 the database recorded (${ref.sha256}); the backup was not written.`);
    }
    objects.push({ key: ref.key, file, ...written, mediaType: got.ContentType ?? null, referencedBy: ref.referencedBy });
    src.log?.debug({ key: ref.key, bytes: written.sizeBytes }, 'object saved');
  }
  const manifest: BackupManifest = {
    format: BACKUP_FORMAT,
    formatVersion: BACKUP_FORMAT_VERSION,
    createdAt: new Date().toISOString(),
    engine: src.database.kind,
    migrationLevel: snapshot.migrationLevel,
    counts: { ...snapshot.counts, objects: objects.length, objectBytes: objects.reduce((s, o) => s + o.sizeBytes, 0) },
    database: snapshot.database,
    objects,
    absent,
  };
  fs.writeFileSync(path.join(out, MANIFEST_FILE), JSON.stringify(manifest, null, 2) + '\n');
  return manifest;
}

/**
 * `npm run backup`. On the embedded default it needs the instance stopped:
 * PGlite belongs to one process (the data-folder lock), so a second process
 * cannot read the folder safely; it refuses clearly while the server runs, and
 * a running instance is backed up by the server itself instead
 * (`POST /api/admin/backups`, same format). On a PostgreSQL server it runs
 * online (pg_dump's snapshot).
 */
export async function backupInstance(config: Config, out: string, log?: Logger): Promise<BackupManifest> {
  const store = createObjectStore(config.s3);
  try {
    if (config.database.kind === 'postgres') {
      const database = await openPostgres(config.database.url);
      try {
        return await writeBackup({ database, store, postgresUrl: config.database.url, log }, out);
      } finally {
        await database.close();
      }
    }
    if (!fs.existsSync(path.join(config.database.dir, 'PG_VERSION'))) {
      throw new BackupError(`There is no Cohesia database in ${path.resolve(config.database.dir)} (check DATA_DIR).`);
    }
    let lock;
    try {
      lock = lockDataDir(config.dataDir);
    } catch (e) {
      if (e instanceof DataDirInUseError) {
        throw new BackupError(
          `Cohesia is running on ${path.resolve(config.dataDir)}: stop it, run the backup, then start it again, or ask the running server for a backup (POST /api/admin/backups as a platform admin).`,
        );
      }
      throw e;
    }
    try {
      const database = await openPglite({ dir: config.database.dir });
      try {
        return await withLocalStore(config, () => writeBackup({ database, store, log }, out));
      } finally {
        await database.close();
      }
    } finally {
      lock.release();
    }
  } finally {
    store.close();
  }
}
