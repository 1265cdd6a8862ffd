import { createHash } from 'node:crypto';
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { CreateBucketCommand, PutObjectCommand } from '@aws-sdk/client-s3';
import pino from 'pino';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { startCohesia, type Running } from '../../server/runtime';
import { createObjectStore } from '../../server/storage/object-store';
import { writeBackup } from '../../server/backup/create-backup';
import { restoreInstance } from '../../server/backup/restore-backup';
import type { BackupManifest } from '../../server/backup/manifest';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import { httpClient, type HttpClient } from '../support/http-client';
import { readZip } from '../support/zip';
import { adminQuery, databaseUrl } from '../support/postgres';

const run = promisify(execFile);
const LAB = 'fenmoor-swarm-ecology';
const sha = (b: Buffer, algo = 'sha256') => createHash(algo).update(b).digest('hex');
const root = path.resolve(new URL('../..', import.meta.url).pathname);

let app: TestApp;
let depositor: HttpClient;
let curator: HttpClient;
let work: string;
let backupDir: string;
let manifest: BackupManifest;
const published: Array<{ suffix: string; doi: string; files: Array<{ fileName: string; sha256: string; sizeBytes: number }> }> = [];

// Against a PostgreSQL server (the CI's second pass) the source is the test app's database and each target a new empty one.
const pgAdminUrl = inject('pgAdminUrl');
let targets = 0;
async function emptyDatabase(): Promise<Record<string, string>> {
  if (!pgAdminUrl) return {};
  const name = `${inject('pgTemplate')}_restore${process.pid}_${++targets}`;
  await adminQuery(pgAdminUrl, `create database ${name}`);
  return { DATABASE_URL: databaseUrl(pgAdminUrl, name) };
}

// The environment of an instance of our own on disk (not a test template), over the run's fakes and its own bucket.
function instanceEnv(dataDir: string, bucket: string, port = 0, extra: Record<string, string> = {}): Record<string, string> {
  return {
    NODE_ENV: 'test',
    PORT: String(port),
    PUBLIC_BASE_URL: `http://127.0.0.1:${port}`,
    DATA_DIR: dataDir,
    FAKES: 'off',
    S3_ENDPOINT: inject('s3Endpoint'),
    S3_BUCKET: bucket,
    SMTP_URL: inject('smtpUrl'),
    MAIL_CAPTURE_URL: inject('mailCaptureUrl'),
    DOI_REGISTRY_URL: inject('identifierRegistryUrl'),
    DOI_REGISTRY_PASSWORD: 'registry-test-password',
    STRIPE_API_URL: inject('paymentsUrl'),
    BETTER_AUTH_SECRET: 'test-secret-that-is-long-enough-0123456789',
    LOG_LEVEL: 'silent',
    // The restored accounts are the ones signed in with below, not freshly seeded ones.
    DEMO_SEED: 'false',
    ...extra,
  };
}

async function freshBucket(name: string) {
  const bucket = `${name}-${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;
  const store = createObjectStore(loadConfig(instanceEnv(work, bucket)).s3);
  await store.client.send(new CreateBucketCommand({ Bucket: bucket }));
  store.close();
  return bucket;
}

async function publish(title: string, files: Array<[string, Buffer, string?]>) {
  const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title, summary: '' })).json;
  await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title }) });
  for (const [name, bytes, role] of files) await waitForFile(depositor, LAB, draftId, await uploadFile(depositor, LAB, draftId, name, bytes, role));
  expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`)).status).toBe(200);
  const res = await curator.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {});
  expect(res.status).toBe(201);
  const landing = (await httpClient(app.url).get(`/api/releases/${res.json.suffix}`)).json;
  published.push({ suffix: res.json.suffix, doi: res.json.doi, files: landing.files });
}

async function download(http: HttpClient, p: string): Promise<Buffer> {
  const res = await http.get(p);
  expect(res.status, `${p}: ${JSON.stringify(res.json)}`).toBe(302);
  const dl = await fetch(res.headers.get('location')!);
  expect(dl.status).toBe(200);
  return Buffer.from(await dl.arrayBuffer());
}

beforeAll(async () => {
  work = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-backup-test-'));
  app = await startTestApp();
  depositor = await signInDemo(app, 'mina.throssel@fenmoor.example');
  curator = await signInDemo(app, 'rafael.quist@fenmoor.example');
  await publish('Backed-up swarm', [
    ['swarm.csv.gz', fixture('trapped-langevin-swarm.csv.gz')],
    ['notes.txt', Buffer.from('Lens notes.\n'), 'supplementary'],
  ]);
  await publish('Backed-up second swarm', [
    ['second.csv.gz', fixture('trapped-langevin-swarm.csv.gz').subarray(0)],
    ['calibration.txt', Buffer.from('Calibration grid 4 cm.\n'), 'supplementary'],
  ]);
  // A draft file that is not released yet is part of the instance too.
  const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title: 'Work in progress', summary: '' })).json;
  await waitForFile(depositor, LAB, draftId, await uploadFile(depositor, LAB, draftId, 'later.txt', Buffer.from('not yet released\n'), 'supplementary'));
  const visitor = httpClient(app.url);
  for (const r of published) {
    for (let until = Date.now() + 30_000; !(await visitor.get(`/api/releases/${r.suffix}/access`)).json.bundleReady;) {
      if (Date.now() > until) throw new Error(`No bundle for ${r.suffix} within 30 s`);
      await new Promise((resolve) => setTimeout(resolve, 200));
    }
  }

  backupDir = path.join(work, 'backup');
  const store = createObjectStore(loadConfig(instanceEnv(work, 'cohesia')).s3);
  const postgresUrl = pgAdminUrl ? databaseUrl(pgAdminUrl, `${inject('pgTemplate')}_app${app.port}`) : undefined;
  manifest = await writeBackup({ database: app.database, store, postgresUrl }, backupDir);
  store.close();
}, 120_000);

afterAll(async () => {
  await app?.close();
  if (work) fs.rmSync(work, { recursive: true, force: true });
});

describe('backup and restore', () => {
  it('writes a manifest with the engine, migration level, counts and a checksum for the database and every object', () => {
    expect(manifest).toMatchObject({ format: 'cohesia-backup', formatVersion: 1, engine: pgAdminUrl ? 'postgres' : 'pglite' });
    const journal = JSON.parse(fs.readFileSync(path.join(root, 'drizzle/meta/_journal.json'), 'utf8'));
    expect(manifest.migrationLevel).toBe(journal.entries.length);
    expect(manifest.counts.releases).toBe(2);
    expect(manifest.counts.bundles).toBe(2);
    expect(sha(fs.readFileSync(path.join(backupDir, manifest.database.file)))).toBe(manifest.database.sha256);
    // 4 release files + 2 bundles + 1 draft-only file.
    expect(manifest.objects).toHaveLength(7);
    expect(manifest.objects.filter((o) => o.referencedBy.includes('release_bundle'))).toHaveLength(2);
    for (const r of published) {
      for (const f of r.files)
        expect(
          manifest.objects.some((o) => o.sha256 === f.sha256 && o.sizeBytes === f.sizeBytes),
          f.fileName,
        ).toBe(true);
    }
    for (const o of manifest.objects) expect(sha(fs.readFileSync(path.join(backupDir, o.file))), o.key).toBe(o.sha256);
  });

  it('rebuilds an empty instance on a fresh folder and bucket: every file, bundle, landing page and demo sign-in', async () => {
    const dataDir = path.join(work, 'restored');
    const bucket = await freshBucket('restored');
    const port = await freePort();
    const target = await emptyDatabase();
    const config = loadConfig(instanceEnv(dataDir, bucket, port, target));
    const cliEnv = { ...process.env, ...instanceEnv(dataDir, bucket, port, target) };
    await restoreInstance(config, backupDir);

    const restored: Running = await startCohesia({ config, client: 'none', log: pino({ level: 'silent' }) });
    try {
      const visitor = httpClient(restored.url);
      for (const r of published) {
        const landing = await visitor.get(`/api/releases/${r.suffix}`);
        expect(landing.status).toBe(200);
        expect(landing.json.files).toEqual(r.files);
        expect((await visitor.get(`/doi/${r.doi.toLowerCase()}`)).status).toBe(302);
        for (const f of r.files) {
          const bytes = await download(visitor, `/api/releases/${r.suffix}/files/${encodeURIComponent(f.fileName)}/download`);
          expect(sha(bytes), `${r.suffix}/${f.fileName}`).toBe(f.sha256);
        }
        expect((await visitor.get(`/api/releases/${r.suffix}/access`)).json.bundleReady).toBe(true);
        const zip = await readZip(await download(visitor, `/api/releases/${r.suffix}/bundle`));
        const bag = `${r.suffix}/`;
        const lines = zip
          .get(`${bag}manifest-sha256.txt`)!
          .toString('utf8')
          .trim()
          .split('\n')
          .map((l) => l.split(/\s+/));
        expect(lines.length).toBeGreaterThanOrEqual(r.files.length);
        for (const [digest, p] of lines) expect(sha(zip.get(bag + p)!), p).toBe(digest);
        for (const f of r.files)
          expect(
            lines.some(([digest, p]) => digest === f.sha256 && p.endsWith(`/${f.fileName}`)),
            f.fileName,
          ).toBe(true);
      }
      // Accounts, passwords and lab membership came back with the database.
      const signedIn = await signInDemo({ url: restored.url } as TestApp, 'mina.throssel@fenmoor.example');
      const drafts = await signedIn.get(`/api/labs/${LAB}/storage`);
      expect(drafts.status).toBe(200);

      // While it runs, the embedded instance refuses a backup instead of reading a folder another process owns.
      if (!pgAdminUrl) {
        const refused = await run('node', ['--openssl-legacy-provider', '--import', 'tsx', 'scripts/backup.ts', '--out', path.join(work, 'while-running')], {
          cwd: root,
          env: cliEnv,
        }).catch((e) => e);
        expect(refused.code).toBe(1);
        expect(refused.stderr).toMatch(/Cohesia is running on .*stop it, run the backup, then start it again/);
      }
    } finally {
      await restored.close();
    }

    // Stopped, the command-line backup of the restored instance holds the same objects.
    const again = path.join(work, 'again');
    const cli = await run('node', ['--openssl-legacy-provider', '--import', 'tsx', 'scripts/backup.ts', '--out', again], { cwd: root, env: cliEnv });
    expect(cli.stdout).toMatch(/Backup written to .*2 releases, 7 objects/);
    const second = JSON.parse(fs.readFileSync(path.join(again, 'manifest.json'), 'utf8')) as BackupManifest;
    expect(second.objects.map((o) => [o.key, o.sha256])).toEqual(manifest.objects.map((o) => [o.key, o.sha256]));

    // A restored folder is not empty any more: restoring into it again is refused.
    await expect(restoreInstance(config, backupDir)).rejects.toThrow(
      pgAdminUrl ? /already has tables; restore only into an empty database/ : /already holds a database; restore only into an empty one/,
    );
  }, 90_000);

  it('refuses a backup with one altered object, naming the object, and restores nothing', async () => {
    const damaged = path.join(work, 'damaged');
    fs.cpSync(backupDir, damaged, { recursive: true });
    const victim = manifest.objects.find((o) => o.referencedBy.includes('release_file'))!;
    const file = path.join(damaged, victim.file);
    const bytes = fs.readFileSync(file);
    bytes[Math.floor(bytes.length / 2)] ^= 0xff;
    fs.writeFileSync(file, bytes);

    const dataDir = path.join(work, 'never');
    const config = loadConfig(instanceEnv(dataDir, await freshBucket('never'), 0, await emptyDatabase()));
    await expect(restoreInstance(config, damaged)).rejects.toThrow(`The backup is damaged: the object ${victim.key} does not match its checksum`);
    expect(fs.existsSync(path.join(dataDir, 'pglite'))).toBe(false);

    fs.rmSync(path.join(damaged, 'manifest.json'));
    await expect(restoreInstance(config, damaged)).rejects.toThrow(/is not a Cohesia backup: it has no manifest.json/);
  });

  it('refuses to restore into a bucket that holds other objects', async () => {
    const bucket = await freshBucket('in-use');
    const config = loadConfig(instanceEnv(path.join(work, 'in-use'), bucket, 0, await emptyDatabase()));
    const store = createObjectStore(config.s3);
    await store.client.send(new PutObjectCommand({ Bucket: bucket, Key: 'someone-else/file.txt', Body: 'x' }));
    store.close();
    await expect(restoreInstance(config, backupDir)).rejects.toThrow(
      `The bucket ${bucket} already holds 1 object(s) that are not in this backup (e.g. someone-else/file.txt)`,
    );
  });

  it('backs up the running instance on a platform admin\'s request while it keeps answering, and that backup restores', async () => {
    expect((await depositor.post('/api/admin/backups')).status).toBe(403);
    const admin = await signInDemo(app, 'nell.ashby@harrowgate-rds.example');
    const visitor = httpClient(app.url);
    const [made, ...pages] = await Promise.all([
      admin.post('/api/admin/backups'),
      ...published.map((r) => visitor.get(`/api/releases/${r.suffix}`)),
    ]);
    expect(made.status, JSON.stringify(made.json)).toBe(201);
    for (const p of pages) expect(p.status).toBe(200);
    expect(made.json).toMatchObject({ engine: manifest.engine, migrationLevel: manifest.migrationLevel, counts: { releases: 2, bundles: 2 } });
    const online = JSON.parse(fs.readFileSync(path.join(made.json.folder, 'manifest.json'), 'utf8')) as BackupManifest;
    expect(online.objects.map((o) => [o.key, o.sha256])).toEqual(manifest.objects.map((o) => [o.key, o.sha256]));

    const config = loadConfig(instanceEnv(path.join(work, 'from-online'), await freshBucket('online'), 0, await emptyDatabase()));
    await restoreInstance(config, made.json.folder);
    fs.rmSync(made.json.folder, { recursive: true, force: true });
  }, 60_000);

  it('refuses a backup folder that is not empty', async () => {
    const store = createObjectStore(loadConfig(instanceEnv(work, 'cohesia')).s3);
    await expect(writeBackup({ database: app.database, store }, backupDir)).rejects.toThrow(/is not empty; choose a new folder/);
    store.close();
  });
});

async function freePort(): Promise<number> {
  const net = await import('node:net');
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}
