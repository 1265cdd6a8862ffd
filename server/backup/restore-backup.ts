import { execFile } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { promisify } from 'node:util';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { PGlite } from '@electric-sql/pglite';
import pg from 'pg';
import type { Logger } from 'pino';
import type { Config } from '../config';
import { DataDirInUseError, lockDataDir } from '../db/data-dir-lock';
import { createObjectStore, type ObjectStore } from '../storage/object-store';
import { hashFile } from './files';
import { withLocalStore } from './local-store';
import { BACKUP_FORMAT_VERSION, BackupError, MANIFEST_FILE, backupManifestSchema, objectFile, type BackupManifest } from './manifest';

const run = promisify(execFile);
const journal = new URL('../../drizzle/meta/_journal.json', import.meta.url);

/** Reads manifest.json and checks the database image and every object against it; names the first thing that differs. */
export async function verifyBackup(from: string): Promise<BackupManifest> {
  const manifestPath = path.join(from, MANIFEST_FILE);
  if (!fs.existsSync(manifestPath)) throw new BackupError(`${path.resolve(from)} is not a Cohesia backup: it has no ${MANIFEST_FILE}.`);
  let raw: unknown;
  try {
    raw = JSON.parse(fs.readFileSync(manifestPath, 'utf8'));
  } catch {
    throw new BackupError(`${MANIFEST_FILE} in ${path.resolve(from)} is not valid JSON.`);
  }
  const parsed = backupManifestSchema.safeParse(raw);
  if (!parsed.success) {
    throw new BackupError(`${MANIFEST_FILE} is not a Cohesia backup manifest: ${parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}.`);
  }
  const m = parsed.data;
  if (m.formatVersion > BACKUP_FORMAT_VERSION) throw new BackupError(`The backup has format version ${m.formatVersion}; this Cohesia reads up to ${BACKUP_FORMAT_VERSION}. Restore with a newer Cohesia.`);
  const known = (JSON.parse(fs.readFileSync(journal, 'utf8')) as { entries: unknown[] }).entries.length;
  if (m.migrationLevel > known) throw new BackupError(`The backup was taken at migration ${m.migrationLevel}; this Cohesia knows ${known}. Restore with the Cohesia version that made it or a newer one.`);
  const check = async (what: string, file: string, sizeBytes: number, sha256: string) => {
    const full = path.join(from, file);
    if (!fs.existsSync(full)) throw new BackupError(`The backup is damaged: ${what} is missing (${file}). Nothing was restored.`);
    const got = await hashFile(full);
    if (got.sha256 !== sha256 || got.sizeBytes !== sizeBytes) {
      throw new BackupError(`The backup is damaged: ${what} does not match its checksum (expected SHA-256 ${sha256}, ${sizeBytes} bytes; found ${got.sha256}, ${got.sizeBytes} bytes). Nothing was restored.`);
    }
  };
  await check('the database image', m.database.file, m.database.sizeBytes, m.database.sha256);
  for (const o of m.objects) {
    if (o.file !== objectFile(o.key)) throw new BackupError(`The backup is damaged: the object ${o.key} points at an unexpected file ${o.file}.`);
    await check(`the object ${o.key}`, o.file, o.sizeBytes, o.sha256);
  }
  return m;
}

async function listKeys(store: ObjectStore): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const page = await store.client.send(new ListObjectsV2Command({ Bucket: store.bucket, ContinuationToken: token }));
    for (const o of page.Contents ?? []) if (o.Key) keys.push(o.Key);
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

async function assertEmptyDatabase(config: Config) {
  if (config.database.kind === 'pglite') {
    const dir = config.database.dir;
    if (fs.existsSync(dir) && fs.readdirSync(dir).length > 0) {
      throw new BackupError(`The data folder ${path.resolve(dir)} already holds a database; restore only into an empty one (set DATA_DIR to a new folder).`);
    }
    return;
  }
  const client = new pg.Client({ connectionString: config.database.url });
  await client.connect();
  try {
    const { rows } = await client.query<{ n: string }>(
      `select count(*)::text as n from information_schema.tables where table_schema not in ('pg_catalog', 'information_schema')`,
    );
    if (Number(rows[0]?.n) > 0) throw new BackupError('The PostgreSQL database in DATABASE_URL already has tables; restore only into an empty database.');
  } finally {
    await client.end();
  }
}

async function assertStoreFree(store: ObjectStore, manifest: BackupManifest) {
  const wanted = new Set(manifest.objects.map((o) => o.key));
  // Keys of this backup may be there from an interrupted restore; anything else means the bucket is in use.
  const foreign = (await listKeys(store)).filter((k) => !wanted.has(k));
  if (foreign.length > 0) {
    throw new BackupError(`The bucket ${store.bucket} already holds ${foreign.length} object(s) that are not in this backup (e.g. ${foreign[0]}); restore only into an empty bucket.`);
  }
}

async function loadDatabase(config: Config, from: string, manifest: BackupManifest) {
  const file = path.join(from, manifest.database.file);
  if (manifest.engine !== config.database.kind) {
    throw new BackupError(`The backup holds a ${manifest.engine} database but this instance is configured for ${config.database.kind}; set DATABASE_URL accordingly.`);
  }
  if (config.database.kind === 'pglite') {
    fs.mkdirSync(config.database.dir, { recursive: true });
    const client = await PGlite.create({ dataDir: config.database.dir, loadDataDir: await fs.openAsBlob(file) });
    await client.close();
    return;
  }
  await run('pg_restore', ['--no-owner', '--no-privileges', '--exit-on-error', `--dbname=${config.database.url}`, file]).catch((e: Error & { stderr?: string }) => {
    throw new BackupError(`pg_restore failed: ${(e.stderr || e.message).trim()}`);
  });
}

/**
 * `npm run restore`: rebuilds an empty instance from a backup folder. It
 * checks every checksum before touching anything, refuses a target that is
 * not empty, writes the objects back to the configured store (streamed, one
 * at a time), and loads the database last, so an interrupted restore leaves
 * no database that points at missing objects.
 */
export async function restoreInstance(config: Config, from: string, log?: Logger): Promise<BackupManifest> {
  const manifest = await verifyBackup(from);
  let lock: { release(): void } | undefined;
  if (config.database.kind === 'pglite') {
    try {
      lock = lockDataDir(config.dataDir);
    } catch (e) {
      if (e instanceof DataDirInUseError) throw new BackupError(`Cohesia is running on ${path.resolve(config.dataDir)}; restore only into a stopped, empty instance.`);
      throw e;
    }
  }
  const store = createObjectStore(config.s3);
  try {
    await assertEmptyDatabase(config);
    await withLocalStore(config, () => restoreObjects(store, from, manifest, log));
    await loadDatabase(config, from, manifest);
    return manifest;
  } finally {
    store.close();
    lock?.release();
  }
}

async function restoreObjects(store: ObjectStore, from: string, manifest: BackupManifest, log?: Logger) {
  await assertStoreFree(store, manifest);
  for (const o of manifest.objects) {
    const upload = new Upload({
      client: store.client,
      params: { Bucket: store.bucket, Key: o.key, Body: fs.createReadStream(path.join(from, o.file)), ...(o.mediaType ? { ContentType: o.mediaType } : {}) },
      // Multipart above 8 MiB keeps memory at a few parts whatever the object size.
      partSize: 8 * 1024 * 1024,
      queueSize: 2,
    });
    await upload.done();
    log?.debug({ key: o.key }, 'object restored');
  }
}
