/**
 * The fault suite: what Cohesia does when a part fails under it.
 *
 * Here:
 * - the server process killed (SIGKILL) mid-ingest and mid-bundle: the job is
 *   taken again at the next start and completes once; no partial bundle is
 *   ever visible in the store;
 * - the object store unreachable while starting an upload (presign), while
 *   completing one (upload verification) and while bundling: a 503 in our error
 *   shape, jobs retried with backoff, nothing recorded as done, and the work
 *   completes once the store is back;
 * - the disk of the embedded database full (a real tmpfs of limited size):
 *   writes answer 503 `database_full` and change nothing, reads keep working,
 *   and writes work again once space is freed.
 *
 * Elsewhere (not repeated here):
 * - payment webhooks replayed and delivered in reverse order, and an event that
 *   cannot be applied yet (500, retried by the provider):
 *   tests/integration/billing-webhooks.test.ts ("webhook idempotency and order");
 * - SMTP down (mail stays in the outbox and is sent when the server is back):
 *   tests/integration/access-requests.test.ts ("the outbox");
 * - a second process on the same data folder refused: tests/integration/start-and-stop.test.ts;
 * - a corrupted backup refused by restore: tests/integration/backup-restore.test.ts;
 * - PostgreSQL server restarts during requests: tests/integration/database-restart.test.ts
 *   (PostgreSQL pass only).
 */
import { createHash } from 'node:crypto';
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { ListObjectsV2Command } from '@aws-sdk/client-s3';
import { PGlite } from '@electric-sql/pglite';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import pino from 'pino';
import { loadConfig } from '../../server/config';
import { startCohesia, type Running } from '../../server/runtime';
import { openPglite } from '../../server/db/client';
import { createObjectStore } from '../../server/storage/object-store';
import { startObjectStorage, type ObjectStorageFake } from '../../docker-free-fakes/object-storage/server';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import { httpClient, type HttpClient } from '../support/http-client';
import { readZip } from '../support/zip';

const LAB = 'fenmoor-swarm-ecology';
const root = path.resolve(new URL('../..', import.meta.url).pathname);
const sha = (b: Buffer | string) => createHash('sha256').update(b).digest('hex');
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = net.createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

async function until<T>(what: string, ms: number, probe: () => Promise<T | undefined | null | false> | T | undefined | null | false): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const got = await probe();
    if (got) return got;
    if (Date.now() > end) throw new Error(`Timed out after ${ms} ms waiting for ${what}`);
    await sleep(50);
  }
}

/** A synthetic 3D trajectory file in plain text, big enough that ingesting and bundling it take a while. */
function bigTrajectoryCsv(tracks: number, frames: number): Buffer {
  const parts: string[] = ['track_id,frame,x,y,z\n'];
  let seed = 7;
  const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648 - 0.5) * 0.002;
  const pos = Array.from({ length: tracks }, () => [0, 0, 0]);
  for (let f = 0; f < frames; f++) {
    let block = '';
    for (let t = 0; t < tracks; t++) {
      const p = pos[t];
      p[0] += rnd();
      p[1] += rnd();
      p[2] += rnd();
      block += `${t},${f},${p[0].toFixed(6)},${p[1].toFixed(6)},${p[2].toFixed(6)}\n`;
    }
    parts.push(block);
  }
  return Buffer.from(parts.join(''));
}

type JobLine = { id: string; kind: string; state: string; phase: string; attempts: number };

/** tests/support/child-server.ts as a process on a data folder of its own. */
function startChild(env: Record<string, string>) {
  let out = '';
  const jobs: JobLine[] = [];
  const child: ChildProcess = spawn(process.execPath, ['--openssl-legacy-provider', '--import', 'tsx', 'tests/support/child-server.ts'], {
    cwd: root,
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let buffered = '';
  child.stdout!.on('data', (d: Buffer) => {
    out += d;
    buffered += d;
    const lines = buffered.split('\n');
    buffered = lines.pop()!;
    for (const l of lines) if (l.startsWith('child-job ')) jobs.push(JSON.parse(l.slice(10)));
  });
  child.stderr!.on('data', (d) => (out += d));
  const exited = new Promise<number | null>((r) => child.on('exit', (code, signal) => r(code ?? (signal ? -1 : null))));
  return {
    child,
    jobs,
    exited,
    output: () => out,
    ready: () => until('the child server to start', 45_000, () => out.includes('child-ready') || (child.exitCode !== null && Promise.reject(new Error(out)))),
    async kill() {
      child.kill('SIGKILL');
      await exited;
    },
    async stop() {
      child.kill('SIGTERM');
      await exited;
    },
  };
}

function childEnv(dataDir: string, port: number, s3Endpoint = inject('s3Endpoint')): Record<string, string> {
  return {
    NODE_ENV: 'test',
    PORT: String(port),
    PUBLIC_BASE_URL: `http://127.0.0.1:${port}`,
    DATA_DIR: dataDir,
    FAKES: 'off',
    S3_ENDPOINT: s3Endpoint,
    SMTP_URL: inject('smtpUrl'),
    MAIL_CAPTURE_URL: inject('mailCaptureUrl'),
    DOI_REGISTRY_URL: inject('identifierRegistryUrl'),
    DOI_REGISTRY_PASSWORD: 'registry-test-password',
    STRIPE_API_URL: inject('paymentsUrl'),
    STRIPE_SECRET_KEY: `sk_test_faults_${port}`,
    BETTER_AUTH_SECRET: 'test-secret-that-is-long-enough-0123456789',
    LOG_LEVEL: 'warn',
    DEMO_SEED: 'false',
    DEMO_RELEASES: 'false',
  };
}

/** A data folder holding the run's migrated, seeded template, as if Cohesia had run there before. */
async function templateDataDir(): Promise<string> {
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-faults-'));
  const client = await PGlite.create({ dataDir: path.join(dataDir, 'pglite'), loadDataDir: await fs.openAsBlob(inject('templatePath')) });
  await client.close();
  return dataDir;
}

async function withDatabase<T>(dataDir: string, read: (db: Awaited<ReturnType<typeof openPglite>>['db']) => Promise<T>): Promise<T> {
  const database = await openPglite({ dir: path.join(dataDir, 'pglite') });
  try {
    return await read(database.db);
  } finally {
    await database.close();
  }
}
const rowsOf = <T>(r: unknown) => (r as { rows: T[] }).rows;

describe.skipIf(!!inject('pgAdminUrl'))('the server process killed mid-job (embedded default)', () => {
  let dataDir: string;
  let port: number;
  let server: ReturnType<typeof startChild>;
  let depositor: HttpClient;
  let draftId: string;
  let fileId: string;
  const big = bigTrajectoryCsv(50, 16_000);

  beforeAll(async () => {
    dataDir = await templateDataDir();
    port = await freePort();
  });
  afterAll(async () => {
    server?.child.kill('SIGKILL');
    if (dataDir) fs.rmSync(dataDir, { recursive: true, force: true });
  });

  it('takes a killed ingest again at the next start and records one result', async () => {
    server = startChild(childEnv(dataDir, port));
    await server.ready();
    depositor = await signInDemo({ url: `http://127.0.0.1:${port}` } as TestApp, 'mina.throssel@fenmoor.example');
    ({ draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title: 'Killed mid-ingest', summary: '' })).json);
    await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title: 'Killed mid-ingest' }) });
    fileId = await uploadFile(depositor, LAB, draftId, 'big-swarm.csv', big);
    const running = await until('the ingest job to run', 20_000, () => server.jobs.find((j) => j.kind === 'ingest-file' && j.state === 'running'));
    await server.kill();
    const ingestJobs = await withDatabase(dataDir, async (db) => rowsOf<{ state: string; sha256: string | null }>(await db.execute(sql`select j.state, f.sha256 from job j, draft_file f where j.kind = 'ingest-file' and f.id = ${fileId}`)));
    // Killed while running: nothing recorded yet.
    expect(ingestJobs).toEqual([{ state: 'running', sha256: null }]);

    server = startChild(childEnv(dataDir, port));
    await server.ready();
    const file = await waitForFile(depositor, LAB, draftId, fileId, 40_000);
    expect(file.state).toBe('ready');
    expect(file.sha256).toBe(sha(big));
    await server.stop();
    const after = await withDatabase(dataDir, async (db) => ({
      jobs: rowsOf(await db.execute(sql`select id, state, attempts from job where kind = 'ingest-file'`)),
      stored: rowsOf(await db.execute(sql`select sha256 from stored_object where object_key = (select object_key from draft_file where id = ${fileId})`)),
    }));
    expect(after.jobs).toEqual([{ id: running.id, state: 'done', attempts: 2 }]);
    expect(after.stored).toEqual([{ sha256: sha(big) }]);
  }, 90_000);

  it('never shows a partial bundle: a killed bundle build leaves no object, and the next start builds exactly one', async () => {
    server = startChild(childEnv(dataDir, port));
    await server.ready();
    const curator = await signInDemo({ url: `http://127.0.0.1:${port}` } as TestApp, 'rafael.quist@fenmoor.example');
    expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`)).status).toBe(200);
    const pub = await curator.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {});
    expect(pub.status).toBe(201);
    const { releaseId, suffix } = pub.json as { releaseId: string; suffix: string };
    const store = createObjectStore(loadConfig(childEnv(dataDir, port)).s3);
    const bundleObjects = async () =>
      ((await store.client.send(new ListObjectsV2Command({ Bucket: store.bucket, Prefix: `releases/${releaseId}/bundle/` }))).Contents ?? []).map((o) => o.Key);
    try {
      const visitor = httpClient(`http://127.0.0.1:${port}`);
      const job = await until('the bundle job to run', 20_000, () => server.jobs.find((j) => j.kind === 'build-bundle' && j.state === 'running'));
      // While it is being built, neither the store nor the API shows a bundle.
      expect(await bundleObjects()).toEqual([]);
      expect((await visitor.get(`/api/releases/${suffix}/bundle`)).status).toBe(409);
      await server.kill();
      // The multipart upload of the killed build was never completed: no object under the key.
      expect(await bundleObjects()).toEqual([]);

      server = startChild(childEnv(dataDir, port));
      await server.ready();
      await until('the bundle', 40_000, async () => (await visitor.get(`/api/releases/${suffix}/access`)).json.bundleReady);
      expect(await bundleObjects()).toEqual([`releases/${releaseId}/bundle/${suffix}.zip`]);
      const res = await visitor.get(`/api/releases/${suffix}/bundle`);
      expect(res.status).toBe(302);
      const zip = await readZip(Buffer.from(await (await fetch(res.headers.get('location')!)).arrayBuffer()));
      expect(zip.get(`${suffix}/data/trajectories/big-swarm.csv`)!.equals(big)).toBe(true);
      const manifest = zip.get(`${suffix}/manifest-sha256.txt`)!.toString('utf8').trim().split('\n').map((l) => l.split(/\s+/));
      for (const [digest, p] of manifest) expect(sha(zip.get(`${suffix}/${p}`)!), p).toBe(digest);
      await server.stop();
      const jobs = await withDatabase(dataDir, async (db) => rowsOf(await db.execute(sql`select id, state, attempts from job where kind = 'build-bundle'`)));
      expect(jobs).toEqual([{ id: job.id, state: 'done', attempts: 2 }]);
    } finally {
      store.close();
    }
  }, 90_000);
});

describe('the object store unreachable', () => {
  let storage: ObjectStorageFake;
  let storePort: number;
  let storeDir: string;
  let app: TestApp;
  let depositor: HttpClient;
  let curator: HttpClient;
  const storeDown = () => storage.close();
  const storeUp = async () => {
    storage = await startObjectStorage({ port: storePort, directory: storeDir, bucket: 'cohesia' });
  };
  const query = async <T>(q: ReturnType<typeof sql>) => rowsOf<T>(await app.database.db.execute(q));
  // Jobs retry after a backoff; this waits it out (the queue's own delay, not shortened) and runs what is due.
  const drainWhenDue = async (jobId: string) => {
    const [row] = await query<{ run_after: string }>(sql`select run_after::text from job where id = ${jobId}`);
    await sleep(Math.max(0, new Date(row.run_after).getTime() - Date.now()) + 50);
    await app.jobs.drain(app.handlers);
  };

  beforeAll(async () => {
    storeDir = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-faults-s3-'));
    storePort = await freePort();
    await storeUp();
    // Jobs are driven by hand, so each attempt happens exactly while the store is down or up.
    // The in-database queue on both engines: the test reads its job rows.
    app = await startTestApp({ env: { S3_ENDPOINT: storage.url, JOB_QUEUE: 'database' }, workers: false });
    depositor = await signInDemo(app, 'mina.throssel@fenmoor.example');
    curator = await signInDemo(app, 'rafael.quist@fenmoor.example');
  });
  afterAll(async () => {
    await app?.close();
    await storage?.close().catch(() => {});
    if (storeDir) fs.rmSync(storeDir, { recursive: true, force: true });
  });

  async function newDraft(title: string) {
    const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title, summary: '' })).json;
    await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title }) });
    return draftId as string;
  }

  it('answers 503 in the error shape when an upload is started, and reserves no space', async () => {
    const draftId = await newDraft('Store down at start');
    await storeDown();
    try {
      const res = await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/uploads`, { fileName: 'swarm.csv', size: 1000, mediaType: 'text/csv', role: 'trajectories' });
      expect(res.status).toBe(503);
      expect(res.json).toEqual({ message: expect.stringMatching(/file storage is unreachable.*try again/i), code: 'storage_unreachable', requestId: expect.any(String) });
      expect((await depositor.get(`/api/labs/${LAB}/drafts/${draftId}`)).json.files).toEqual([]);
      expect(await query(sql`select id from storage_reservation where status = 'pending'`)).toEqual([]);
    } finally {
      await storeUp();
    }
  });

  it('answers 503 when an upload is completed, keeps it unverified, and completes it once the store is back', async () => {
    const draftId = await newDraft('Store down at completion');
    const bytes = fixture('trapped-langevin-swarm.csv.gz');
    const start = await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/uploads`, { fileName: 'swarm.csv.gz', size: bytes.length, mediaType: 'application/gzip', role: 'trajectories' });
    expect(start.status).toBe(201);
    const { fileId, parts } = start.json as { fileId: string; parts: Array<{ partNumber: number; url: string }> };
    const put = await fetch(parts[0].url, { method: 'PUT', body: new Uint8Array(bytes) });
    const done = [{ partNumber: 1, etag: put.headers.get('etag')! }];

    await storeDown();
    const refused = await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/uploads/${fileId}/complete`, { parts: done });
    expect(refused.status).toBe(503);
    expect(refused.json.code).toBe('storage_unreachable');
    const [file] = (await depositor.get(`/api/labs/${LAB}/drafts/${draftId}`)).json.files;
    expect(file).toMatchObject({ state: 'uploading', sha256: null });

    await storeUp();
    expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/uploads/${fileId}/complete`, { parts: done })).status).toBe(200);
    await app.jobs.drain(app.handlers);
    expect(await waitForFile(depositor, LAB, draftId, fileId)).toMatchObject({ state: 'ready', sha256: sha(bytes) });
  });

  it('retries ingest and bundle jobs with backoff while the store is down, records nothing, and finishes once it is back', async () => {
    const draftId = await newDraft('Store down while working');
    const bytes = fixture('trapped-langevin-swarm.csv.gz');
    // Uploaded while the store is up; the ingest job has not run yet (no worker in this app).
    const fileId = await uploadFile(depositor, LAB, draftId, 'swarm.csv.gz', bytes);
    const [ingest] = await query<{ id: string }>(sql`select id from job where kind = 'ingest-file' and payload->>'fileId' = ${fileId}`);

    await storeDown();
    await app.jobs.drain(app.handlers);
    const [failed] = await query<{ state: string; attempts: number; last_error: string; later: boolean }>(
      sql`select state, attempts, last_error, run_after > now() as later from job where id = ${ingest.id}`,
    );
    // Waiting for the store does not use up one of the job's attempts.
    expect(failed).toMatchObject({ state: 'queued', attempts: 0, later: true });
    expect(failed.last_error).toMatch(/ECONNREFUSED/);
    const [file] = await query<{ sha256: string | null; state: string }>(sql`select sha256, state from draft_file where id = ${fileId}`);
    expect(file.sha256).toBeNull();
    expect(file.state).not.toBe('ready');
    expect(await query(sql`select id from stored_object where object_key = (select object_key from draft_file where id = ${fileId})`)).toEqual([]);

    await storeUp();
    await drainWhenDue(ingest.id);
    expect(await waitForFile(depositor, LAB, draftId, fileId)).toMatchObject({ state: 'ready', sha256: sha(bytes) });

    expect((await depositor.post(`/api/labs/${LAB}/drafts/${draftId}/submit`)).status).toBe(200);
    const pub = await curator.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {});
    expect(pub.status).toBe(201);
    const { releaseId, suffix } = pub.json as { releaseId: string; suffix: string };
    const [bundle] = await query<{ id: string }>(sql`select id from job where kind = 'build-bundle' and payload->>'releaseId' = ${releaseId}`);

    await storeDown();
    await app.jobs.drain(app.handlers);
    expect((await query<{ state: string; attempts: number }>(sql`select state, attempts, phase from job where id = ${bundle.id}`))[0]).toEqual({ state: 'queued', attempts: 0, phase: 'waiting for storage' });
    expect((await query(sql`select bundle_key from release where id = ${releaseId}`))[0]).toEqual({ bundle_key: null });
    const visitor = httpClient(app.url);
    expect((await visitor.get(`/api/releases/${suffix}/bundle`)).status).toBe(409);

    await storeUp();
    const store = createObjectStore(loadConfig({ S3_ENDPOINT: storage.url }).s3);
    const listed = async () => ((await store.client.send(new ListObjectsV2Command({ Bucket: 'cohesia', Prefix: `releases/${releaseId}/` }))).Contents ?? []).map((o) => o.Key);
    try {
      // The failed attempt left no object behind.
      expect(await listed()).toEqual([]);
      await drainWhenDue(bundle.id);
      expect((await visitor.get(`/api/releases/${suffix}/access`)).json.bundleReady).toBe(true);
      expect(await listed()).toEqual([`releases/${releaseId}/bundle/${suffix}.zip`]);
    } finally {
      store.close();
    }
  }, 60_000);
});

// A real full disk: a small tmpfs (needs root or CAP_SYS_ADMIN, as in the CI container); skipped where it cannot be mounted.
function tryMountTmpfs(): string | null {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-full-disk-'));
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=96m', 'tmpfs', dir], { stdio: 'ignore' });
    return dir;
  } catch {
    fs.rmSync(dir, { recursive: true, force: true });
    return null;
  }
}
const fullDisk = inject('pgAdminUrl') ? null : tryMountTmpfs();

describe.skipIf(!fullDisk)('the embedded database disk full', () => {
  let app: Running;
  afterAll(async () => {
    await app?.close();
    if (fullDisk) {
      execFileSync('umount', ['-l', fullDisk]);
      fs.rmSync(fullDisk, { recursive: true, force: true });
    }
  });

  it('refuses writes with 503 and changes nothing, keeps reads working, and writes again once space is freed', async () => {
    const dataDir = path.join(fullDisk!, 'data');
    fs.mkdirSync(dataDir); // PGlite does not create parents
    const client = await PGlite.create({ dataDir: path.join(dataDir, 'pglite'), loadDataDir: await fs.openAsBlob(inject('templatePath')) });
    await client.close();
    const port = await freePort();
    app = await startCohesia({ config: loadConfig({ ...childEnv(dataDir, port), LOG_LEVEL: 'silent' }), client: 'none', log: pino({ level: 'silent' }) });
    const depositor = await signInDemo({ url: app.url } as TestApp, 'mina.throssel@fenmoor.example');
    const before = (await depositor.get(`/api/labs/${LAB}`)).json;

    // Fill what is left of the disk (dd stops with "No space left on device").
    const filler = path.join(fullDisk!, 'filler');
    try {
      execFileSync('dd', ['if=/dev/zero', `of=${filler}`, 'bs=1M', 'count=200'], { stdio: 'ignore' });
    } catch {
      // expected: the disk is full
    }
    // A write that fits in a page already allocated still succeeds; keep writing until one needs new space.
    let refused: Awaited<ReturnType<HttpClient['post']>> | undefined;
    let n = 0;
    for (; n < 400; n++) {
      const res = await depositor.post(`/api/labs/${LAB}/datasets`, { title: `Written to a full disk ${n}`, summary: 'x'.repeat(1000) });
      if (res.status !== 201) {
        refused = res;
        break;
      }
    }
    expect(refused?.status, JSON.stringify(refused?.json)).toBe(503);
    expect(refused!.json).toEqual({ message: expect.stringMatching(/database disk is full\. Nothing was changed and reading still works/), code: 'database_full', requestId: expect.any(String) });
    expect(refused!.headers.get('retry-after')).toBe('60');
    // Reads go on: the lab page and the signed-in session still answer.
    expect((await depositor.get(`/api/labs/${LAB}`)).json).toEqual(before);
    // The refused write left nothing half-done.
    const datasets = await depositor.get(`/api/labs/${LAB}/datasets`);
    expect(datasets.status).toBe(200);
    expect(JSON.stringify(datasets.json)).not.toContain(`Written to a full disk ${n}"`);

    fs.rmSync(filler);
    const accepted = await depositor.post(`/api/labs/${LAB}/datasets`, { title: 'Written after space was freed', summary: '' });
    expect(accepted.status).toBe(201);
    const { draftId } = accepted.json as { draftId: string };
    expect((await depositor.get(`/api/labs/${LAB}/drafts/${draftId}`)).status).toBe(200);
  }, 60_000);
});
