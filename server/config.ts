import { z } from 'zod';

/**
 * The one place that reads the environment. Every setting has a default for
 * the embedded mode (PGlite on disk + local fakes) and an environment variable
 * for production; production refuses to start without the secrets it needs.
 */
const bool = z
  .enum(['true', 'false', '1', '0', 'on', 'off', 'yes', 'no'])
  .transform((v) => ['true', '1', 'on', 'yes'].includes(v));

const url = z.string().url();

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  PUBLIC_BASE_URL: url.optional(),
  DATA_DIR: z.string().min(1).default('.data'),
  DATABASE_URL: z
    .string()
    .regex(/^postgres(ql)?:\/\//, 'must start with postgres:// or postgresql://')
    .optional(),
  FAKES: bool.optional(),
  S3_ENDPOINT: url.default('http://127.0.0.1:4569'),
  S3_REGION: z.string().min(1).default('us-east-1'),
  S3_BUCKET: z.string().regex(/^[a-z0-9][a-z0-9.-]{2,62}$/, 'must be a valid bucket name').default('cohesia'),
  S3_ACCESS_KEY_ID: z.string().min(1).default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().min(1).default('S3RVER'),
  SMTP_URL: z.string().regex(/^smtps?:\/\//, 'must start with smtp:// or smtps://').default('smtp://127.0.0.1:2525'),
  MAIL_FROM: z.string().min(3).default('Cohesia <no-reply@cohesia.localhost>'),
  MAIL_CAPTURE_URL: url.default('http://127.0.0.1:2580'),
  STRIPE_SECRET_KEY: z.string().regex(/^sk_(test|live)_/, 'must be a secret key (sk_test_… or sk_live_…)').default('sk_test_cohesia_local'),
  STRIPE_WEBHOOK_SECRET: z.string().regex(/^whsec_/, 'must start with whsec_').default('whsec_cohesia_local'),
  // The payment stand-in by default; https://api.stripe.com is the real provider (test or live by the key).
  STRIPE_API_URL: url.default('http://127.0.0.1:12111'),
  PAYMENTS_GRACE_DAYS: z.coerce.number().min(0).max(365).default(7),
  FREE_TIER_BYTES: z.coerce.number().int().min(0).default(1_000_000_000),
  DOI_REGISTRY_URL: url.default('http://127.0.0.1:4590'),
  DOI_REGISTRY_USER: z.string().min(1).default('cohesia'),
  DOI_REGISTRY_PASSWORD: z.string().min(1).default('local-registry-password'),
  DOI_PREFIX: z.string().regex(/^10\.\d{4,9}$/, 'must look like 10.NNNN (ISO 26324 prefix)').default('10.99999'),
  BETTER_AUTH_SECRET: z.string().min(32, 'must be at least 32 characters').optional(),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  DEMO_SEED: bool.optional(),
  DEMO_RELEASES: bool.default(true),
  JOB_WORKER: bool.default(true),
  // auto: pg-boss on a PostgreSQL server, the in-database queue on the embedded default.
  JOB_QUEUE: z.enum(['auto', 'database', 'pg-boss']).default('auto'),
  // pg-boss only: a job still active after this long is taken as lost (its worker died) and retried.
  JOB_TIMEOUT_SECONDS: z.coerce.number().int().min(5).default(3600),
  // Where POST /api/admin/backups writes a backup of the running instance (default: DATA_DIR/backups).
  BACKUP_DIR: z.string().min(1).optional(),
  // OAI-PMH: records per list response, and how long a resumption token stays valid.
  OAI_PAGE_SIZE: z.coerce.number().int().min(1).max(1000).default(100),
  OAI_TOKEN_SECONDS: z.coerce.number().int().min(1).default(24 * 3600),
  // Security: which proxies may set X-Forwarded-For (Express "trust proxy": loopback, a hop count, true/false or subnets).
  TRUST_PROXY: z.string().min(1).default('loopback'),
  // Attempts per client IP per window; unset in NODE_ENV=test means no practical limit (tests set small ones).
  RATE_LIMIT_WINDOW_SECONDS: z.coerce.number().int().min(1).default(15 * 60),
  RATE_LIMIT_SIGN_IN: z.coerce.number().int().min(1).optional(),
  RATE_LIMIT_SIGN_UP: z.coerce.number().int().min(1).optional(),
  RATE_LIMIT_PASSWORD_RESET: z.coerce.number().int().min(1).optional(),
  RATE_LIMIT_ACCESS_REQUESTS: z.coerce.number().int().min(1).optional(),
  // Largest JSON body the API reads; bigger ones answer 413.
  JSON_BODY_LIMIT: z.string().regex(/^\d+(b|kb|mb)$/, 'must look like 100kb or 1mb').default('1mb'),
});

export type Config = {
  env: 'development' | 'production' | 'test';
  host: string;
  port: number;
  publicBaseUrl: string;
  dataDir: string;
  database: { kind: 'pglite'; dir: string } | { kind: 'postgres'; url: string };
  fakes: boolean;
  s3: { endpoint: string; region: string; bucket: string; accessKeyId: string; secretAccessKey: string };
  mail: { smtpUrl: string; from: string; captureUrl: string };
  payments: { secretKey: string; webhookSecret: string; apiUrl: string; graceDays: number; freeTierBytes: number };
  doiPrefix: string;
  identifiers: { registryUrl: string; user: string; password: string };
  authSecret: string;
  logLevel: string;
  demoSeed: boolean;
  // Publish the synthetic demo releases too (off in tests, which make their own).
  demoReleases: boolean;
  // Run background jobs in this process (off for API-only instances).
  jobWorker: boolean;
  jobQueue: { kind: 'database' | 'pg-boss'; timeoutSeconds: number };
  backupDir: string;
  oai: { pageSize: number; tokenSeconds: number };
  security: {
    trustProxy: boolean | number | string;
    jsonBodyLimit: string;
    rateLimits: { windowSeconds: number; signIn: number; signUp: number; passwordReset: number; accessRequests: number };
  };
};

export class ConfigError extends Error {}

// Express accepts booleans, hop counts and address lists for "trust proxy".
function parseTrustProxy(v: string): boolean | number | string {
  if (v === 'true' || v === 'false') return v === 'true';
  return /^\d+$/.test(v) ? Number(v) : v;
}

// Only for the embedded mode; production must set its own.
const EMBEDDED_AUTH_SECRET = 'cohesia-embedded-development-secret-not-for-production';

/** Parses and validates the environment; throws ConfigError naming each bad variable. */
export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const cleaned = Object.fromEntries(Object.entries(env).filter(([, v]) => v !== undefined && v !== ''));
  const parsed = envSchema.safeParse(cleaned);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new ConfigError(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  const production = e.NODE_ENV === 'production';
  const missing: string[] = [];
  if (production && !e.BETTER_AUTH_SECRET) missing.push('BETTER_AUTH_SECRET');
  if (production && !e.PUBLIC_BASE_URL) missing.push('PUBLIC_BASE_URL');
  if (missing.length) {
    throw new ConfigError(
      `Missing configuration for production:\n${missing.map((m) => `  ${m}: required when NODE_ENV=production`).join('\n')}`,
    );
  }
  if (e.JOB_QUEUE === 'pg-boss' && !e.DATABASE_URL) throw new ConfigError('Invalid configuration:\n  JOB_QUEUE: pg-boss needs a PostgreSQL server (DATABASE_URL)');
  const dataDir = e.DATA_DIR;
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    publicBaseUrl: (e.PUBLIC_BASE_URL ?? `http://localhost:${e.PORT}`).replace(/\/$/, ''),
    dataDir,
    database: e.DATABASE_URL ? { kind: 'postgres', url: e.DATABASE_URL } : { kind: 'pglite', dir: `${dataDir}/pglite` },
    // The local fakes run by default only in the embedded mode.
    fakes: e.FAKES ?? (!production && !e.DATABASE_URL),
    s3: {
      endpoint: e.S3_ENDPOINT,
      region: e.S3_REGION,
      bucket: e.S3_BUCKET,
      accessKeyId: e.S3_ACCESS_KEY_ID,
      secretAccessKey: e.S3_SECRET_ACCESS_KEY,
    },
    mail: { smtpUrl: e.SMTP_URL, from: e.MAIL_FROM, captureUrl: e.MAIL_CAPTURE_URL },
    payments: {
      secretKey: e.STRIPE_SECRET_KEY,
      webhookSecret: e.STRIPE_WEBHOOK_SECRET,
      apiUrl: e.STRIPE_API_URL.replace(/\/$/, ''),
      graceDays: e.PAYMENTS_GRACE_DAYS,
      freeTierBytes: e.FREE_TIER_BYTES,
    },
    doiPrefix: e.DOI_PREFIX,
    identifiers: { registryUrl: e.DOI_REGISTRY_URL, user: e.DOI_REGISTRY_USER, password: e.DOI_REGISTRY_PASSWORD },
    authSecret: e.BETTER_AUTH_SECRET ?? EMBEDDED_AUTH_SECRET,
    logLevel: e.LOG_LEVEL,
    // Demo data only where nobody asked otherwise and it is not production.
    demoSeed: e.DEMO_SEED ?? !production,
    demoReleases: e.DEMO_RELEASES,
    jobWorker: e.JOB_WORKER,
    jobQueue: { kind: e.JOB_QUEUE === 'auto' ? (e.DATABASE_URL ? 'pg-boss' : 'database') : e.JOB_QUEUE, timeoutSeconds: e.JOB_TIMEOUT_SECONDS },
    backupDir: e.BACKUP_DIR ?? `${dataDir}/backups`,
    oai: { pageSize: e.OAI_PAGE_SIZE, tokenSeconds: e.OAI_TOKEN_SECONDS },
    security: {
      trustProxy: parseTrustProxy(e.TRUST_PROXY),
      jsonBodyLimit: e.JSON_BODY_LIMIT,
      rateLimits: {
        windowSeconds: e.RATE_LIMIT_WINDOW_SECONDS,
        // Test apps sign in many times from one address; their limit tests set these explicitly.
        signIn: e.RATE_LIMIT_SIGN_IN ?? (e.NODE_ENV === 'test' ? 1_000_000 : 10),
        signUp: e.RATE_LIMIT_SIGN_UP ?? (e.NODE_ENV === 'test' ? 1_000_000 : 5),
        passwordReset: e.RATE_LIMIT_PASSWORD_RESET ?? (e.NODE_ENV === 'test' ? 1_000_000 : 5),
        accessRequests: e.RATE_LIMIT_ACCESS_REQUESTS ?? (e.NODE_ENV === 'test' ? 1_000_000 : 20),
      },
    },
  };
}
