import fs from 'node:fs';
import path from 'node:path';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import express, { type RequestHandler } from 'express';
import pino, { type Logger } from 'pino';
import type { Config } from './config';
import { openPglite, openPostgres, type Database } from './db/client';
import { lockDataDir } from './db/data-dir-lock';
import { createAuth, type Auth } from './auth/create-auth';
import { createMailer } from './mail/mailer';
import { createOutbox, SEND_MAIL_JOB } from './mail/outbox';
import { createObjectStore } from './storage/object-store';
import { createApp } from './app';
import type { Route } from './routes/route';
import { createJobQueue, type JobHandler, type JobQueue } from './jobs/job-queue';
import { createPgBossQueue } from './jobs/pg-boss-queue';
import { createDepositingModule, EMBARGO_JOB, type DepositingModule } from './depositing-module';
import { seedDemo, type DemoAccount } from './seed/demo';
import { seedDemoReleases } from './seed/demo-releases';
import { startFakes, type Fakes } from '../docker-free-fakes';

export type ClientMode = 'dist' | 'vite' | 'none';

export type StartOptions = {
  config: Config;
  client: ClientMode;
  // Start the local stand-ins in this process (npm start); tests start them once for all files.
  startFakes?: boolean;
  // A migrated PGlite image to start from (tests); otherwise the configured database.
  template?: Blob;
  log?: Logger;
  // Run background jobs in this process (default); false for an API-only instance or a test that drives jobs itself.
  workers?: boolean;
  // Answer HTTP (default); false for a worker-only process.
  serve?: boolean;
};

export type Running = {
  url: string;
  port: number;
  auth: Auth;
  database: Database;
  demoAccounts: DemoAccount[] | null;
  routes: Route[];
  jobs: JobQueue;
  depositing: DepositingModule;
  // Every job kind this process can run (tests drain them by hand).
  handlers: Record<string, JobHandler>;
  close(): Promise<void>;
};

const root = path.resolve(new URL('..', import.meta.url).pathname);

async function clientHandlers(mode: ClientMode, onClose: Array<() => Promise<void>>): Promise<RequestHandler[]> {
  if (mode === 'none') return [];
  if (mode === 'vite') {
    const { createServer } = await import('vite');
    const vite = await createServer({ root, server: { middlewareMode: true }, appType: 'spa' });
    onClose.push(() => vite.close());
    return [vite.middlewares];
  }
  const dist = path.join(root, 'dist');
  if (!fs.existsSync(path.join(dist, 'index.html'))) {
    throw new Error('The client is not built: run `npx vite build` (npm start does it for you).');
  }
  const index = path.join(dist, 'index.html');
  return [
    express.static(dist, { index: false, maxAge: '1h' }),
    // Client-side routes: every other GET that wants HTML gets the app shell.
    (req, res, next) => (req.method === 'GET' && req.accepts('html') ? res.sendFile(index) : next()),
  ];
}

/** Opens the data store, starts the fakes if asked, seeds demo data on an empty store, and listens. */
export async function startCohesia(opts: StartOptions): Promise<Running> {
  const { config } = opts;
  const log = opts.log ?? pino({ level: config.logLevel });
  const closers: Array<() => Promise<void>> = [];
  const close = async () => {
    // Each part gets a bounded time: a connection the database dropped must not keep the process from stopping.
    for (const c of closers.reverse()) {
      let timer: NodeJS.Timeout | undefined;
      const limit = new Promise<void>((r) => (timer = setTimeout(() => (log.warn('a part did not close within 10 s; going on'), r()), 10_000)));
      await Promise.race([c().catch((e) => log.warn({ err: e }, 'while closing')), limit]);
      clearTimeout(timer);
    }
  };
  try {
    let database: Database;
    if (opts.template) {
      database = await openPglite({ template: opts.template });
    } else if (config.database.kind === 'pglite') {
      const lock = lockDataDir(config.dataDir);
      closers.push(async () => lock.release());
      database = await openPglite({ dir: config.database.dir });
    } else {
      database = await openPostgres(config.database.url);
    }
    closers.push(() => database.close());

    let fakes: Fakes | undefined;
    if (opts.startFakes && config.fakes) {
      fakes = await startFakes(config);
      closers.push(() => fakes!.close());
    }

    // Several processes may start at once against one server: one migrates and seeds, the others wait.
    const startup = await database.startupLock();
    closers.push(async () => startup.release());
    await database.migrate();
    const transport = createMailer(config.mail.smtpUrl, config.mail.from, log);
    closers.push(async () => transport.close());
    const store = createObjectStore(config.s3);
    closers.push(async () => store.close());
    const jobs =
      config.jobQueue.kind === 'pg-boss' && config.database.kind === 'postgres'
        ? createPgBossQueue({ db: database.db, url: config.database.url, log: log.child({ area: 'jobs' }), timeoutSeconds: config.jobQueue.timeoutSeconds })
        : createJobQueue({ db: database.db, log: log.child({ area: 'jobs' }) });
    closers.push(() => jobs.stop());
    // All mail, better-auth's included, goes through the outbox.
    const outbox = createOutbox({ db: database.db, jobs, transport, log: log.child({ area: 'outbox' }) });
    const mailer = { ...transport, send: outbox.mailer.send };
    const auth = createAuth({ db: database.db, config, mailer });

    const demoAccounts = config.demoSeed ? await seedDemo({ db: database.db, auth }) : null;

    if (config.demoSeed && config.demoReleases) await seedDemoReleases({ config, database, store, log });
    const depositing = createDepositingModule({ config, database, store, log, mailer, jobs });
    const handlers = { ...depositing.handlers, [SEND_MAIL_JOB]: outbox.handler };
    await jobs.prepare(Object.keys(handlers));
    if (opts.workers !== false) {
      // One process owns an embedded data folder, so jobs it finds running were cut off by a crash.
      if (database.kind === 'pglite') await jobs.requeueOrphans();
      if (!(await jobs.hasQueued(EMBARGO_JOB))) await jobs.enqueue(EMBARGO_JOB, {});
    }
    startup.release();
    if (opts.workers !== false) {
      jobs.start(handlers, (row, e) => (row.kind === SEND_MAIL_JOB ? outbox.onFinalFailure(row, e) : depositing.onFinalFailure(row, e)));
    }
    if (opts.serve === false) {
      return { url: '', port: 0, auth, database, demoAccounts, routes: [], jobs, depositing, handlers, close };
    }

    const client = await clientHandlers(opts.client, closers);
    const app = createApp({ config, database, auth, store, log, client, mailer, depositing, devClient: opts.client === 'vite' });
    const server = http.createServer(app);
    await new Promise<void>((resolve, reject) => {
      server.once('error', reject);
      server.listen(config.port, config.host, () => resolve());
    });
    closers.push(
      () =>
        new Promise<void>((resolve) => {
          server.close(() => resolve());
          server.closeAllConnections();
        }),
    );
    const port = (server.address() as AddressInfo).port;
    return { url: `http://${config.host}:${port}`, port, auth, database, demoAccounts, routes: app.locals.routes as Route[], jobs, depositing, handlers, close };
  } catch (e) {
    await close();
    throw e;
  }
}
