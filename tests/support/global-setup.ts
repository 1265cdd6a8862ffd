import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import PgBoss from 'pg-boss';
import { openPglite, openPostgres } from '../../server/db/client';
import { adminQuery, databaseUrl, dropTestDatabases } from './postgres';
import { createAuth } from '../../server/auth/create-auth';
import { seedDemo } from '../../server/seed/demo';
import { startObjectStorage } from '../../docker-free-fakes/object-storage/server';
import { startMailCapture } from '../../docker-free-fakes/mail-capture/server';
import { startIdentifierRegistry } from '../../docker-free-fakes/identifier-registry/server';
import { startPaymentsStandIn } from '../../docker-free-fakes/payments/server';

declare module 'vitest' {
  export interface ProvidedContext {
    s3Endpoint: string;
    smtpUrl: string;
    mailCaptureUrl: string;
    identifierRegistryUrl: string;
    paymentsUrl: string;
    templatePath: string;
    workDir: string;
    // Set when the suite runs against a PostgreSQL server (COHESIA_TEST_DATABASE_URL).
    pgAdminUrl: string | null;
    pgTemplate: string | null;
  }
}

/**
 * Once per run: the real local fakes on free ports, and a migrated, demo-seeded
 * PGlite image that every test app loads in well under a second.
 */
export default async function setup(project: TestProject) {
  const workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'cohesia-test-'));
  const storage = await startObjectStorage({ port: 0, directory: path.join(workDir, 's3'), bucket: 'cohesia' });
  const mail = await startMailCapture({ smtpPort: 0, httpPort: 0, directory: path.join(workDir, 'mail') });
  const identifiers = await startIdentifierRegistry({ port: 0, file: path.join(workDir, 'identifiers.json'), user: 'cohesia', password: 'registry-test-password' });
  // One payment stand-in for the run; each test app is its own account (its own secret key and webhook endpoint).
  const payments = await startPaymentsStandIn({ port: 0, directory: path.join(workDir, 'payments'), retryDelaysMs: [200, 500, 1000] });

  // The same migrated, seeded start for every test app: a PGlite image, or a
  // template database on the PostgreSQL server that each app's database is copied from.
  const pgAdminUrl = process.env.COHESIA_TEST_DATABASE_URL || null;
  const pgTemplate = pgAdminUrl ? `cohesia_tpl_${process.pid}` : null;
  if (pgAdminUrl && pgTemplate) {
    await dropTestDatabases(pgAdminUrl, pgTemplate);
    await adminQuery(pgAdminUrl, `create database ${pgTemplate}`);
  }
  const database = pgAdminUrl && pgTemplate ? await openPostgres(databaseUrl(pgAdminUrl, pgTemplate)) : await openPglite({});
  await database.migrate();
  const auth = createAuth({
    db: database.db,
    config: { publicBaseUrl: 'http://127.0.0.1', authSecret: 'x'.repeat(40), env: 'test' },
    mailer: { send: async () => {} },
  });
  await seedDemo({ db: database.db, auth });
  if (pgAdminUrl && pgTemplate) {
    // pg-boss installs its own schema on first start; doing it once here saves every test app that second.
    const boss = new PgBoss({ connectionString: databaseUrl(pgAdminUrl, pgTemplate), schema: 'pgboss', supervise: false, schedule: false });
    await boss.start();
    await boss.stop({ graceful: false, wait: true });
  }
  const templatePath = path.join(workDir, 'template.tar');
  if (database.dumpDataDir) {
    const blob = await database.dumpDataDir();
    fs.writeFileSync(templatePath, Buffer.from(await blob.arrayBuffer()));
  }
  await database.close();

  project.provide('s3Endpoint', storage.url);
  project.provide('smtpUrl', `smtp://127.0.0.1:${mail.smtpPort}`);
  project.provide('mailCaptureUrl', mail.httpUrl);
  project.provide('identifierRegistryUrl', identifiers.url);
  project.provide('paymentsUrl', payments.url);
  project.provide('templatePath', templatePath);
  project.provide('workDir', workDir);
  project.provide('pgAdminUrl', pgAdminUrl);
  project.provide('pgTemplate', pgTemplate);

  return async () => {
    if (pgAdminUrl && pgTemplate) await dropTestDatabases(pgAdminUrl, pgTemplate);
    await payments.close();
    await identifiers.close();
    await mail.close();
    await storage.close();
    fs.rmSync(workDir, { recursive: true, force: true });
  };
}
