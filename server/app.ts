import express, { type RequestHandler } from 'express';
import { toNodeHandler } from 'better-auth/node';
import { pinoHttp } from 'pino-http';
import type { Logger } from 'pino';
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import type { Config } from './config';
import type { Database } from './db/client';
import type { Auth } from './auth/create-auth';
import type { ObjectStore } from './storage/object-store';
import { createAuthorize } from './middleware/authorize';
import { apiNotFound, errorHandler } from './middleware/error-handler';
import { createLabsRepository } from './repositories/labs.repository';
import { createUsersRepository } from './repositories/users.repository';
import { createLabsService } from './services/labs.service';
import { createProfileService } from './services/profile.service';
import { createAdminService } from './services/admin.service';
import { createMailboxService } from './services/mailbox.service';
import { labsRoutes } from './routes/labs.routes';
import { accountRoutes } from './routes/account.routes';
import { adminRoutes } from './routes/admin.routes';
import { backupRoutes } from './routes/backup.routes';
import { createBackupService } from './services/backup.service';
import { systemRoutes } from './routes/system.routes';
import type { Route } from './routes/route';
import { buildOpenApi } from './openapi';
import { createTokensRepository } from './repositories/tokens.repository';
import { createTokensService } from './services/tokens.service';
import { tokensRoutes } from './routes/tokens.routes';
import { METADATA_SCHEMA_VERSION, metadataSchema } from '../shared/metadata/validate-metadata';
import type { Mailer } from './mail/mailer';
import type { DepositingModule } from './depositing-module';
import { billingModule, billingRoutes, billingWebhookHandler, WEBHOOK_PATH } from './routes/billing.routes';
import { createHarvestingRepository } from './repositories/harvesting.repository';
import { createOaiService } from './services/oai.service';
import { oaiRoutes } from './routes/oai.routes';
import { createSitemapService } from './services/sitemap.service';
import { sitemapRoutes } from './routes/sitemap.routes';
import { createLabProfilesRepository } from './repositories/lab-profiles.repository';
import { createDepositingRepository } from './repositories/depositing.repository';
import { createLabProfilesService } from './services/lab-profiles.service';
import { labProfilesRoutes } from './routes/lab-profiles.routes';
import { releaseJsonLd } from './middleware/release-json-ld';
import { securityHeaders } from './middleware/security-headers';
import { sameOriginWrites } from './middleware/same-origin';
import { createRateLimits } from './middleware/rate-limits';
import { createRateLimitRepository } from './repositories/rate-limits.repository';
import { createAuditRepository } from './repositories/audit.repository';
import { createAuditService } from './services/audit.service';
import { auditRoutes } from './routes/audit.routes';
import { createCatalogueRepository } from './repositories/catalogue.repository';
import { createCatalogueService } from './services/catalogue.service';
import { catalogueRoutes } from './routes/catalogue.routes';
import { createComparisonsRepository } from './repositories/comparisons.repository';
import { createComparisonsService } from './services/comparisons.service';
import { comparisonsRoutes } from './routes/comparisons.routes';

export type AppDeps = {
  config: Config;
  database: Database;
  auth: Auth;
  store: ObjectStore;
  log: Logger;
  // Outgoing mail of the app's own notices (billing); better-auth has its own.
  mailer?: Mailer;
  // Datasets, drafts, uploads and releases (built with the job queue in runtime.ts).
  depositing?: DepositingModule;
  // Serves the client after the API: built files or Vite's middleware.
  client?: RequestHandler[];
  // Vite's dev middleware serves the client: its HMR needs a looser CSP.
  devClient?: boolean;
};

/** Builds every API route; exported so tests can walk the route table. */
export function buildRoutes({ config, database, auth, store, log, mailer, depositing }: AppDeps): Route[] {
  const labs = createLabsRepository(database.db);
  const users = createUsersRepository(database.db);
  return [
    ...systemRoutes({
      mailbox: createMailboxService({ captureUrl: config.mail.captureUrl }),
      info: { demo: config.fakes, doiPrefix: config.doiPrefix, mailbox: config.fakes },
      health: async () => {
        await database.db.execute(sql`select 1`);
        return { status: 'ok', database: database.kind, objectStore: (await store.reachable()) ? 'ok' : 'unreachable' };
      },
    }),
    ...accountRoutes(createProfileService({ users })),
    ...tokensRoutes(createTokensService({ tokens: createTokensRepository(database.db) })),
    ...labsRoutes(createLabsService({ auth, labs, audit: createAuditRepository(database.db) })),
    ...adminRoutes(createAdminService({ users, labs })),
    ...backupRoutes(createBackupService({ config, database, store, log })),
    ...auditRoutes(createAuditService({ audit: createAuditRepository(database.db) })),
    ...billingRoutes(billingModule({ config, database, log, mailer })),
    ...(depositing?.routes ?? []),
    ...catalogueRoutes(createCatalogueService({ repo: createCatalogueRepository(database.db) })),
    ...comparisonsRoutes(createComparisonsService({ repo: createComparisonsRepository(database.db) })),
    ...labProfilesRoutes(
      createLabProfilesService({ profiles: createLabProfilesRepository(database.db), labs, downloadCounts: createDepositingRepository(database.db).downloadCounts }),
    ),
    // Harvesting and crawling, outside /api: OAI-PMH, sitemap.xml, robots.txt.
    ...oaiRoutes(
      createOaiService({
        repo: createHarvestingRepository(database.db),
        publicBaseUrl: config.publicBaseUrl,
        doiPrefix: config.doiPrefix,
        adminEmail: /<([^>]+)>/.exec(config.mail.from)?.[1] ?? config.mail.from,
        pageSize: config.oai.pageSize,
        tokenSeconds: config.oai.tokenSeconds,
        secret: config.authSecret,
      }),
    ),
    ...sitemapRoutes(createSitemapService({ repo: createHarvestingRepository(database.db), publicBaseUrl: config.publicBaseUrl })),
  ];
}

/** The Express app; it never listens (server/main.ts does, tests use port 0). */
export function createApp(deps: AppDeps) {
  const { auth, log, config, database } = deps;
  const app = express();
  app.disable('x-powered-by');
  // Which proxies may set X-Forwarded-For decides req.ip, the key of the rate limits.
  app.set('trust proxy', config.security.trustProxy);
  app.use(
    pinoHttp({
      logger: log,
      genReqId: (req, res) => {
        const id = (req.headers['x-request-id'] as string | undefined)?.slice(0, 64) || randomUUID();
        res.setHeader('x-request-id', id);
        return id;
      },
      autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
    }),
  );

  app.use(securityHeaders(config, { dev: deps.devClient }));

  // Several instances share a PostgreSQL server, so they share the counters there too.
  const limits = createRateLimits(config.security.rateLimits, database.kind === 'postgres' ? createRateLimitRepository(database.db) : undefined);
  // Password guessing, sign-up and reset mail are limited per address before better-auth sees them.
  app.post('/api/auth/sign-in/email', limits.signIn);
  app.post('/api/auth/sign-up/email', limits.signUp);
  app.post('/api/auth/request-password-reset', limits.passwordReset);
  // better-auth reads its own body, so it comes before express.json().
  app.all('/api/auth/*splat', toNodeHandler(auth));
  // The payment provider signs the exact bytes it sends, so its webhook reads the raw body too.
  app.post(WEBHOOK_PATH, express.raw({ type: '*/*', limit: '1mb' }), billingWebhookHandler(billingModule(deps)));
  app.use('/api', express.json({ limit: config.security.jsonBodyLimit }));
  // Cookie-session writes must come from our own pages (CSRF); better-auth guards /api/auth itself.
  app.use('/api', sameOriginWrites([config.publicBaseUrl]));
  // Each access request e-mails a lab's curators, so a script must not flood them.
  app.post('/api/releases/:suffix/access-requests', limits.accessRequests);
  // OAI-PMH allows its arguments as a form body on POST.
  app.use('/oai', express.urlencoded({ extended: false, limit: '16kb' }));

  const authorize = createAuthorize({
    auth,
    labs: createLabsRepository(database.db),
    fakes: config.fakes,
    tokens: createTokensService({ tokens: createTokensRepository(database.db) }),
  });
  const routes = buildRoutes(deps);
  // Kept for tools that walk the route table (OpenAPI, authorisation checks).
  app.locals.routes = routes;
  const openApi = buildOpenApi(routes, config.publicBaseUrl);
  app.get('/api/openapi.json', (_req, res) => {
    res.json(openApi);
  });
  for (const r of routes) {
    app[r.method](r.path, authorize(r.access), (req, res) => r.handler(req, res, r.body ? r.body.parse(req.body ?? {}) : undefined));
  }
  // The metadata contract, published at a stable, versioned address.
  app.get('/schemas/dataset-metadata/:version.json', (req, res, next) => {
    if (req.params.version !== METADATA_SCHEMA_VERSION) return next();
    res.type('application/schema+json').json({ ...metadataSchema, $id: `${config.publicBaseUrl}/schemas/dataset-metadata/${METADATA_SCHEMA_VERSION}.json` });
  });
  app.use('/api', apiNotFound);
  if (deps.depositing) app.get('/doi/*splat', deps.depositing.doiResolver);
  // Crawlers without JavaScript still find the schema.org Dataset of a release page in its HTML.
  if (deps.depositing && deps.client?.length) app.get('/releases/:suffix', releaseJsonLd(deps.depositing.releases));
  for (const handler of deps.client ?? []) app.use(handler);
  app.use(errorHandler);
  return app;
}
