import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawn, type ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { startTestApp, type TestApp } from '../support/test-app';
import { signInDemo } from '../support/accounts';
import { fixture, uploadFile, validMetadata, waitForFile } from '../support/depositing';
import { createTestDatabase } from '../support/postgres';
import { generateBenchFile, gzipFile } from '../../scripts/bench/generate';

// The production layout in small: two stateless API instances (JOB_WORKER=off) and two
// worker processes (`npm run worker`) against one PostgreSQL server and one object store.
// Only when the suite runs against a PostgreSQL server (CI's second pass).
const pgAdminUrl = inject('pgAdminUrl');
const pgTemplate = inject('pgTemplate');
const LAB = 'fenmoor-swarm-ecology';
const AUTH_SECRET = 'test-secret-that-is-long-enough-0123456789';

type Worker = { child: ChildProcess; output: () => string; exited: Promise<number | null> };

function startWorker(env: Record<string, string>): Worker {
  let out = '';
  const child = spawn(process.execPath, ['--openssl-legacy-provider', '--import', 'tsx', 'server/worker.ts'], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child.stdout!.on('data', (d) => (out += d));
  child.stderr!.on('data', (d) => (out += d));
  const exited = new Promise<number | null>((r) => child.on('exit', (code) => r(code)));
  return { child, output: () => out, exited };
}

async function waitFor(check: () => boolean | Promise<boolean>, ms: number, what: string) {
  const until = Date.now() + ms;
  while (!(await check())) {
    if (Date.now() > until) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe.skipIf(!pgAdminUrl)('scale-out on a PostgreSQL server', () => {
  let a: TestApp;
  let b: TestApp;
  const workers: Worker[] = [];
  const killed = new Set<Worker>();

  beforeAll(async () => {
    const databaseUrl = await createTestDatabase(pgAdminUrl!, pgTemplate!, `${pgTemplate}_scaleout`);
    const stripeKey = `sk_test_scaleout_${Date.now().toString(36)}`;
    // Short job timeout (every process of a deployment shares it: the sender stamps it on the job),
    // so a job whose worker was killed is handed on within seconds.
    const shared = { DATABASE_URL: databaseUrl, STRIPE_SECRET_KEY: stripeKey, JOB_TIMEOUT_SECONDS: '6' };
    a = await startTestApp({ workers: false, env: shared });
    // Behind one load balancer both instances answer for the same public address.
    b = await startTestApp({ workers: false, env: { ...shared, PUBLIC_BASE_URL: a.url } });
    const workerEnv = {
      NODE_ENV: 'test',
      LOG_LEVEL: 'warn',
      DATA_DIR: fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-worker-')),
      DATABASE_URL: databaseUrl,
      PUBLIC_BASE_URL: a.url,
      FAKES: 'off',
      DEMO_RELEASES: 'false',
      S3_ENDPOINT: inject('s3Endpoint'),
      SMTP_URL: inject('smtpUrl'),
      MAIL_CAPTURE_URL: inject('mailCaptureUrl'),
      DOI_REGISTRY_URL: inject('identifierRegistryUrl'),
      DOI_REGISTRY_PASSWORD: 'registry-test-password',
      STRIPE_API_URL: inject('paymentsUrl'),
      STRIPE_SECRET_KEY: stripeKey,
      BETTER_AUTH_SECRET: AUTH_SECRET,
      JOB_TIMEOUT_SECONDS: '6',
    };
    workers.push(startWorker(workerEnv), startWorker(workerEnv));
    await Promise.all(workers.map((w, i) => waitFor(() => w.output().includes('is taking jobs'), 45_000, `worker ${i + 1} to start:\n${w.output()}`)));
  }, 120_000);

  afterAll(async () => {
    const live = workers.filter((w) => !killed.has(w));
    for (const w of live) w.child.kill('SIGTERM');
    // Workers finish their current job and exit cleanly on SIGTERM.
    const codes = await Promise.all(live.map((w) => w.exited));
    await b?.close();
    await a?.close();
    expect(codes).toEqual(live.map(() => 0));
  });

  it('a session made on one instance works on the other, and every job is done exactly once by the workers', async () => {
    const depositorA = await signInDemo(a, 'mina.throssel@fenmoor.example');
    const depositorB = depositorA.via(b.url);
    expect((await depositorB.get('/api/me')).status).toBe(200);
    const curatorB = (await signInDemo(a, 'rafael.quist@fenmoor.example')).via(b.url);

    // Created on B, files uploaded through both instances.
    const created = await depositorB.post(`/api/labs/${LAB}/datasets`, { title: 'Scale-out swarm', summary: 'Two instances, two workers.' });
    expect(created.status).toBe(201);
    const { draftId } = created.json;
    await depositorA.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: { title: 'Scale-out swarm', frameRate: 100, units: 'm', dimension: 3 } });
    const names = ['trapped-langevin-swarm.csv.gz', 'vicsek-flock-3d.csv.gz', 'trapped-langevin-swarm.csv.gz', 'vicsek-flock-3d.csv.gz'];
    const fileIds: string[] = [];
    for (const [i, name] of names.entries()) fileIds.push(await uploadFile(i % 2 ? depositorB : depositorA, LAB, draftId, `part-${i}-${name}`, fixture(name)));
    for (const [i, id] of fileIds.entries()) {
      const file = await waitForFile(i % 2 ? depositorA : depositorB, LAB, draftId, id, 60_000);
      expect(file.state, names[i]).toBe('ready');
    }

    // Publishing queues the identifier registration and the bundle.
    expect((await depositorA.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: validMetadata({ title: 'Scale-out swarm' }) })).status).toBe(200);
    const submitted = await depositorB.post(`/api/labs/${LAB}/drafts/${draftId}/submit`);
    expect(submitted.status, JSON.stringify(submitted.json)).toBe(200);
    const published = await curatorB.post(`/api/labs/${LAB}/drafts/${draftId}/publish`, {});
    expect(published.status, JSON.stringify(published.json)).toBe(201);
    const suffix = published.json.suffix as string;
    await waitFor(async () => (await depositorA.get(`/api/releases/${suffix}/bundle`)).status === 302, 60_000, 'the bundle');

    // Every job the instances queued ran once: one attempt, done; no job left waiting but the hourly embargo check.
    await waitFor(async () => {
      const res = await a.database.db.execute(sql`select count(*)::int as n from job where state <> 'done' and kind <> 'lift-embargoes'`);
      return (res as unknown as { rows: Array<{ n: number }> }).rows[0].n === 0;
    }, 30_000, 'all jobs to finish');
    const jobs = (await a.database.db.execute(sql`select kind, state, attempts from job where kind <> 'lift-embargoes' order by kind`)) as unknown as {
      rows: Array<{ kind: string; state: string; attempts: number }>;
    };
    const kinds = jobs.rows.map((r) => r.kind);
    expect(kinds.filter((k) => k === 'ingest-file')).toHaveLength(4);
    expect(kinds.filter((k) => k === 'build-bundle')).toHaveLength(1);
    expect(kinds.filter((k) => k === 'register-identifier')).toHaveLength(1);
    expect(kinds).toContain('send-mail');
    expect(jobs.rows.every((r) => r.state === 'done' && r.attempts === 1), JSON.stringify(jobs.rows)).toBe(true);
    // pg-boss agrees: each delivery completed once.
    const boss = (await a.database.db.execute(sql`select name, count(*)::int as n from pgboss.job where state = 'completed' and name <> 'lift-embargoes' group by name`)) as unknown as {
      rows: Array<{ name: string; n: number }>;
    };
    expect(Object.fromEntries(boss.rows.map((r) => [r.name, r.n]))).toMatchObject({ 'ingest-file': 4, 'build-bundle': 1, 'register-identifier': 1 });
    // Each queued mail was sent once.
    const mails = (await a.database.db.execute(sql`select state, attempts from outbox_mail`)) as unknown as { rows: Array<{ state: string; attempts: number }> };
    expect(mails.rows.length).toBeGreaterThan(0);
    expect(mails.rows.every((m) => m.state === 'sent' && m.attempts === 1)).toBe(true);
  });

  it('a worker killed (SIGKILL) mid-ingest: the other worker takes the job over and it completes once', async () => {
    // A file big enough that its ingest runs for a second or more (1.5 M rows, gzip).
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-big-'));
    await generateBenchFile(path.join(dir, 'big.csv'), 1_500_000);
    await gzipFile(path.join(dir, 'big.csv'), path.join(dir, 'big.csv.gz'));
    const depositor = await signInDemo(a, 'mina.throssel@fenmoor.example');
    const { draftId } = (await depositor.post(`/api/labs/${LAB}/datasets`, { title: 'Killed worker', summary: '' })).json;
    await depositor.put(`/api/labs/${LAB}/drafts/${draftId}/metadata`, { metadata: { title: 'Killed worker', frameRate: 100, units: 'm', dimension: 3 } });
    const fileId = await uploadFile(depositor, LAB, draftId, 'big.csv.gz', fs.readFileSync(path.join(dir, 'big.csv.gz')));

    // Kill whichever worker holds the ingest (its pid starts the lock holder's id) while it runs.
    const holder = await (async () => {
      const end = Date.now() + 30_000;
      for (;;) {
        const res = (await a.database.db.execute(sql`select locked_by from job where kind = 'ingest-file' and payload->>'fileId' = ${fileId} and state = 'running'`)) as unknown as {
          rows: Array<{ locked_by: string }>;
        };
        if (res.rows[0]?.locked_by) return res.rows[0].locked_by;
        if (Date.now() > end) throw new Error('the ingest never started');
        await new Promise((r) => setTimeout(r, 25));
      }
    })();
    const victim = workers.find((w) => holder.startsWith(`${w.child.pid}-`))!;
    expect(victim).toBeTruthy();
    killed.add(victim);
    victim.child.kill('SIGKILL');
    expect(await victim.exited).toBeNull();

    const file = await waitForFile(depositor, LAB, draftId, fileId, 60_000);
    expect(file.state).toBe('ready');
    const rows = (await a.database.db.execute(sql`select state, attempts, locked_by from job where payload->>'fileId' = ${fileId}`)) as unknown as {
      rows: Array<{ state: string; attempts: number }>;
    };
    // Two attempts: the killed one and the one that finished; one result.
    expect(rows.rows).toMatchObject([{ state: 'done', attempts: 2 }]);
    fs.rmSync(dir, { recursive: true, force: true });
  }, 180_000);
});
