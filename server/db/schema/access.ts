import { index, integer, jsonb, pgTable, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import { sql } from 'drizzle-orm';
import { organization, user } from './auth';
import { dataset, release } from './depositing';

/** A lab's data-use terms; a new text is a new version, and requests keep the one they accepted. */
export const dataUseTerms = pgTable(
  'data_use_terms',
  {
    id: text().primaryKey(),
    labId: text()
      .notNull()
      .references(() => organization.id, { onDelete: 'cascade' }),
    version: integer().notNull(),
    body: text().notNull(),
    createdBy: text(),
    createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [uniqueIndex('data_use_terms_lab_version').on(t.labId, t.version)],
);

export const REQUEST_STATES = ['pending', 'approved', 'denied', 'withdrawn'] as const;

/** A researcher's request for the files of a restricted release (or of every version of its dataset). */
export const accessRequest = pgTable(
  'access_request',
  {
    id: text().primaryKey(),
    datasetId: text()
      .notNull()
      .references(() => dataset.id),
    // Null: all versions of the dataset.
    releaseId: text().references(() => release.id),
    requesterId: text()
      .notNull()
      .references(() => user.id),
    purpose: text().notNull(),
    affiliation: text().notNull(),
    termsVersion: integer().notNull(),
    termsText: text().notNull(),
    state: text({ enum: REQUEST_STATES }).notNull().default('pending'),
    decidedBy: text(),
    decidedAt: timestamp({ withTimezone: true }),
    decisionNote: text(),
    createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [
    index('access_request_dataset_idx').on(t.datasetId),
    // One pending request per person and item.
    uniqueIndex('access_request_one_pending')
      .on(t.requesterId, t.datasetId, sql`coalesce(${t.releaseId}, '')`)
      .where(sql`state = 'pending'`),
  ],
);

/** What an approved request gives: the files, until it expires or is revoked. */
export const accessGrant = pgTable(
  'access_grant',
  {
    id: text().primaryKey(),
    requestId: text()
      .notNull()
      .references(() => accessRequest.id),
    userId: text()
      .notNull()
      .references(() => user.id),
    datasetId: text()
      .notNull()
      .references(() => dataset.id),
    releaseId: text(),
    expiresAt: timestamp({ withTimezone: true }),
    revokedAt: timestamp({ withTimezone: true }),
    revokedBy: text(),
    createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [index('access_grant_user_dataset_idx').on(t.userId, t.datasetId)],
);

/** Who did what, when, to what, from which state. Append-only. */
export const auditEvent = pgTable(
  'audit_event',
  {
    id: text().primaryKey(),
    actorId: text(),
    action: text().notNull(),
    subjectType: text().notNull(),
    subjectId: text().notNull(),
    fromState: text(),
    toState: text(),
    detail: jsonb().$type<Record<string, unknown>>(),
    createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [index('audit_event_subject_idx').on(t.subjectType, t.subjectId)],
);

/** Outgoing mail: written first, sent by a job that retries with backoff, so no message is lost. */
export const outboxMail = pgTable('outbox_mail', {
  id: text().primaryKey(),
  to: text().notNull(),
  subject: text().notNull(),
  text: text().notNull(),
  html: text(),
  state: text({ enum: ['pending', 'sent', 'failed'] }).notNull().default('pending'),
  attempts: integer().notNull().default(0),
  lastError: text(),
  sentAt: timestamp({ withTimezone: true }),
  createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
});

/** Personal API tokens for scripts; only a SHA-256 of the token is kept. */
export const apiToken = pgTable(
  'api_token',
  {
    id: text().primaryKey(),
    userId: text()
      .notNull()
      .references(() => user.id, { onDelete: 'cascade' }),
    name: text().notNull(),
    // The first characters, to recognise a token in lists.
    prefix: text().notNull(),
    tokenHash: text().notNull().unique(),
    scopes: jsonb().$type<Array<'read' | 'deposit'>>().notNull(),
    lastUsedAt: timestamp({ withTimezone: true }),
    revokedAt: timestamp({ withTimezone: true }),
    createdAt: timestamp({ withTimezone: true }).defaultNow().notNull(),
  },
  (t) => [index('api_token_user_idx').on(t.userId)],
);

/**
 * Rate-limit counters shared by every instance on a PostgreSQL server (fixed windows per limiter and
 * address; server/middleware/rate-limits.ts). The embedded database keeps them in the one process's memory.
 */
export const rateLimitHit = pgTable('rate_limit_hit', {
  key: text().primaryKey(),
  hits: integer().notNull(),
  resetAt: timestamp({ withTimezone: true }).notNull(),
});
