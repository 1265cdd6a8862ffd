import type { Logger } from 'pino';
import type { Config } from './config';
import type { Database } from './db/client';
import type { ObjectStore } from './storage/object-store';
import type { Mailer } from './mail/mailer';
import type { JobHandler, JobQueue, JobRow } from './jobs/job-queue';
import { createDepositingRepository } from './repositories/depositing.repository';
import { createLabsRepository } from './repositories/labs.repository';
import { createMultipartUploads } from './storage/multipart-uploads';
import { createDepositingService, INGEST_JOB, REGISTER_JOB } from './services/depositing.service';
import { createIngestJob, createRegisterJob } from './services/ingest-jobs';
import { createQuotaService } from './services/quota.service';
import { createHttpRegistrar } from './identifiers/registration';
import { depositingRoutes } from './routes/depositing.routes';
import { createReleasesService } from './services/releases.service';
import { createReleaseReads } from './services/release-reads';
import { doiResolver, releasesRoutes } from './routes/releases.routes';
import { BUNDLE_JOB, createDownloadsService } from './services/downloads.service';
import { createAccessService } from './services/access.service';
import { createAccessRepository } from './repositories/access.repository';
import { accessRoutes } from './routes/access.routes';

export const EMBARGO_JOB = 'lift-embargoes';
const EMBARGO_CHECK_MS = 60 * 60 * 1000;

export type DepositingDeps = { config: Config; database: Database; store: ObjectStore; log: Logger; mailer: Pick<Mailer, 'send'>; jobs: JobQueue };

/** Wires datasets, drafts, uploads, ingest and release jobs. */
export function createDepositingModule({ config, database, store, log, mailer, jobs }: DepositingDeps) {
  const repo = createDepositingRepository(database.db);
  const reads = createReleaseReads(repo);
  const uploads = createMultipartUploads(store);
  const quota = createQuotaService({
    db: database.db,
    freeTierBytes: config.payments.freeTierBytes,
    graceDays: config.payments.graceDays,
    publicBaseUrl: config.publicBaseUrl,
  });
  const service = createDepositingService({
    repo,
    labs: createLabsRepository(database.db),
    uploads,
    store,
    quota,
    jobs,
    mailer,
    log: log.child({ area: 'depositing' }),
    doiPrefix: config.doiPrefix,
    publicBaseUrl: config.publicBaseUrl,
  });
  const ingest = createIngestJob({ repo, store, uploads, quota, log: log.child({ area: 'ingest' }) });
  const registrar = createHttpRegistrar({ baseUrl: config.identifiers.registryUrl, user: config.identifiers.user, password: config.identifiers.password });
  const accessService = createAccessService({
    access: createAccessRepository(database.db),
    repo,
    labs: createLabsRepository(database.db),
    mailer,
    publicBaseUrl: config.publicBaseUrl,
    log: log.child({ area: 'access' }),
  });
  const downloads = createDownloadsService({
    grants: accessService,
    repo,
    reads,
    labs: createLabsRepository(database.db),
    uploads,
    store,
    doiPrefix: config.doiPrefix,
    publicBaseUrl: config.publicBaseUrl,
    log: log.child({ area: 'downloads' }),
  });
  const handlers: Record<string, JobHandler> = {
    // Recurring: checks every hour, then schedules its next run.
    [EMBARGO_JOB]: async () => {
      await accessService.liftEmbargoes();
      if (!(await jobs.hasQueued(EMBARGO_JOB))) await jobs.enqueue(EMBARGO_JOB, {}, { runAfter: new Date(Date.now() + EMBARGO_CHECK_MS) });
    },
    [BUNDLE_JOB]: downloads.bundleJob,
    [INGEST_JOB]: ingest.handler,
    [REGISTER_JOB]: createRegisterJob({ repo, registrar, doiPrefix: config.doiPrefix, publicBaseUrl: config.publicBaseUrl }),
  };
  const onFinalFailure = async (row: JobRow, e: Error) => {
    if (row.kind === INGEST_JOB) await ingest.onFinalFailure(row, e);
    else log.error({ jobId: row.id, kind: row.kind, err: e }, 'job gave up');
  };
  const releases = createReleasesService({ repo, reads, labs: createLabsRepository(database.db), doiPrefix: config.doiPrefix, publicBaseUrl: config.publicBaseUrl });
  return { service, releases, downloads, access: accessService, routes: [...depositingRoutes(service), ...releasesRoutes(releases, downloads), ...accessRoutes(accessService)], doiResolver: doiResolver(releases), handlers, onFinalFailure };
}

export type DepositingModule = ReturnType<typeof createDepositingModule>;
